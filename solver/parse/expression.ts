/**
 * Expressions (§1): quantities replaced by plain numbers so mathjs can read them, and — for
 * measure/check expressions — the name arguments of result functions quoted (`ic(m1.qa)` →
 * `ic("m1.qa")`), since dotted part names are not mathjs identifiers. Parameter expressions are
 * evaluated here with a small mathjs instance (not `create(all)`: the worker bundle stays small).
 */
import {
  absDependencies, addDependencies, cosDependencies, create, divideDependencies, eDependencies,
  evaluateDependencies, expDependencies, log10Dependencies, logDependencies, maxDependencies,
  minDependencies, multiplyDependencies, piDependencies, powDependencies, sinDependencies,
  sqrtDependencies, subtractDependencies, tanDependencies, unaryMinusDependencies, unaryPlusDependencies,
  type MathJsInstance,
} from 'mathjs';
import type { DiagnosticCode } from '../circuit/diagnostic';
import { functionSpec, RESULT_FUNCTIONS } from '../language/vocabulary';
import { parseQuantity, type QuantityUnit } from './quantity';
import { didYouMean } from './suggest';
import { tokenize, type Token } from './tokens';

/** Result functions whose name arguments are quoted (§3): from the vocabulary. */
export { RESULT_FUNCTIONS };

/**
 * How many leading arguments of a result function are names (quoted); the rest are expressions.
 * `v(a, b)` and `ac(a, b)` take two nodes; `zin(src, f)` and `zout(node, f)` one name and a
 * frequency, which may be any expression (`zout(out, fhi)` with `param fhi = 1M`).
 */
export function nameSlots(fn: string): number {
  return functionSpec(fn)?.names ?? 0;
}

/** Functions a parameter expression may call. */
export const PARAM_FUNCTIONS = new Set(['sqrt', 'exp', 'log', 'log10', 'pow', 'abs', 'min', 'max', 'sin', 'cos', 'tan']);
/** Constants a parameter expression may use. */
export const PARAM_CONSTANTS = new Set(['pi', 'e']);

/** A problem found in an expression, at an offset in the text given. */
export interface ExpressionProblem {
  code: DiagnosticCode;
  offset: number;
  length: number;
  message: string;
  hint?: string;
}

/** A call of a result function: its name and its arguments (names quoted, or other expressions). */
export interface ResultCall {
  fn: string;
  offset: number;
  /** Offset just past the closing `)` (the text's length when it is never closed). */
  end: number;
  args: ({ name: string; offset: number } | { name?: undefined; offset: number })[];
}

export interface RewrittenExpression {
  /** mathjs syntax. */
  expr: string;
  problems: ExpressionProblem[];
  /** Bare identifiers (not quoted), with whether they are called as functions and, if so, where the call ends. */
  identifiers: { name: string; offset: number; isCall: boolean; callEnd?: number }[];
  calls: ResultCall[];
  /** The expression is exactly one quantity (possibly signed). */
  singleQuantity: boolean;
}

const ALLOWED_OPS = new Set(['+', '-', '*', '/', '^']);

/**
 * Rewrites a §1 expression (optionally braced) into mathjs syntax. `quoteNames` quotes the name
 * arguments of result functions (measure/check expressions). Units in quantities must fit
 * `expectedUnit` when it is given. Never throws.
 */
export function rewriteExpressionDetailed(
  text: string,
  options: { quoteNames?: boolean; expectedUnit?: QuantityUnit; slot?: string } = {},
): RewrittenExpression {
  const problems: ExpressionProblem[] = [];
  const identifiers: RewrittenExpression['identifiers'] = [];
  const calls: ResultCall[] = [];
  let from = 0;
  let to = text.length;
  const trimmedStart = text.length - text.trimStart().length;
  const trimmedEnd = text.trimEnd().length;
  if (text[trimmedStart] === '{' && text[trimmedEnd - 1] === '}' && trimmedEnd - trimmedStart >= 2) {
    from = trimmedStart + 1;
    to = trimmedEnd - 1;
  }
  const tokens = tokenize(text, from, to);
  if (tokens.length === 0) {
    problems.push({ code: 'missing-value', offset: Math.min(from, text.length), length: 1, message: 'The expression is empty.' });
  }
  const quoted = new Set<number>();
  // Argument tracking for result functions: a stack of open parentheses.
  const frames: { call?: ResultCall; argStart: number; fnStart?: number }[] = [];
  /** Offset of a called name → offset just past its closing `)`. */
  const callEnds = new Map<number, number>();
  const closeArg = (frame: { call?: ResultCall; argStart: number }, endIndex: number): void => {
    if (!frame.call) return;
    const first = tokens[frame.argStart];
    const nameSlot = frame.call.args.length < nameSlots(frame.call.fn);
    if (nameSlot && endIndex - frame.argStart === 1 && first && first.type === 'ident' && options.quoteNames) {
      quoted.add(frame.argStart);
      frame.call.args.push({ name: first.text, offset: first.start });
    } else if (endIndex > frame.argStart) {
      frame.call.args.push({ offset: first ? first.start : 0 });
    }
  };
  for (let k = 0; k < tokens.length; k++) {
    const t = tokens[k];
    if (t.type === 'punct' && t.text === '(') {
      const prev = tokens[k - 1];
      let call: ResultCall | undefined;
      if (prev && prev.type === 'ident' && RESULT_FUNCTIONS.has(prev.text) && options.quoteNames) {
        call = { fn: prev.text, offset: prev.start, end: to, args: [] };
        calls.push(call);
      }
      frames.push({ call, argStart: k + 1, fnStart: prev?.type === 'ident' ? prev.start : undefined });
    } else if (t.type === 'punct' && t.text === ',') {
      const frame = frames[frames.length - 1];
      if (!frame) problems.push({ code: 'bad-expression', offset: t.start, length: 1, message: 'A `,` outside a function call.' });
      else {
        closeArg(frame, k);
        frame.argStart = k + 1;
      }
    } else if (t.type === 'punct' && t.text === ')') {
      const frame = frames.pop();
      if (!frame) problems.push({ code: 'bad-expression', offset: t.start, length: 1, message: 'A `)` without its `(`.' });
      else {
        closeArg(frame, k);
        if (frame.call) frame.call.end = t.end;
        if (frame.fnStart !== undefined) callEnds.set(frame.fnStart, t.end);
      }
    } else if (t.type === 'number') {
      const q = parseQuantity(t.text, options.expectedUnit, options.slot);
      if (!q.ok) problems.push({ code: q.code, offset: t.start + q.offset, length: q.length, message: q.message, hint: q.hint });
    } else if ((t.type === 'op' || t.type === 'punct') && ALLOWED_OPS.has(t.text)) {
      // fine
    } else if (t.type !== 'ident') {
      const what = t.type === 'brace' ? 'braces inside an expression' : `\`${t.text}\``;
      problems.push({ code: 'bad-expression', offset: t.start, length: t.text.length, message: `Unexpected ${what} in an expression.` });
    }
  }
  if (frames.length > 0) {
    problems.push({ code: 'bad-expression', offset: to, length: 1, message: 'A `(` is never closed.', hint: 'add the missing `)`' });
  }
  let expr = '';
  for (let k = 0; k < tokens.length; k++) {
    const t = tokens[k];
    if (t.spaceBefore && k > 0) expr += ' ';
    if (t.type === 'number') {
      const q = parseQuantity(t.text);
      expr += q.ok ? numberText(q.value) : t.text;
    } else if (quoted.has(k)) {
      expr += JSON.stringify(t.text);
    } else {
      if (t.type === 'ident') {
        const next = tokens[k + 1];
        const isCall = !!next && next.text === '(';
        identifiers.push({ name: t.text, offset: t.start, isCall, ...(isCall ? { callEnd: callEnds.get(t.start) ?? to } : {}) });
      }
      expr += t.text;
    }
  }
  const singleQuantity =
    (tokens.length === 1 && tokens[0].type === 'number') ||
    (tokens.length === 2 && (tokens[0].text === '-' || tokens[0].text === '+') && tokens[1].type === 'number' && !tokens[1].spaceBefore);
  return { expr, problems, identifiers, calls, singleQuantity };
}

/** A number as mathjs reads it back exactly. */
function numberText(value: number): string {
  return Object.is(value, -0) ? '0' : String(value);
}

/** Rewrites a §1 expression into mathjs syntax (quantities → numbers, result-function names quoted). */
export function rewriteExpression(text: string): string {
  return rewriteExpressionDetailed(text, { quoteNames: true }).expr;
}

let mathInstance: MathJsInstance | undefined;

/** The small mathjs instance: arithmetic and the functions of PARAM_FUNCTIONS. */
export function paramMath(): MathJsInstance {
  mathInstance ??= create(
    {
      evaluateDependencies, addDependencies, subtractDependencies, multiplyDependencies, divideDependencies,
      unaryMinusDependencies, unaryPlusDependencies, powDependencies, sqrtDependencies, expDependencies,
      logDependencies, log10Dependencies, absDependencies, minDependencies, maxDependencies,
      piDependencies, eDependencies, sinDependencies, cosDependencies, tanDependencies,
    },
    { number: 'number' },
  );
  return mathInstance;
}

/** Names visible to an expression: read-only, possibly layered (block params over top-level). */
export interface NameScope {
  get(name: string): number | undefined;
  has(name: string): boolean;
  keys(): Iterable<string>;
}

/** The scope as mathjs wants it (a Map-like), without copying it: expressions never assign. */
function mathScope(scope: NameScope): Map<string, number> {
  return {
    get: (name: string) => scope.get(name),
    has: (name: string) => scope.has(name),
    keys: () => scope.keys(),
    set: () => {
      throw new Error('assignment is not allowed in an expression');
    },
  } as unknown as Map<string, number>;
}

export type EvaluationResult = { ok: true; value: number } | { ok: false; problems: ExpressionProblem[] };

/**
 * Evaluates a parameter expression (a quantity or an expression over `scope`) to a finite number.
 * Unknown names get a "did you mean". Never throws.
 */
export function evaluateExpression(
  text: string,
  scope: NameScope,
  expectedUnit?: QuantityUnit,
  slot?: string,
): EvaluationResult {
  const rw = rewriteExpressionDetailed(text, { quoteNames: false, expectedUnit, slot });
  if (rw.problems.length > 0) return { ok: false, problems: rw.problems };
  if (rw.singleQuantity) {
    const direct = Number(rw.expr.trim());
    if (Number.isFinite(direct)) return { ok: true, value: Object.is(direct, -0) ? 0 : direct };
  }
  const problems: ExpressionProblem[] = [];
  // A parameter that already failed is NaN in the scope: stay silent, its own error says it all.
  if (rw.identifiers.some((id) => !id.isCall && Number.isNaN(scope.get(id.name)))) return { ok: false, problems: [] };
  for (const id of rw.identifiers) {
    if (id.isCall) {
      if (!PARAM_FUNCTIONS.has(id.name)) {
        problems.push({
          code: 'unknown-function', offset: id.offset, length: id.name.length,
          message: `Unknown function \`${id.name}\` in a parameter expression.`,
          hint: didYouMean(id.name, PARAM_FUNCTIONS) ?? `available: ${[...PARAM_FUNCTIONS].join(', ')}`,
        });
      }
    } else if (!scope.has(id.name) && !PARAM_CONSTANTS.has(id.name)) {
      problems.push({
        code: 'unknown-param', offset: id.offset, length: id.name.length,
        message: `Unknown parameter \`${id.name}\`.`,
        hint: didYouMean(id.name, scope.keys()) ?? 'define it with `param NAME = VALUE` before it is used',
      });
    }
  }
  if (problems.length > 0) return { ok: false, problems };
  let value: unknown;
  try {
    value = paramMath().evaluate(rw.expr, mathScope(scope));
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    return { ok: false, problems: [{ code: 'bad-expression', offset: 0, length: text.length, message: `The expression cannot be evaluated: ${message}.` }] };
  }
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    return {
      ok: false,
      problems: [{ code: 'bad-expression', offset: 0, length: text.length, message: `\`${text.trim()}\` does not evaluate to a finite real number.` }],
    };
  }
  return { ok: true, value: Object.is(value, -0) ? 0 : value };
}

export type { Token };
