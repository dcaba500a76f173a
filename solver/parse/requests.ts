/**
 * Resolves the request statements (analyze, ports, measure, check) against the elaborated
 * circuit: numbers evaluated, names checked (with "did you mean"), expressions rewritten for
 * mathjs. Produces the Requests of solver/circuit/analyses.ts.
 */
import type { AnalysisRequest, CheckRequest, MeasureRequest, PortsRequest, Requests } from '../circuit/analyses';
import type { DiagnosticBag, DiagnosticCode, SourceLoc } from '../circuit/diagnostic';
import { GROUND, type Part } from '../circuit/types';
import type { CheckStmt, MeasureStmt, RequestStmt, TokenStmt, ValueText } from './ast';
import { article, rangeProblem, type Range } from '../language/part-kinds';
import { ANALYSES, ANALYSIS_SPECS, BJT_ONLY, BUILTIN_FIGURES, functionSpec, MEASURE_FUNCTIONS, MOS_ONLY, RESULT_FUNCTIONS, type QuantityUnit } from '../language/vocabulary';
import { evaluateExpression, PARAM_CONSTANTS, rewriteExpressionDetailed } from './expression';
import { parseAnalyze } from './analyze-syntax';
import { closest, didYouMean } from './suggest';

/** What the request resolver needs to know about the circuit. */
export interface RequestScope {
  parts: Map<string, Part>;
  nodes: Set<string>;
  params: Map<string, number>;
  /** Names of parts that were written but could not be built: no second error about them. */
  attemptedParts: Set<string>;
  /** Block instances that could not be expanded: names inside them get no second error either. */
  brokenInstances?: Set<string>;
  bag: DiagnosticBag;
}

/** Every function a measure or check may call (the vocabulary's table). */
export { MEASURE_FUNCTIONS };

/** Helpers shared by the analyze parser. */
export class RequestContext {
  constructor(readonly scope: RequestScope) {}

  error(code: DiagnosticCode, loc: SourceLoc, message: string, hint?: string): void {
    this.scope.bag.error(code, loc, message, hint);
  }

  /**
   * True when the part `name` was written but could not be built (its line failed, or it stands
   * inside an instance of an unknown or failed block): that error already covers it.
   */
  alreadyReported(name: string): boolean {
    return (this.scope.attemptedParts.has(name) && !this.scope.parts.has(name)) || this.insideBrokenInstance(name);
  }

  /** True when `name` (a part or node) lies inside a block instance that could not be expanded. */
  insideBrokenInstance(name: string): boolean {
    const broken = this.scope.brokenInstances;
    if (!broken || broken.size === 0) return false;
    for (let dot = name.indexOf('.'); dot > 0; dot = name.indexOf('.', dot + 1)) {
      if (broken.has(name.slice(0, dot))) return true;
    }
    return false;
  }

  /** Evaluates a value over the top-level params; NaN (reported) on failure. */
  number(value: ValueText, unit: QuantityUnit | undefined, slot: string, range: Range = 'any'): number {
    const r = evaluateExpression(value.text, this.scope.params, unit, slot);
    if (!r.ok) {
      for (const p of r.problems) this.error(p.code, value.line.loc(value.start + p.offset, value.start + p.offset + Math.max(1, p.length)), p.message, p.hint);
      return NaN;
    }
    const problem = rangeProblem(r.value, range);
    if (problem) {
      this.error('bad-value', value.loc, `${slot[0].toUpperCase()}${slot.slice(1)} ${problem}; it is ${r.value}.`);
      return NaN;
    }
    return r.value;
  }

  /** Checks that `name` is an independent source; returns it or undefined (reported). */
  source(name: string, loc: SourceLoc, role: string): string | undefined {
    const part = this.scope.parts.get(name);
    if (!part) {
      if (!this.alreadyReported(name)) {
        const sources = [...this.scope.parts.values()].filter((p) => p.kind === 'vsrc' || p.kind === 'isrc').map((p) => p.name);
        this.error('unknown-name', loc, `Unknown source \`${name}\` in ${role}.`, didYouMean(name, sources) ?? (sources.length ? `sources are ${sources.slice(0, 8).join(', ')}` : 'add a vsrc or isrc'));
      }
      return undefined;
    }
    if (part.kind !== 'vsrc' && part.kind !== 'isrc') {
      this.error('not-a-source', loc, `\`${name}\` is ${article(part.kind)} ${part.kind}, not an independent source: ${role} needs a vsrc or isrc.`);
      return undefined;
    }
    return name;
  }

  /** Checks that `name` is a node (or gnd when allowed). */
  node(name: string, loc: SourceLoc, allowGround = true): string | undefined {
    if (name === GROUND && allowGround) return name;
    if (this.scope.nodes.has(name)) return name;
    if (this.insideBrokenInstance(name)) return undefined;
    this.error('unknown-node', loc, name === GROUND ? '`gnd` cannot be used here.' : `Unknown node \`${name}\`.`, name === GROUND ? undefined : didYouMean(name, this.scope.nodes) ?? (this.scope.parts.has(name) ? `\`${name}\` is a part, not a node` : undefined));
    return undefined;
  }
}

/** Resolves all request statements. */
export function resolveRequests(stmts: RequestStmt[], scope: RequestScope): Requests {
  const ctx = new RequestContext(scope);
  const requests: Requests = { analyses: [], measures: [], checks: [], params: Object.fromEntries([...scope.params].filter(([, v]) => Number.isFinite(v))) };
  let portsStmt: TokenStmt | undefined;
  for (const s of stmts) {
    if (s.kind === 'ports') {
      if (portsStmt) ctx.error('duplicate-name', s.loc, 'A netlist has one `ports` line; this is a second one.', `the first is on line ${portsStmt.loc.line}`);
      else {
        portsStmt = s;
        requests.ports = parsePorts(ctx, s);
      }
    }
  }
  const failed = new Set<string>();
  if (portsStmt && !requests.ports) failed.add('ports');
  const measureNames: MeasureNames = { defined: new Set(), failed: new Set() };
  for (const s of stmts) {
    if (s.kind === 'analyze') {
      const a: AnalysisRequest | undefined = parseAnalyze(ctx, s);
      const first = a && ANALYSIS_SPECS.find((spec) => spec.kind === a.kind)?.once ? requests.analyses.find((r) => r.kind === a.kind) : undefined;
      if (a && first) {
        scope.bag.warning('duplicate-analysis', a.loc, `A second \`analyze ${a.kind}\` is ignored; the first one (line ${first.loc.line}) runs.`, 'keep one line per analysis');
      } else if (a) requests.analyses.push(a);
      else {
        const meant = analysisMeant(s);
        if (meant) failed.add(meant);
      }
    } else if (s.kind === 'measure') {
      const m = resolveMeasure(ctx, s, measureNames, !!portsStmt);
      if (m) requests.measures.push(m);
    } else if (s.kind === 'check') {
      const c = resolveCheck(ctx, s, measureNames, !!portsStmt);
      if (c) requests.checks.push(c);
    }
  }
  if (failed.size > 0) requests.failed = [...failed];
  return requests;
}

/** The analysis an `analyze` line meant (its kind, or the closest kind to a misspelt one). */
function analysisMeant(s: TokenStmt): string | undefined {
  const word = s.tokens[1]?.text;
  if (word === undefined) return undefined;
  return (ANALYSES as readonly string[]).includes(word) ? word : closest(word, ANALYSES);
}

/** `ports in=(va, vb) out=(outa, outb) [at F]` or `out=outa`. */
function parsePorts(ctx: RequestContext, s: TokenStmt): PortsRequest | undefined {
  const t = s.tokens;
  const loc = (k: number): SourceLoc => (t[k] ? s.line.loc(t[k].start, t[k].end) : s.line.loc(s.line.text.trimEnd().length));
  const usage = 'write `ports in=(va, vb) out=(outa, outb) [at 1 kHz]`';
  let inNames: { name: string; loc: SourceLoc }[] | undefined;
  let outNames: { name: string; loc: SourceLoc }[] | undefined;
  let atHz = 0;
  let k = 1;
  let ok = true;
  while (k < t.length && ok) {
    const word = t[k].text;
    if ((word === 'in' || word === 'out') && t[k + 1]?.text === '=') {
      k += 2;
      const names: { name: string; loc: SourceLoc }[] = [];
      if (t[k]?.text === '(') {
        k++;
        while (k < t.length && t[k].text !== ')') {
          if (t[k].type === 'ident') names.push({ name: t[k].text, loc: loc(k) });
          else if (t[k].text !== ',') {
            ctx.error('syntax', loc(k), `Unexpected \`${t[k].text}\` in the ports list.`, usage);
            ok = false;
            break;
          }
          k++;
        }
        if (t[k]?.text !== ')') {
          if (ok) ctx.error('syntax', loc(k - 1), 'The ports list is never closed.', 'add the missing `)`');
          ok = false;
        }
        k++;
      } else if (t[k]?.type === 'ident') {
        names.push({ name: t[k].text, loc: loc(k) });
        k++;
      } else {
        ctx.error('missing-value', loc(k - 1), `\`${word}=\` needs ${word === 'in' ? 'two sources' : 'one or two nodes'}.`, usage);
        ok = false;
      }
      if (word === 'in') inNames = names;
      else outNames = names;
    } else if (word === 'at') {
      const rest = s.line.text.slice(t[k].end);
      const start = t[k].end + (rest.length - rest.trimStart().length);
      const text = rest.trim();
      if (!text) {
        ctx.error('missing-value', loc(k), '`at` needs a frequency, e.g. `at 1 kHz`.');
        ok = false;
        break;
      }
      atHz = ctx.number({ text, line: s.line, start, loc: s.line.loc(start, start + text.length) }, 'Hz', 'the ports frequency', 'nonnegative');
      k = t.length;
    } else {
      ctx.error('syntax', loc(k), `Unexpected \`${word}\` in the ports line.`, usage);
      ok = false;
    }
  }
  if (!ok) return undefined;
  if (!inNames || inNames.length !== 2) {
    ctx.error('pin-count', s.loc, `\`ports\` needs exactly two drive sources in \`in=(…)\`${inNames ? `; ${inNames.length} given` : ''}.`, usage);
    return undefined;
  }
  if (!outNames || outNames.length < 1 || outNames.length > 2) {
    ctx.error('pin-count', s.loc, `\`ports\` needs one or two output nodes in \`out=\`${outNames ? `; ${outNames.length} given` : ''}.`, usage);
    return undefined;
  }
  const inP = ctx.source(inNames[0].name, inNames[0].loc, '`ports in=`');
  const inN = ctx.source(inNames[1].name, inNames[1].loc, '`ports in=`');
  if (inP && inN && inP === inN) {
    ctx.error('duplicate-name', inNames[1].loc, `\`ports in=\` names \`${inP}\` twice; it needs two different sources.`);
    return undefined;
  }
  const outP = ctx.node(outNames[0].name, outNames[0].loc, false);
  const outN = outNames[1] ? ctx.node(outNames[1].name, outNames[1].loc, false) : undefined;
  if (!inP || !inN || !outP || (outNames[1] && !outN) || Number.isNaN(atHz)) return undefined;
  return { inP, inN, outP, ...(outN ? { outN } : {}), atHz, loc: s.loc };
}

/** Problems of an expression's shape: with them, its calls and arguments cannot be read reliably. */
const STRUCTURAL = new Set(['bad-expression', 'missing-value']);

/**
 * Rewrites a measure/check expression and checks the names it uses. One mistake gets one error:
 * a malformed expression stops here (its calls cannot be read), nothing inside an unknown or
 * malformed call is reported again, and a name of a measure that already failed with its own
 * error drops this request silently.
 */
function resolveExpression(ctx: RequestContext, value: ValueText, known: MeasureNames, hasPorts: boolean): string | undefined {
  const rw = rewriteExpressionDetailed(value.text, { quoteNames: true });
  const at = (offset: number, length: number): SourceLoc => value.line.loc(value.start + offset, value.start + offset + Math.max(1, length));
  let ok = rw.problems.length === 0;
  for (const p of rw.problems) ctx.error(p.code, at(p.offset, p.length), p.message, p.hint);
  if (rw.problems.some((p) => STRUCTURAL.has(p.code))) return undefined;
  /** Spans of calls already reported as wrong: what stands inside them is not reported again. */
  const quiet: [number, number][] = [];
  const isQuiet = (offset: number) => quiet.some(([from, to]) => offset > from && offset < to);
  for (const id of rw.identifiers) {
    if (id.isCall && !MEASURE_FUNCTIONS.has(id.name)) {
      ctx.error('unknown-function', at(id.offset, id.name.length), `Unknown function \`${id.name}\`.`, didYouMean(id.name, MEASURE_FUNCTIONS));
      quiet.push([id.offset, id.callEnd ?? value.text.length]);
      ok = false;
    }
  }
  const { parts } = ctx.scope;
  for (const call of rw.calls) {
    if (isQuiet(call.offset)) continue;
    const nameArgs = call.args.filter((a) => a.name !== undefined);
    const exprArgs = call.args.filter((a) => a.name === undefined);
    const fn = call.fn;
    const spec = functionSpec(fn);
    const maxNames = spec?.names ?? 1;
    const nodeFn = maxNames === 2;
    const maxExtra = spec?.optional ? 1 : 0;
    const firstIsName = call.args.length > 0 && call.args[0].name !== undefined;
    if (!firstIsName || nameArgs.length > maxNames || exprArgs.length > maxExtra || (nodeFn && exprArgs.length > 0)) {
      const what = spec?.arg === 'node' ? 'node' : spec?.arg === 'source' ? 'source' : spec?.arg === 'part' ? 'part' : 'device';
      ctx.error('bad-expression', at(call.offset, fn.length), `\`${fn}(…)\` takes ${nodeFn ? `one or two ${what} names` : `one ${what} name`}${maxExtra ? ' and an optional frequency' : ''}.`);
      quiet.push([call.offset, call.end]);
      ok = false;
      continue;
    }
    for (const arg of nameArgs) {
      const name = arg.name as string;
      const loc = at(arg.offset, name.length);
      if (nodeFn || fn === 'zout') {
        if (!ctx.node(name, loc, fn !== 'zout')) ok = false;
        continue;
      }
      if (fn === 'zin') {
        if (!ctx.source(name, loc, '`zin`')) ok = false;
        continue;
      }
      const part = parts.get(name);
      if (!part) {
        if (!ctx.alreadyReported(name)) ctx.error('unknown-name', loc, `Unknown part \`${name}\`.`, didYouMean(name, parts.keys()) ?? (ctx.scope.nodes.has(name) ? `\`${name}\` is a node: write v(${name})` : undefined));
        ok = false;
        continue;
      }
      const bjt = part.kind === 'npn' || part.kind === 'pnp';
      const mos = part.kind === 'nmos' || part.kind === 'pmos';
      const wrong =
        (BJT_ONLY.has(fn) && !bjt) || (MOS_ONLY.has(fn) && !mos && !(fn === 'id' && part.kind === 'diode')) || (spec?.arg === 'device' && !bjt && !mos);
      if (wrong) {
        const needs = BJT_ONLY.has(fn) ? 'a bipolar transistor' : MOS_ONLY.has(fn) ? 'a MOS transistor' : 'a transistor';
        ctx.error('wrong-kind', loc, `\`${fn}\` needs ${needs}; \`${name}\` is ${article(part.kind)} ${part.kind}.`);
        ok = false;
      } else if (fn === 'i' && (bjt || mos)) {
        ctx.error('wrong-kind', loc, `\`i\` takes a two-terminal part or source; \`${name}\` is ${article(part.kind)} ${part.kind}.`, bjt ? 'use ic(), ib() or ie()' : 'use id()');
        ok = false;
      }
    }
  }
  for (const id of rw.identifiers) {
    if (id.isCall || isQuiet(id.offset)) continue;
    const loc = at(id.offset, id.name.length);
    if (known.failed.has(id.name)) {
      // The measure's own error is the one message; this request is dropped without another.
      ok = false;
      continue;
    }
    if (BUILTIN_FIGURES.includes(id.name)) {
      if (!hasPorts) {
        ctx.error('no-ports', loc, `\`${id.name}\` needs a \`ports\` line.`, 'add `ports in=(va, vb) out=(outa, outb)`');
        ok = false;
      }
      continue;
    }
    if (ctx.scope.params.has(id.name) || known.defined.has(id.name) || PARAM_CONSTANTS.has(id.name)) continue;
    const names = [...BUILTIN_FIGURES, ...known.defined, ...ctx.scope.params.keys()];
    const hint = didYouMean(id.name, names) ?? (ctx.scope.nodes.has(id.name) ? `\`${id.name}\` is a node: write v(${id.name})` : parts.has(id.name) ? `\`${id.name}\` is a part: write i(${id.name}) or a device function` : undefined);
    ctx.error('unknown-name', loc, `Unknown name \`${id.name}\`.`, hint);
    ok = false;
  }
  return ok ? rw.expr.trim() : undefined;
}

/** The measures seen so far: defined ones, and those whose line failed (already reported). */
interface MeasureNames {
  defined: Set<string>;
  failed: Set<string>;
}

function resolveMeasure(ctx: RequestContext, s: MeasureStmt, known: MeasureNames, hasPorts: boolean): MeasureRequest | undefined {
  const name = s.name.text;
  if (BUILTIN_FIGURES.includes(name) || name === GROUND || RESULT_FUNCTIONS.has(name) || MEASURE_FUNCTIONS.has(name)) {
    ctx.error('reserved-name', s.name.loc, `\`${name}\` is a built-in name and cannot name a measure.`, 'choose another name');
    return undefined;
  }
  if (known.defined.has(name)) {
    ctx.error('duplicate-name', s.name.loc, `The measure \`${name}\` is defined twice.`);
    return undefined;
  }
  if (ctx.scope.params.has(name)) {
    ctx.error('duplicate-name', s.name.loc, `\`${name}\` is already a parameter.`, 'give the measure its own name');
    return undefined;
  }
  known.defined.add(name);
  const expr = s.expr ? resolveExpression(ctx, s.expr, known, hasPorts) : undefined;
  if (expr === undefined) {
    known.failed.add(name);
    return undefined;
  }
  return { name, expr, source: (s.expr as ValueText).text, loc: s.name.loc };
}

function resolveCheck(ctx: RequestContext, s: CheckStmt, known: MeasureNames, hasPorts: boolean): CheckRequest | undefined {
  const lhs = resolveExpression(ctx, s.lhs, known, hasPorts);
  const rhs = resolveExpression(ctx, s.rhs, known, hasPorts);
  let tol: number | undefined;
  let tolRelative = false;
  if (s.tol) {
    tolRelative = s.tol.text.trimEnd().endsWith('%');
    tol = ctx.number(s.tol, undefined, 'the tolerance', 'nonnegative');
    if (Number.isNaN(tol)) return undefined;
  }
  if (lhs === undefined || rhs === undefined) return undefined;
  return { text: s.text, lhs, op: s.op, rhs, ...(tol !== undefined ? { tol, ...(tolRelative ? { tolRelative } : {}) } : {}), loc: s.loc };
}
