import { describe, expect, it } from 'vitest';
import { parseQuantity } from './quantity';
import { expectNearlyEqual } from '../testing/nearly-equal';

// Prefix factors: BIPM, The International System of Units (SI Brochure), 9th ed. (2019), Table 7.
// Spellings, units and the `meg` refusal: netlist-language.md §1 (Quantities).
const prefixes: [string, number][] = [
  ['f', 1e-15], ['p', 1e-12], ['n', 1e-9], ['u', 1e-6], ['\u00b5', 1e-6], ['\u03bc', 1e-6],
  ['m', 1e-3], ['k', 1e3], ['M', 1e6], ['G', 1e9], ['T', 1e12],
];

function value(text: string, unit?: Parameters<typeof parseQuantity>[1]): number {
  const q = parseQuantity(text, unit);
  if (!q.ok) throw new Error(`${text}: ${q.message}`);
  return q.value;
}

describe('parseQuantity', () => {
  it.each(prefixes)('prefix %s scales by %d', (prefix, factor) => {
    expect(value(`3${prefix}`)).toBe(Number(`3e${Math.round(Math.log10(factor))}`));
    expectNearlyEqual(value(`3${prefix}`), 3 * factor, 5e-13, 0);
  });

  it.each([
    ['10 V', 10, 'V'], ['2 A', 2, 'A'], ['4.7 k\u03a9', 4700, '\u03a9'], ['4.7k\u2126', 4700, '\u03a9'], ['4.7kohm', 4700, '\u03a9'],
    ['10 pF', 10e-12, 'F'], ['10 uH', 10e-6, 'H'], ['1 GHz', 1e9, 'Hz'], ['1 kHz', 1e3, 'Hz'], ['0.3ns', 0.3e-9, 's'],
    ['2 mS', 2e-3, 'S'], ['5%', 0.05, '%'], ['0.5 %', 0.005, '%'],
  ])('%s = %d %s', (text, expected, unit) => {
    const q = parseQuantity(text);
    expect(q.ok).toBe(true);
    if (q.ok) {
      expectNearlyEqual(q.value, expected, 5e-13, 0);
      expect(q.unit).toBe(unit);
    }
  });

  it('reads the §1 examples', () => {
    expect(value('4.7k')).toBeCloseTo(4700, 9);
    expectNearlyEqual(value('2.2u'), 2.2e-6, 5e-13, 0);
    expectNearlyEqual(value('2.2\u00b5'), 2.2e-6, 5e-13, 0);
    expectNearlyEqual(value('1e-16'), 1e-16, 5e-13, 0);
    expect(value('-10 V')).toBe(-10);
    expect(value('+3')).toBe(3);
    expect(value('.5')).toBe(0.5);
    expect(value('1.5E3')).toBe(1500);
  });

  it('keeps m (milli) and M (mega) apart', () => {
    expect(value('1m')).toBeCloseTo(1e-3, 15);
    expect(value('1M')).toBe(1e6);
  });

  it('refuses meg with the hint "write M for mega"', () => {
    for (const text of ['1meg', '1 Meg', '4.7MEG']) {
      const q = parseQuantity(text);
      expect(q.ok).toBe(false);
      if (!q.ok) {
        expect(q.code).toBe('meg-prefix');
        expect(q.hint).toBe('write M for mega');
      }
    }
  });

  it('reports a unit that does not fit the slot, naming the slot and the expected unit', () => {
    const q = parseQuantity('10 pF', '\u03a9', 'the resistance of `r1`');
    expect(q.ok).toBe(false);
    if (!q.ok) {
      expect(q.code).toBe('unit-mismatch');
      expect(q.message).toBe('`F` does not fit the resistance of `r1`: expected \u03a9.');
      expect(q.offset).toBe(4);
    }
  });

  it('accepts a matching unit, no unit, and % in a plain-number slot', () => {
    expect(value('10 V', 'V')).toBe(10);
    expect(value('10', 'V')).toBe(10);
    expect(value('5%', '')).toBeCloseTo(0.05, 15);
    expect(parseQuantity('3 V', '').ok).toBe(false);
  });

  it('rejects unknown suffixes with a helpful hint', () => {
    const um = parseQuantity('1um');
    expect(um.ok).toBe(false);
    if (!um.ok) expect(um.hint).toContain('lengths take no unit');
    const kilo = parseQuantity('1K');
    expect(kilo.ok).toBe(false);
    if (!kilo.ok) expect(kilo.hint).toBe('prefixes are case-sensitive: write k for kilo');
    const hz = parseQuantity('10 hz');
    expect(hz.ok).toBe(false);
    if (!hz.ok) expect(hz.hint).toBe('units are case-sensitive: write Hz');
    expect(parseQuantity('abc').ok).toBe(false);
    expect(parseQuantity('').ok).toBe(false);
    expect(parseQuantity('1e999').ok).toBe(false);
  });
});
