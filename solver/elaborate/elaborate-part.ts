/**
 * Builds one built-in part (res … diode) from its parsed line: connections resolved to pins,
 * main value and keys evaluated and range-checked, the device model looked up.
 */
import type { Connection, Name, PartStmt, ValueText } from '../parse/ast';
import { DEFAULT_MOS_L, DEFAULT_MOS_W, defaultBjtModel, defaultDiodeModel, defaultMosModel, article, type KeySpec, type PartKindSpec, type Range } from '../language/part-kinds';
import type { QuantityUnit } from '../parse/quantity';
import { didYouMean } from '../parse/suggest';
import type { DiagnosticCode, SourceLoc } from '../circuit/diagnostic';
import type { AcSpec, BjtModel, DiodeModel, MosModel, Part } from '../circuit/types';

/** A model resolved in scope. */
export interface ResolvedModel {
  kind: string;
  model: BjtModel | MosModel | DiodeModel;
}

/** What building a part needs from the elaborator. */
export interface PartContext {
  report(severity: 'error' | 'warning', code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void;
  /** Evaluates a value in the current scope; NaN (already reported) on failure. */
  evaluate(value: ValueText, unit: QuantityUnit, slot: string, range: Range): number;
  /** Flattened node name for a node written in the current scope. */
  node(name: string): string;
  /** Looks a model up in scope; undefined when unknown. */
  model(name: string): ResolvedModel | 'failed' | undefined;
  modelNames(): string[];
  /** Flattened name of the part. */
  partName: string;
}

/**
 * Matches connections to pins. Named or positional per `named`; positional kinds also accept
 * their pin names. Returns pin → written node, or undefined when the list is unusable.
 */
export function resolvePins(
  ctx: PartContext,
  stmt: PartStmt,
  pins: string[],
  named: boolean,
  label: string,
  optional: Record<string, string> = {},
): Map<string, Name> | undefined {
  const conns: Connection[] = stmt.conns;
  const result = new Map<string, Name>();
  const positional = conns.filter((c) => !c.pin);
  const pinList = pins.map((p) => `${p}=…`).join(', ');
  if (positional.length > 0 && positional.length < conns.length) {
    ctx.report('error', 'syntax', stmt.connsLoc, `\`${stmt.name.text}\` mixes named and positional connections.`, `write all of them as pin=node: (${pinList})`);
    return undefined;
  }
  if (positional.length > 0) {
    if (named) {
      ctx.report('error', 'named-pins', positional[0].node.loc, `The pins of ${article(label)} \`${label}\` are named: write (${pinList}).`, 'connections are named at the point of use, in any order');
      return undefined;
    }
    if (positional.length !== pins.length) {
      // A broken list already said what is wrong with it; counting what is left adds nothing.
      if (stmt.connsBroken) return undefined;
      ctx.report('error', 'pin-count', stmt.connsLoc, `\`${label}\` takes ${pins.length} connections (${pins.join(', ')}); ${positional.length} given.`);
      return undefined;
    }
    pins.forEach((p, k) => result.set(p, positional[k].node));
    return result;
  }
  let ok = true;
  for (const c of conns) {
    const pin = c.pin as Name;
    if (!pins.includes(pin.text)) {
      ctx.report('error', 'unknown-pin', pin.loc, `\`${label}\` has no pin \`${pin.text}\`.`, didYouMean(pin.text, pins) ?? `its pins are ${pins.join(', ')}`);
      ok = false;
    } else if (result.has(pin.text)) {
      ctx.report('error', 'duplicate-pin', pin.loc, `The pin \`${pin.text}\` of \`${stmt.name.text}\` is connected twice.`);
      ok = false;
    } else result.set(pin.text, c.node);
  }
  // A misspelt, repeated or empty pin is one mistake: the pin it leaves unconnected is the same
  // mistake, not a second one, so "missing pin" is said only when the list is otherwise clean.
  if (!ok || stmt.connsBroken) return undefined;
  for (const p of pins) {
    if (!result.has(p) && !optional[p]) {
      ctx.report('error', 'missing-pin', stmt.connsLoc, `\`${stmt.name.text}\` has no connection for its pin \`${p}\`.`, `add ${p}=NODE`);
      ok = false;
    }
  }
  return ok ? result : undefined;
}

function cap(s: string): string {
  return s[0].toUpperCase() + s.slice(1);
}

/** Splits `MAG@PHASE` at its top-level `@`. */
function splitAt(value: ValueText): [ValueText, ValueText | undefined] {
  const at = value.text.indexOf('@');
  if (at < 0) return [value, undefined];
  const mk = (from: number, to: number): ValueText => {
    const raw = value.text.slice(from, to);
    const lead = raw.length - raw.trimStart().length;
    const start = value.start + from + lead;
    return { text: raw.trim(), line: value.line, start, loc: value.line.loc(start, start + raw.trim().length) };
  };
  return [mk(0, at), mk(at + 1, value.text.length)];
}

/** Builds the part; undefined when its kind-specific structure is unusable (already reported). */
export function buildPart(ctx: PartContext, stmt: PartStmt, spec: PartKindSpec): Part | undefined {
  const name = ctx.partName;
  const pins = resolvePins(ctx, stmt, spec.pins, spec.named, spec.kind, spec.defaults);
  const keys = new Map<string, ValueText | undefined>();
  for (const kv of stmt.keys) {
    const keySpec: KeySpec | undefined = spec.keys[kv.key.text];
    if (!keySpec) {
      const known = Object.keys(spec.keys);
      ctx.report('error', 'unknown-param', kv.key.loc,
        known.length === 0 ? `${cap(article(spec.kind))} \`${spec.kind}\` takes no parameter \`${kv.key.text}\`.` : `${cap(article(spec.kind))} \`${spec.kind}\` has no parameter \`${kv.key.text}\`.`,
        didYouMean(kv.key.text, known) ?? (known.length ? `its parameters are ${known.join(', ')}` : undefined));
    } else if (keys.has(kv.key.text)) {
      ctx.report('error', 'duplicate-name', kv.key.loc, `\`${kv.key.text}=\` is given twice.`);
    } else keys.set(kv.key.text, kv.value);
  }
  const num = (key: string, fallback: number): number => {
    const v = keys.get(key);
    const ks = spec.keys[key];
    return v ? ctx.evaluate(v, ks.unit, `the ${ks.what} of \`${name}\``, ks.range) : fallback;
  };
  let mainValue = NaN;
  let model: ResolvedModel | 'failed' | undefined;
  if (spec.main === 'model') {
    if (stmt.main) {
      const text = stmt.main.text;
      if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(text)) {
        ctx.report('error', 'syntax', stmt.main.loc, `The main value of ${article(spec.kind)} \`${spec.kind}\` is a model name, not \`${text}\`.`, `write ${spec.kind === 'nmos' || spec.kind === 'pmos' ? 'w=, l=, m=' : 'area='} for sizes`);
        model = 'failed';
      } else {
        model = ctx.model(text);
        if (model === undefined) {
          ctx.report('error', 'unknown-model', stmt.main.loc, `Unknown model \`${text}\`.`, didYouMean(text, ctx.modelNames()) ?? `define it with \`model ${text}: ${spec.kind}(...)\``);
          model = 'failed';
        } else if (model !== 'failed' && model.kind !== spec.kind) {
          ctx.report('error', 'model-kind-mismatch', stmt.main.loc, `\`${text}\` is ${article(model.kind)} ${model.kind} model but \`${name}\` is ${article(spec.kind)} ${spec.kind}.`, `use ${article(spec.kind)} ${spec.kind} model`);
          model = 'failed';
        }
      }
    }
  } else if (stmt.main) {
    mainValue = ctx.evaluate(stmt.main, spec.main.unit, `the ${spec.main.what} of \`${name}\``, spec.main.range);
  } else if (spec.main.optional) {
    mainValue = 0;
  } else if (stmt.connsBroken !== 'unclosed') {
    // An unclosed connection list swallows the value: that is one mistake, already reported.
    ctx.report('error', 'missing-value', stmt.connsLoc, `\`${name}\` has no ${spec.main.what}.`, `write it after the connections, e.g. \`${stmt.name.text}: ${spec.kind}(…) ${spec.kind === 'res' ? '1k' : spec.kind === 'cap' ? '1p' : spec.kind === 'ind' ? '1u' : '1'}\``);
  }
  if (!pins) return undefined;
  const n = (pin: string): string => {
    const written = pins.get(pin) ?? pins.get(spec.defaults?.[pin] ?? '');
    return ctx.node(written ? written.text : pin);
  };
  const loc = stmt.loc;
  const resolved = model && model !== 'failed' ? model.model : undefined;
  switch (spec.kind) {
    case 'res':
    case 'cap':
    case 'ind':
      return { kind: spec.kind, name, loc, a: n('a'), b: n('b'), value: mainValue };
    case 'vsrc':
    case 'isrc': {
      let ac: AcSpec | undefined;
      const acText = keys.get('ac');
      if (acText) {
        const [mag, phase] = splitAt(acText);
        const unit = spec.kind === 'vsrc' ? 'V' : 'A';
        ac = {
          mag: ctx.evaluate(mag, unit, `the ac magnitude of \`${name}\``, 'any'),
          phaseDeg: phase ? ctx.evaluate(phase, '', `the ac phase (degrees) of \`${name}\``, 'any') : 0,
        };
      }
      const base = spec.kind === 'vsrc'
        ? { kind: 'vsrc' as const, name, loc, p: n('p'), n: n('n'), dc: mainValue }
        : { kind: 'isrc' as const, name, loc, from: n('from'), to: n('to'), dc: mainValue };
      return ac ? { ...base, ac } : base;
    }
    case 'vcvs':
      return { kind: 'vcvs', name, loc, p: n('p'), n: n('n'), cp: n('cp'), cn: n('cn'), gain: mainValue };
    case 'vccs':
      return { kind: 'vccs', name, loc, from: n('from'), to: n('to'), cp: n('cp'), cn: n('cn'), gm: mainValue };
    case 'npn':
    case 'pnp':
      return { kind: spec.kind, name, loc, c: n('c'), b: n('b'), e: n('e'), model: (resolved as BjtModel | undefined) ?? defaultBjtModel(spec.kind), area: num('area', 1) };
    case 'nmos':
    case 'pmos':
      return {
        kind: spec.kind, name, loc, d: n('d'), g: n('g'), s: n('s'), b: n('b'),
        model: (resolved as MosModel | undefined) ?? defaultMosModel(spec.kind),
        w: num('w', DEFAULT_MOS_W), l: num('l', DEFAULT_MOS_L), m: num('m', 1),
      };
    case 'diode':
      return { kind: 'diode', name, loc, a: n('a'), k: n('k'), model: (resolved as DiodeModel | undefined) ?? defaultDiodeModel('diode'), area: num('area', 1) };
    default:
      return undefined;
  }
}
