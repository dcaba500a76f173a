/**
 * Evaluates `measure` and `check` statements with mathjs over one solved circuit.
 *
 * Scope, in order of precedence (later wins): the netlist's params, the measures evaluated so
 * far, adm/acm/cmrr/cmrr_db from the ports, then the measure functions. A measure must come out
 * as a finite real number; anything else (a complex value, a curve, an unknown name, a function
 * used on the wrong kind of device…) is an error diagnostic on the statement's line.
 */
import type { EvalFunction, MathNode } from 'mathjs';
import type { CheckRequest, MeasureRequest } from '../circuit/analyses';
import { diagnostic, type Diagnostic, type SourceLoc } from '../circuit/diagnostic';
import type { CheckResult } from '../circuit/result';
import { BUILTIN_FIGURES, CURVE_FUNCTIONS, PORTS_CURVE_NAMES } from '../language/vocabulary';
import { fromPhasor, functionTable, type MeasureContext } from './functions';
import { isEffectivelyReal } from '../numeric/complex';
import { FollowOnError, MeasureError, didYouMean } from './measure-error';
import { measureMath } from './math';
import { evaluateCheck } from './checks';

export interface MeasureOutcome {
  measures: Record<string, number>;
  checks: CheckResult[];
  diagnostics: Diagnostic[];
}

function measureError(loc: SourceLoc, message: string, hint?: string): Diagnostic {
  return diagnostic('error', 'measure-error', loc, message, hint);
}

/** Inside at/corner/unity/margin the bare names adm, acm, cmrr stand for their curves. */
function markCurveNames(node: MathNode): MathNode {
  return node.transform((child, _path, parent) => {
    const p = parent as unknown as { type?: string; fn?: { name?: string }; args?: MathNode[] } | null;
    const c = child as unknown as { type: string; name?: string };
    if (
      c.type === 'SymbolNode' &&
      PORTS_CURVE_NAMES.includes(c.name ?? '') &&
      p?.type === 'FunctionNode' &&
      CURVE_FUNCTIONS.includes(p.fn?.name ?? '') &&
      p.args?.[0] === child
    ) {
      return measureMath.parse(JSON.stringify(c.name));
    }
    return child;
  });
}

/** An expression parsed and compiled once, with the names it reads. */
interface CompiledExpression {
  compiled: EvalFunction;
  symbols: string[];
}

/**
 * Expressions compiled so far, by text. A sweep or a mismatch analysis evaluates the same few
 * expressions hundreds of times over different scopes; parsing and compiling them each time was
 * a third of a mismatch run. Bounded: cleared when full (an editing session makes new texts).
 */
const compiledCache = new Map<string, CompiledExpression>();
const COMPILED_CACHE_SIZE = 500;

function compiledExpression(expr: string): CompiledExpression {
  let hit = compiledCache.get(expr);
  if (!hit) {
    const node = markCurveNames(measureMath.parse(expr));
    const symbols = node.filter((n) => (n as unknown as { type: string }).type === 'SymbolNode').map((n) => (n as unknown as { name: string }).name);
    hit = { compiled: node.compile(), symbols };
    if (compiledCache.size >= COMPILED_CACHE_SIZE) compiledCache.clear();
    compiledCache.set(expr, hit);
  }
  return hit;
}

/** Reads a mathjs value as a finite real number, or explains why it is not one. */
function toMeasureValue(what: string, value: unknown): number {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new MeasureError(`${what} is not a finite number (${value}).`, 'look for a division by zero or a log of zero');
    return value;
  }
  if (typeof value === 'object' && value !== null && 're' in value && 'im' in value) {
    const z = value as { re: number; im: number };
    if (isEffectivelyReal(z)) return toMeasureValue(what, z.re);
    throw new MeasureError(`${what} is complex (${+z.re.toPrecision(4)} ${z.im < 0 ? '−' : '+'} ${+Math.abs(z.im).toPrecision(4)}i).`, 'take mag(), db() or phase() of it');
  }
  if (typeof value === 'object' && value !== null && 'freqHz' in value) {
    throw new MeasureError(`${what} is a whole curve, not a number.`, 'use at(curve, f), corner(), unity() or margin()');
  }
  if (typeof value === 'boolean') throw new MeasureError(`${what} is a comparison, not a number.`, 'write comparisons as `check` statements');
  if (typeof value === 'string') throw new MeasureError(`${what} is the name \`${value}\`, not a number.`, `write v(${value}) for a node voltage`);
  throw new MeasureError(`${what} is not a number.`);
}

/**
 * mathjs messages for unknown names, rephrased with suggestions; undefined for a follow-on of an
 * error already reported (a failed measure, ac sweep or ports line), which says nothing more.
 */
function explain(
  err: unknown, scopeNames: string[], functionNames: string[], failedMeasures: ReadonlySet<string>, failedRequests: ReadonlySet<string>,
): { message: string; hint?: string } | undefined {
  if (err instanceof FollowOnError) return undefined;
  if (err instanceof MeasureError) return { message: err.message, hint: err.hint };
  const text = err instanceof Error ? err.message : String(err);
  const symbol = /^Undefined symbol (\S+)/.exec(text);
  if (symbol) {
    const name = symbol[1];
    if (failedMeasures.has(name)) return undefined;
    if (BUILTIN_FIGURES.includes(name)) {
      if (failedRequests.has('ports')) return undefined;
      return { message: `\`${name}\` needs a \`ports\` statement.`, hint: 'add `ports in=(va, vb) out=(outa, outb)`' };
    }
    return { message: `unknown name \`${name}\`.`, hint: didYouMean(name, [...scopeNames, ...functionNames]) ?? 'names here are params, earlier measures, adm, acm, cmrr, cmrr_db' };
  }
  const fn = /^Undefined function (\S+)/.exec(text);
  if (fn) return { message: `unknown function \`${fn[1]}\`.`, hint: didYouMean(fn[1], functionNames) };
  if (/Unexpected|Parenthesis|Syntax|Value expected|char \d+/.test(text)) return { message: `cannot read the expression: ${text}.` };
  return { message: text };
}

/**
 * Evaluates the measures in order (each may use the earlier ones), then the checks.
 * Never throws.
 */
export function evaluateMeasures(measureRequests: MeasureRequest[], checkRequests: CheckRequest[], ctx: MeasureContext): MeasureOutcome {
  // The shared function table reads this evaluation's context (restored after: never nested today).
  const previous = current;
  current = ctx;
  try {
    return evaluateInContext(measureRequests, checkRequests, ctx);
  } finally {
    current = previous;
  }
}

/** The context of the evaluation in progress, which the shared function table reads. */
let current: MeasureContext | undefined;
const sharedFunctions = functionTable(() => {
  if (!current) throw new Error('a measure function was called outside an evaluation');
  return current;
});
const functionNames = Object.keys(sharedFunctions);
const functionNameSet: ReadonlySet<string> = new Set(functionNames);

/**
 * The names an expression sees: the functions (which win over a param of the same name), then
 * the params, the ports figures and the measures so far. A Map as mathjs reads one (get, set,
 * has, keys), over the one shared function table instead of a copy of it per evaluation.
 */
class MeasureScope {
  private readonly own = new Map<string, unknown>();

  get(name: string): unknown {
    return functionNameSet.has(name) ? sharedFunctions[name] : this.own.get(name);
  }

  has(name: string): boolean {
    return functionNameSet.has(name) || this.own.has(name);
  }

  set(name: string, value: unknown): this {
    this.own.set(name, value);
    return this;
  }

  delete(name: string): boolean {
    return this.own.delete(name);
  }

  keys(): IterableIterator<string> {
    return new Set([...functionNames, ...this.own.keys()]).keys();
  }

  /** The names that are values (not functions). */
  valueNames(): string[] {
    return [...this.own.keys()].filter((k) => !functionNameSet.has(k) && typeof this.own.get(k) !== 'function');
  }
}

function evaluateInContext(measureRequests: MeasureRequest[], checkRequests: CheckRequest[], ctx: MeasureContext): MeasureOutcome {
  const scope = new MeasureScope();
  for (const [k, v] of Object.entries(ctx.params)) scope.set(k, v);
  if (ctx.ports) {
    scope.set('adm', fromPhasor(ctx.ports.adm));
    scope.set('acm', fromPhasor(ctx.ports.acm));
    scope.set('cmrr', ctx.ports.cmrr);
    scope.set('cmrr_db', ctx.ports.cmrrDb);
  }

  const measures: Record<string, number> = {};
  /** Measures that failed (reported once): what uses them stays silent. */
  const failed = new Set<string>();
  const failedRequests = ctx.failed ?? new Set<string>();
  const diagnostics: Diagnostic[] = [];
  const scopeNames = () => scope.valueNames();

  const evaluate = (what: string, expr: string): number => {
    const { compiled, symbols } = compiledExpression(expr);
    // A failed measure is absent from the scope, and mathjs would read a missing `g` or `h` as
    // a unit (gram, hour): what uses a failed measure is its follow-on, said nothing about.
    const dependency = symbols.find((name) => failed.has(name));
    if (dependency) throw new FollowOnError(`the measure ${dependency}`);
    return toMeasureValue(what, compiled.evaluate(scope));
  };

  for (const m of measureRequests) {
    // A measure named like a function or a ports figure was refused where requests are resolved
    // (`reserved-name`); the evaluator takes the names it is given.
    try {
      const value = evaluate('the value', m.expr);
      measures[m.name] = value;
      failed.delete(m.name);
      scope.set(m.name, value);
    } catch (err) {
      const why = explain(err, scopeNames(), functionNames, failed, failedRequests);
      if (why) {
        const prefix = `measure ${m.name}: `;
        diagnostics.push(measureError(m.loc, why.message.startsWith(prefix) ? why.message : prefix + why.message, why.hint));
      }
      failed.add(m.name);
      scope.delete(m.name);
    }
  }

  const checks: CheckResult[] = [];
  for (const c of checkRequests) {
    try {
      const value = evaluate('the left side', c.lhs);
      const limit = evaluate('the right side', c.rhs);
      const result = evaluateCheck(c, value, limit);
      if (typeof result === 'string') diagnostics.push(measureError(c.loc, `check ${c.text}: ${result}`));
      else checks.push(result);
    } catch (err) {
      const why = explain(err, scopeNames(), functionNames, failed, failedRequests);
      if (why) diagnostics.push(measureError(c.loc, `check ${c.text}: ${why.message}`, why.hint));
    }
  }
  return { measures, checks, diagnostics };
}
