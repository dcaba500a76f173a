/**
 * `model NAME: KIND(key=value, ...)` → a full model record: built-in defaults for the keys not
 * written, each written key checked against the table of §2 (unknown key: "did you mean").
 */
import type { ModelStmt, ValueText } from '../parse/ast';
import { defaultBjtModel, defaultDiodeModel, defaultMosModel, article, MODEL_KEYS, MODEL_KINDS, modelFamily, type Range } from '../language/part-kinds';
import type { QuantityUnit } from '../parse/quantity';
import { didYouMean } from '../parse/suggest';
import type { DiagnosticCode, SourceLoc } from '../circuit/diagnostic';
import type { ResolvedModel } from './elaborate-part';

export interface ModelContext {
  report(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void;
  evaluate(value: ValueText, unit: QuantityUnit, slot: string, range: Range): number;
}

/** Evaluates one model statement; 'failed' when its kind is unknown. */
export function evaluateModel(stmt: ModelStmt, ctx: ModelContext): ResolvedModel | 'failed' {
  if (stmt.broken) return 'failed';
  const kind = stmt.deviceKind.text;
  const family = modelFamily(kind);
  if (!family) {
    ctx.report('unknown-kind', stmt.deviceKind.loc, `Unknown model kind \`${kind}\`.`, didYouMean(kind, MODEL_KINDS) ?? `model kinds are ${MODEL_KINDS.join(', ')}`);
    return 'failed';
  }
  const name = stmt.name.text;
  const model: Record<string, number | string> =
    family === 'bjt' ? { ...defaultBjtModel(name) } : family === 'mos' ? { ...defaultMosModel(name) } : { ...defaultDiodeModel(name) };
  const table = MODEL_KEYS[family];
  const seen = new Set<string>();
  for (const kv of stmt.keys) {
    const key = kv.key.text;
    const spec = Object.prototype.hasOwnProperty.call(table, key) ? table[key] : undefined;
    if (!spec) {
      ctx.report('unknown-param', kv.key.loc, `${article(kind) === 'an' ? 'An' : 'A'} ${kind} model has no parameter \`${key}\`.`, didYouMean(key, Object.keys(table)) ?? `its parameters are ${Object.keys(table).join(', ')}`);
      continue;
    }
    if (seen.has(key)) {
      ctx.report('duplicate-name', kv.key.loc, `\`${key}=\` is given twice in the model \`${name}\`.`);
      continue;
    }
    seen.add(key);
    if (!kv.value) continue;
    let value = ctx.evaluate(kv.value, spec.unit, `the ${spec.what} of the model \`${name}\``, spec.range);
    // A pmos threshold is stored as a magnitude; designers often write it negative.
    if (kind === 'pmos' && key === 'vth') value = Math.abs(value);
    model[spec.field] = value;
  }
  return { kind, model: model as unknown as ResolvedModel['model'] };
}
