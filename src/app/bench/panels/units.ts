/**
 * The unit of a measure or check, worked out from its expression: the result JSON carries plain
 * numbers in SI base units, so the panels read the unit off the functions and operators that
 * produced the number.
 *
 * A small unit algebra over the expression's tokens (the solver's own tokenizer, so a quantity
 * such as `1 kΩ` is one token), the units of result functions and device quantities read from
 * the language's table (solver/language/vocabulary.ts): every value carries exponents of volt,
 * ampere and second, and the result is named when it is one the bench writes — V·A is W, V/A
 * is Ω, A/V is S, A·s/V is F, V·s/A is H, 1/s is Hz, V/V is a plain number. `db()` gives dB and
 * `phase()`/`margin()` give °, which survive only scaling and sums with plain numbers. A bare
 * number (or a param, whose unit is not written) adopts the unit of what it is added to;
 * anything the algebra cannot name is a plain number rather than a guess.
 */
import { FIGURES, functionSpec, parseQuantity, tokenize, type OutlineMeasure, type Token } from '../../../../solver';
import type { Unit } from './si-format';

/** Exponents of V, A and s; `free` marks a bare number, which takes its neighbours' unit in sums. */
interface Dims { kind: 'dims'; v: number; a: number; s: number; free?: boolean; param?: boolean }
/** dB and degrees are no products of base units; `other` is what the algebra cannot name. */
type Value = Dims | { kind: 'dB' | '°' | 'other' };

const dims = (v: number, a: number, s: number): Dims => ({ kind: 'dims', v, a, s });
const PLAIN = dims(0, 0, 0);
const FREE: Dims = { ...PLAIN, free: true };
/** A param: a number whose unit is not written. It adopts a unit in a sum, but a product or
 *  quotient of it with a unit names nothing (`ic(q) / iref`, iref a current, is no ampere). */
const PARAM: Dims = { ...FREE, param: true };
const OTHER: Value = { kind: 'other' };

/** Each unit the bench writes, as exponents of V, A and s. */
const NAMED: [Unit, Dims][] = [
  ['', PLAIN], ['V', dims(1, 0, 0)], ['A', dims(0, 1, 0)], ['Ω', dims(1, -1, 0)], ['S', dims(-1, 1, 0)],
  ['W', dims(1, 1, 0)], ['F', dims(-1, 1, 1)], ['s', dims(0, 0, 1)], ['Hz', dims(0, 0, -1)],
];
/** Units of a quantity written in an expression (`1 kΩ`, `10 pF`); H is V·s/A. */
const QUANTITY_UNITS: Record<string, Dims> = { ...Object.fromEntries(NAMED.filter(([u]) => u)), H: dims(1, -1, 1), '%': FREE };

/**
 * How a function whose table unit is "plain or its argument's" combines its arguments' units.
 * Any other such function (log, exp, …) gives a plain number.
 */
const FROM_ARGUMENTS: Record<string, (args: Operand[]) => Value> = {
  mag: (args) => first(args), abs: (args) => first(args), at: (args) => first(args),
  min: (args) => sum(args.map((a) => a.unit)), max: (args) => sum(args.map((a) => a.unit)),
  sqrt: (args) => power(first(args), 0.5),
  pow: (args) => power(first(args), args[1]?.literal),
};
const first = (args: Operand[]): Value => args[0]?.unit ?? OTHER;

/**
 * ac(n) is the response to the sources' ac= drive, read as a gain (drive 1 V, get V/V): the table
 * gives the node's volts, the panels show the ratio.
 */
const READ_AS_GAIN = new Set(['ac']);

/** Constants of expressions (docs/netlist.md §2): plain numbers. */
const CONSTANTS = new Set(['pi', 'e']);

/** The ports figures stand as bare names: gains and ratios, and their `_db` forms in dB. */
const FIGURE_UNITS: Record<string, Unit> = Object.fromEntries(FIGURES.map((f) => [f.name, f.name.endsWith('_db') ? 'dB' : '']));

function fromUnit(unit: Unit): Value {
  if (unit === 'dB' || unit === '°') return { kind: unit };
  return NAMED.find(([u]) => u === unit)?.[1] ?? OTHER;
}

function toUnit(x: Value): Unit {
  if (x.kind !== 'dims') return x.kind === 'other' ? '' : x.kind;
  return NAMED.find(([, d]) => d.v === x.v && d.a === x.a && d.s === x.s)?.[0] ?? '';
}

const same = (x: Dims, y: Dims) => x.v === y.v && x.a === y.a && x.s === y.s;

/** A sum (or min, max): terms of one unit keep it; bare numbers adopt it; mixed units name nothing. */
function sum(terms: Value[]): Value {
  const named = terms.filter((t) => !(t.kind === 'dims' && t.free));
  if (named.length === 0) return FREE;
  const first = named[0];
  const agree = named.every((t) => (t.kind === 'dims' && first.kind === 'dims' ? same(t, first) : t.kind === first.kind));
  return agree && first.kind !== 'other' ? (first.kind === 'dims' ? { ...first, free: undefined } : first) : OTHER;
}

/** x·y^sign (sign −1 for a quotient). dB and ° survive scaling by a bare number only. */
function product(x: Value, y: Value, sign: 1 | -1): Value {
  const param = (d: Value) => d.kind === 'dims' && !!d.param;
  const united = (d: Value) => d.kind !== 'dims' || (!d.free && !(d.v === 0 && d.a === 0 && d.s === 0));
  if ((param(x) && united(y)) || (param(y) && united(x))) return OTHER;
  if (x.kind === 'dims' && y.kind === 'dims') {
    return { kind: 'dims', v: x.v + sign * y.v, a: x.a + sign * y.a, s: x.s + sign * y.s, ...(x.free && y.free ? { free: true, ...(x.param || y.param ? { param: true } : {}) } : {}) };
  }
  if (y.kind === 'dims' && y.free) return x;
  if (sign === 1 && x.kind === 'dims' && x.free) return y;
  return OTHER;
}

function power(x: Value, n: number | undefined): Value {
  if (x.kind !== 'dims') return OTHER;
  if (x.free || (x.v === 0 && x.a === 0 && x.s === 0)) return x;
  if (n === undefined) return OTHER;
  const out = dims(x.v * n, x.a * n, x.s * n);
  return Number.isInteger(out.v) && Number.isInteger(out.a) && Number.isInteger(out.s) ? out : OTHER;
}

/** What parsing yields: a unit, and the number itself when the operand is a literal (for `^`). */
interface Operand { unit: Value; literal?: number }

/** Recursive descent over the tokens: sum → product → unary → power → primary. */
class UnitParser {
  private k = 0;
  constructor(private readonly tokens: Token[], private readonly known: Record<string, Unit>) {}

  parse(): Value {
    const x = this.sum();
    if (this.k !== this.tokens.length) throw new Error('trailing tokens');
    return x.unit;
  }

  private peek(): string | undefined {
    return this.tokens[this.k]?.text;
  }

  private expect(text: string): void {
    if (this.tokens[this.k++]?.text !== text) throw new Error(`expected ${text}`);
  }

  private sum(): Operand {
    const terms = [this.product()];
    while (this.peek() === '+' || this.peek() === '-') {
      this.k++;
      terms.push(this.product());
    }
    return terms.length === 1 ? terms[0] : { unit: sum(terms.map((t) => t.unit)) };
  }

  private product(): Operand {
    let x = this.unary();
    while (this.peek() === '*' || this.peek() === '/') {
      const sign = this.tokens[this.k++].text === '*' ? 1 : -1;
      x = { unit: product(x.unit, this.unary().unit, sign) };
    }
    return x;
  }

  private unary(): Operand {
    if (this.peek() === '-' || this.peek() === '+') {
      const negative = this.tokens[this.k++].text === '-';
      const x = this.unary();
      return x.literal === undefined ? x : { unit: x.unit, literal: negative ? -x.literal : x.literal };
    }
    return this.power();
  }

  private power(): Operand {
    const base = this.primary();
    if (this.peek() !== '^') return base;
    this.k++;
    return { unit: power(base.unit, this.unary().literal) };
  }

  private primary(): Operand {
    const t = this.tokens[this.k++];
    if (!t) throw new Error('unexpected end');
    if (t.type === 'number') {
      const q = parseQuantity(t.text);
      if (!q.ok) throw new Error(q.message);
      return { unit: q.unit ? QUANTITY_UNITS[q.unit] ?? OTHER : FREE, literal: q.value };
    }
    if (t.type === 'brace') return { unit: unitOf(t.text.slice(1, t.unterminated ? undefined : -1), this.known) };
    if (t.text === '(') {
      const x = this.sum();
      this.expect(')');
      return x;
    }
    if (t.type !== 'ident') throw new Error(`unexpected ${t.text}`);
    if (this.peek() !== '(') return { unit: this.name(t.text) };
    this.k++;
    const args: Operand[] = [];
    while (this.peek() !== ')') {
      args.push(this.sum());
      if (this.peek() === ',') this.k++;
      else if (this.peek() !== ')') throw new Error('expected , or )');
    }
    this.k++;
    return { unit: this.call(t.text, args) };
  }

  private name(name: string): Value {
    if (name in this.known) return fromUnit(this.known[name]);
    if (name in FIGURE_UNITS) return fromUnit(FIGURE_UNITS[name]);
    // A constant is a plain number; a param is a number whose unit is not written.
    return CONSTANTS.has(name) ? FREE : PARAM;
  }

  private call(fn: string, args: Operand[]): Value {
    const spec = functionSpec(fn);
    if (!spec) return OTHER;
    if (READ_AS_GAIN.has(fn)) return PLAIN;
    if (spec.unit) return fromUnit(spec.unit as Unit);
    return FROM_ARGUMENTS[fn]?.(args) ?? PLAIN;
  }
}

function unitOf(expr: string, known: Record<string, Unit>): Value {
  try {
    return new UnitParser(tokenize(expr), known).parse();
  } catch {
    return OTHER;
  }
}

/**
 * The unit of an expression written in the netlist language, e.g. `i(q1.c) * v(out)` → W,
 * `v(out) / i(vcc)` → Ω, `ic(q1) / ic(q2)` → a plain number ('').
 * `known` gives the units of names defined elsewhere (earlier measures), e.g. { vmin: 'V' }.
 */
export function guessUnit(expr: string, known: Record<string, Unit> = {}): Unit {
  return toUnit(unitOf(expr, known));
}

/** A check's comparison in its parts: `ic(q1) = 1m ± 5%` → `ic(q1)`, `=`, `1m`, `5%`. */
export interface CheckParts {
  subject: string;
  op: string;
  limit: string;
  tolerance?: string;
}

const COMPARISONS = new Set(['>=', '<=', '==', '>', '<', '=']);

/**
 * Splits a check's comparison (its text in the result, or its expression in the outline) where
 * the solver does: at the first comparison outside parentheses, then at `±` or `+-`.
 */
export function checkParts(text: string): CheckParts {
  const tokens = tokenize(text);
  let depth = 0;
  let op: Token | undefined;
  let tol: Token | undefined;
  for (const t of tokens) {
    if (t.text === '(') depth++;
    else if (t.text === ')') depth--;
    else if (depth === 0 && !op && COMPARISONS.has(t.text)) op = t;
    else if (depth === 0 && op && (t.text === '\u00b1' || t.text === '+-')) {
      tol = t;
      break;
    }
  }
  if (!op) return { subject: text.trim(), op: '', limit: '' };
  return {
    subject: text.slice(0, op.start).trim(),
    op: op.text === '==' ? '=' : op.text,
    limit: text.slice(op.end, tol ? tol.start : undefined).trim(),
    ...(tol ? { tolerance: text.slice(tol.end).trim() } : {}),
  };
}

/**
 * The unit of every measure, in statement order so that a measure built on an earlier one
 * (`measure vmin = …` then `check vmin > 0.3`) inherits its unit.
 */
export function measureUnits(measures: readonly OutlineMeasure[]): Record<string, Unit> {
  const known: Record<string, Unit> = {};
  for (const m of measures) known[m.name] = guessUnit(m.expression, known);
  return known;
}
