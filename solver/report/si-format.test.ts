import { describe, expect, it } from 'vitest';
import { formatFigure, formatPlain, formatSi } from './si-format';

// SI prefixes: BIPM, The International System of Units (SI Brochure), 9th ed., 2019, Table 7.
describe('SI formatting', () => {
  it('chooses the prefix so the mantissa lies in 1…999', () => {
    expect(formatSi(0.002, 'A')).toBe('2.000 mA');
    expect(formatSi(40e3, 'Ω')).toBe('40.00 kΩ');
    expect(formatSi(5e-13, 'F')).toBe('500.0 fF');
    expect(formatSi(2e-5, 'A')).toBe('20.00 µA');
    expect(formatSi(-0.0040, 'A')).toBe('-4.000 mA');
    expect(formatSi(7.6, 'V')).toBe('7.600 V');
    expect(formatSi(1.2e7, 'Hz')).toBe('12.00 MHz');
    expect(formatSi(0, 'V')).toBe('0 V');
  });

  it('rounds across a prefix boundary', () => {
    expect(formatSi(0.99996, 'V')).toBe('1.000 V');
    expect(formatSi(999.96e3, 'Hz')).toBe('1.000 MHz');
  });

  it('writes huge resistances as ∞ and extreme values in exponent form', () => {
    expect(formatSi(1e30, 'Ω')).toBe('∞ Ω');
    expect(formatSi(1e-20, 'A')).toBe('1.000e-20 A');
    expect(formatSi(3e16, 'Hz')).toBe('3.000e+16 Hz');
  });

  it('figures: plain in the everyday range, prefixed outside it', () => {
    expect(formatFigure(0.3)).toBe('0.3');
    expect(formatFigure(50.61)).toBe('50.61');
    expect(formatFigure(1.2e7)).toBe('12.00 M');
    expect(formatFigure(0.002)).toBe('2.000 m');
  });

  it('plain numbers', () => {
    expect(formatPlain(63.79412)).toBe('63.79');
    expect(formatPlain(1e-7)).toBe('1.000e-7');
  });
});
