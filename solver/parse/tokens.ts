/**
 * Tokenizer for one logical line. Tokens keep their offsets in the logical text so every
 * diagnostic can point at a column. A quantity (`4.7k`, `10 pF`, `5%`) is ONE token: the number,
 * its attached prefix/unit letters, and a unit word separated by exactly one space.
 */

export type TokenType = 'ident' | 'number' | 'brace' | 'punct' | 'op' | 'other';

export interface Token {
  type: TokenType;
  /** Source text of the token (for `brace`, including the braces). */
  text: string;
  /** Offset of the first character in the logical line. */
  start: number;
  /** Offset just past the last character. */
  end: number;
  /** Whether whitespace separates this token from the previous one. */
  spaceBefore: boolean;
  /** `brace` only: no closing `}` was found. */
  unterminated?: boolean;
}

/** SI prefixes, case-sensitive; both micro signs accepted. */
export const PREFIXES: Record<string, number> = {
  f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, '\u00b5': 1e-6, '\u03bc': 1e-6, m: 1e-3, k: 1e3, M: 1e6, G: 1e9, T: 1e12,
};

/** Unit spellings and their canonical form. `S` (siemens) is accepted for transconductances. */
export const UNITS: Record<string, string> = {
  V: 'V', A: 'A', '\u03a9': '\u03a9', '\u2126': '\u03a9', ohm: '\u03a9', F: 'F', H: 'H', Hz: 'Hz', s: 's', S: 'S', '%': '%',
};

const UNIT_CHAR = /[A-Za-z\u00b5\u03bc\u03a9\u2126%]/;
const IDENT_START = /[A-Za-z_]/;
const IDENT_CHAR = /[A-Za-z0-9_]/;
const DIGIT = /[0-9]/;

/** True when `word` reads as a prefix and/or unit (or the forbidden `meg`), e.g. `kΩ`, `pF`, `k`. */
export function isUnitWord(word: string): boolean {
  if (word.length === 0) return false;
  if (UNITS[word] !== undefined) return true;
  if (/^meg/i.test(word)) return true;
  if (PREFIXES[word[0]] === undefined) return false;
  const rest = word.slice(1);
  return rest === '' || (UNITS[rest] !== undefined && rest !== '%');
}

/** Length of the numeric literal (digits, point, exponent) at `i`, or 0. */
function numberLiteralLength(text: string, i: number): number {
  let j = i;
  while (j < text.length && DIGIT.test(text[j])) j++;
  if (text[j] === '.') {
    j++;
    while (j < text.length && DIGIT.test(text[j])) j++;
  }
  if (j === i || (j === i + 1 && text[i] === '.')) return 0;
  if ((text[j] === 'e' || text[j] === 'E')) {
    let k = j + 1;
    if (text[k] === '+' || text[k] === '-') k++;
    if (DIGIT.test(text[k] ?? '')) {
      while (k < text.length && DIGIT.test(text[k])) k++;
      j = k;
    }
  }
  return j - i;
}

const TWO_CHAR_OPS = ['>=', '<=', '==', '!=', '+-'];

/** Tokens of `text` from offset `from` to `to` (default: the whole text). Never throws. */
export function tokenize(text: string, from = 0, to = text.length): Token[] {
  const tokens: Token[] = [];
  let i = from;
  let spaceBefore = true;
  while (i < to) {
    const c = text[i];
    if (c === ' ' || c === '\t' || c === '\f' || c === '\v' || c === '\u00a0') {
      spaceBefore = true;
      i++;
      continue;
    }
    const start = i;
    let type: TokenType;
    let unterminated = false;
    if (IDENT_START.test(c)) {
      i++;
      while (i < to && IDENT_CHAR.test(text[i])) i++;
      // Hierarchical names: `m1.qa`.
      while (i + 1 < to && text[i] === '.' && IDENT_START.test(text[i + 1])) {
        i += 2;
        while (i < to && IDENT_CHAR.test(text[i])) i++;
      }
      type = 'ident';
    } else if (DIGIT.test(c) || (c === '.' && DIGIT.test(text[i + 1] ?? ''))) {
      i += numberLiteralLength(text, i);
      const suffixStart = i;
      while (i < to && UNIT_CHAR.test(text[i])) i++;
      if (i === suffixStart && text[i] === ' ' && i + 1 < to && UNIT_CHAR.test(text[i + 1])) {
        let j = i + 1;
        while (j < to && UNIT_CHAR.test(text[j])) j++;
        const next = text[j] ?? '';
        if (!/[A-Za-z0-9_.(=:]/.test(next) && isUnitWord(text.slice(i + 1, j))) i = j;
      }
      type = 'number';
    } else if (c === '{') {
      const close = text.indexOf('}', i + 1);
      if (close < 0 || close >= to) {
        i = to;
        unterminated = true;
      } else i = close + 1;
      type = 'brace';
    } else if (TWO_CHAR_OPS.includes(text.slice(i, i + 2))) {
      i += 2;
      type = 'op';
    } else if ('(),=:@/;[]'.includes(c)) {
      i++;
      type = 'punct';
    } else if ('+-*^<>±%!'.includes(c)) {
      i++;
      type = 'op';
    } else {
      // One code point of anything else (keeps surrogate pairs together).
      const cp = text.codePointAt(i) ?? 0;
      i += cp > 0xffff ? 2 : 1;
      type = 'other';
    }
    const tok: Token = { type, text: text.slice(start, i), start, end: i, spaceBefore };
    if (unterminated) tok.unterminated = true;
    tokens.push(tok);
    spaceBefore = false;
  }
  return tokens;
}
