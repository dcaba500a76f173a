/**
 * The unit of a measure or check, guessed from its expression: the result JSON carries plain
 * numbers in SI base units, so the panels read the unit off the function that produced the
 * number (`db(…)` → dB, `corner(…)` → Hz, `ic(…)` → A, …).
 *
 * The guess is deliberately modest: sums and differences of one unit keep it (`vce(q1) - 0.3`),
 * `min`/`max`/`abs` pass it through, a product or a quotient of named quantities is a plain number.
 */
import type { Unit } from './si-format';

/** The unit of each result function of the netlist language (§3). */
const FUNCTION_UNITS: Record<string, Unit> = {
  db: 'dB', corner: 'Hz', unity: 'Hz', margin: '°', phase: '°',
  v: 'V', vbe: 'V', vce: 'V', vgs: 'V', vds: 'V', vov: 'V',
  i: 'A', ic: 'A', ib: 'A', ie: 'A', id: 'A',
  gm: 'S', gds: 'S',
  rpi: 'Ω', ro: 'Ω', zin: 'Ω', zout: 'Ω',
  cpi: 'F', cmu: 'F',
};

/** Figures of the ports analysis that stand as bare names. */
const NAME_UNITS: Record<string, Unit> = { cmrr_db: 'dB', adm: '', acm: '', cmrr: '' };

/** Functions whose result has the unit of their (first) argument. */
const PASS_THROUGH = new Set(['min', 'max', 'abs', 'mag', 'at']);

/**
 * Guesses the unit of an expression written in the netlist language.
 * `known` gives the units of names defined elsewhere (earlier measures), e.g. { vmin: 'V' }.
 */
export function guessUnit(expr: string, known: Record<string, Unit> = {}): Unit {
  const text = stripOuterParens(expr.trim());
  if (!text) return '';
  const terms = splitTopLevel(text, ['+', '-']);
  if (terms.length > 1) {
    const units = terms.map((t) => guessTerm(t, known)).filter((u): u is Unit => u !== undefined);
    // A bare number added to a quantity (`vce(q1) - 0.3`) takes that quantity's unit.
    const named = units.filter((u) => u !== '');
    return named.length > 0 && named.every((u) => u === named[0]) ? named[0] : '';
  }
  return guessTerm(text, known) ?? '';
}

/** Unit of a term without top-level + or −; undefined for a bare number (it adopts its neighbours'). */
function guessTerm(term: string, known: Record<string, Unit>): Unit | undefined {
  const text = stripOuterParens(term.trim().replace(/^[+-]\s*/, ''));
  if (/^[0-9.]/.test(text) && splitTopLevel(text, ['*', '/', '^']).length === 1) return undefined;
  if (splitTopLevel(text, ['*', '/', '^']).length > 1) {
    // A number times a quantity keeps the quantity's unit (`2*ic(q1)`); anything else is plain.
    const factors = splitTopLevel(text, ['*', '/', '^']);
    const units = factors.map((f) => guessTerm(f, known));
    const named = units.filter((u) => u !== undefined);
    const op = text.includes('/') || text.includes('^');
    return named.length === 1 && !op ? named[0] : '';
  }
  const call = /^([A-Za-z_][A-Za-z0-9_]*)\s*\((.*)\)$/s.exec(text);
  if (call) {
    const [, name, args] = call;
    if (name in FUNCTION_UNITS) return FUNCTION_UNITS[name];
    if (PASS_THROUGH.has(name)) {
      const first = splitTopLevel(args, [','])[0] ?? '';
      return guessUnit(first, known);
    }
    return '';
  }
  if (/^[A-Za-z_][A-Za-z0-9_.]*$/.test(text)) return known[text] ?? NAME_UNITS[text] ?? '';
  return '';
}

/** Splits at the given one-character operators outside parentheses (and not as a sign or in 1e-3). */
function splitTopLevel(text: string, ops: string[]): string[] {
  const parts: string[] = [];
  let depth = 0;
  let start = 0;
  for (let k = 0; k < text.length; k++) {
    const c = text[k];
    if (c === '(') depth++;
    else if (c === ')') depth--;
    else if (depth === 0 && ops.includes(c)) {
      const before = text.slice(start, k).trim();
      const isSign = (c === '+' || c === '-') && (before === '' || /[eE]$/.test(before) && /[0-9.][eE]$/.test(before));
      if (isSign) continue;
      parts.push(text.slice(start, k));
      start = k + 1;
    }
  }
  parts.push(text.slice(start));
  return parts.map((p) => p.trim()).filter((p) => p !== '');
}

/** "(a + b)" → "a + b" when the parentheses enclose the whole text. */
function stripOuterParens(text: string): string {
  let t = text;
  while (t.startsWith('(') && t.endsWith(')')) {
    let depth = 0;
    let wraps = true;
    for (let k = 0; k < t.length; k++) {
      if (t[k] === '(') depth++;
      else if (t[k] === ')') depth--;
      if (depth === 0 && k < t.length - 1) { wraps = false; break; }
    }
    if (!wraps) break;
    t = t.slice(1, -1).trim();
  }
  return t;
}

/** The left-hand side of a check's text: `ic(q1) = 1m ± 5%` → `ic(q1)`. */
export function checkSubject(text: string): string {
  const m = /^(.*?)(>=|<=|=|>|<)/s.exec(text);
  return (m ? m[1] : text).trim();
}
