import { formatDb, formatDeg, formatPlain, formatQuantity, formatSi, formatSigned, formatTick, NO_VALUE } from './si-format';

// SI prefixes and their symbols: BIPM, The International System of Units (SI Brochure), 9th ed.,
// 2019, Table 7; engineering notation (exponents in multiples of three) is common practice.
describe('formatSi', () => {
  it('writes three significant digits with the prefix that keeps the mantissa in 1…999', () => {
    expect(formatSi(0.002, 'A')).toBe('2.00 mA');
    expect(formatSi(1293, 'Ω')).toBe('1.29 kΩ');
    expect(formatSi(0.0773, 'S')).toBe('77.3 mS');
    expect(formatSi(1e-12, 'F')).toBe('1.00 pF');
    expect(formatSi(5e-13, 'F')).toBe('500 fF');
    expect(formatSi(2e-5, 'A')).toBe('20.0 µA');
    expect(formatSi(7.6, 'V')).toBe('7.60 V');
    expect(formatSi(1.2e7, 'Hz')).toBe('12.0 MHz');
    expect(formatSi(3.3e9, 'Hz')).toBe('3.30 GHz');
    expect(formatSi(4.7e12, 'Ω')).toBe('4.70 TΩ');
    expect(formatSi(3.3e-9, 's')).toBe('3.30 ns');
  });

  it('keeps the sign of negative values', () => {
    expect(formatSi(-0.004, 'A')).toBe('-4.00 mA');
    expect(formatSi(-0.772, 'V')).toBe('-772 mV');
  });

  it('rounds before choosing the prefix, so nothing reads 1000 of a prefix', () => {
    expect(formatSi(999.6, 'Hz')).toBe('1.00 kHz');
    expect(formatSi(0.99996, 'V')).toBe('1.00 V');
    expect(formatSi(999.4e-6, 'A')).toBe('999 µA');
    expect(formatSi(1e-3, 'A')).toBe('1.00 mA');
    expect(formatSi(1e-6, 'A')).toBe('1.00 µA');
  });

  it('writes a number without a unit plainly, never with a prefix', () => {
    expect(formatSi(179.754)).toBe('180');
    expect(formatSi(0.530133)).toBe('0.530');
    expect(formatSi(339.07)).toBe('339');
    expect(formatSi(6.46e10)).toBe('6.46 × 10¹⁰');
    expect(formatSi(0, 'V')).toBe('0 V');
    expect(formatSi(0)).toBe('0');
  });

  it('shows the engine\'s ro for an infinite Early voltage (1e30 Ω) as ∞', () => {
    expect(formatSi(1e30, 'Ω')).toBe('∞');
    expect(formatSi(87332, 'Ω')).toBe('87.3 kΩ');
  });

  it('falls back to a power of ten outside f…T and never prints NaN', () => {
    expect(formatSi(1.234e-18, 'A')).toBe('1.23 × 10⁻¹⁸ A');
    expect(formatSi(3e16, 'Hz')).toBe('3.00 × 10¹⁶ Hz');
    expect(formatSi(Number.NaN, 'V')).toBe(NO_VALUE);
    expect(formatSi(Number.POSITIVE_INFINITY, 'V')).toBe(NO_VALUE);
    expect(formatSi(undefined, 'V')).toBe(NO_VALUE);
  });
});

// Dimensionless figures: three significant digits, plain from 10⁻³ to 10⁵ and a power of ten
// beyond, in the "× 10ⁿ" spelling of data sheets and textbooks (common practice).
describe('formatPlain', () => {
  it('writes gains and ratios between 10⁻³ and 10⁵ as plain figures with three significant digits', () => {
    expect(formatPlain(0.530133)).toBe('0.530');
    expect(formatPlain(-0.530133)).toBe('-0.530');
    expect(formatPlain(179.754)).toBe('180');
    expect(formatPlain(1)).toBe('1.00');
    expect(formatPlain(0.00123456)).toBe('0.00123');
    expect(formatPlain(1e-3)).toBe('0.00100');
    expect(formatPlain(12345)).toBe('12300');
    expect(formatPlain(99940)).toBe('99900');
  });

  it('writes a power of ten beyond, with a superscript exponent', () => {
    expect(formatPlain(6.46e10)).toBe('6.46 × 10¹⁰');
    expect(formatPlain(64.6e9)).toBe('6.46 × 10¹⁰');
    expect(formatPlain(1e15)).toBe('1.00 × 10¹⁵');
    expect(formatPlain(-2.5e-6)).toBe('-2.50 × 10⁻⁶');
    expect(formatPlain(9.996e-4)).toBe('0.00100');
    expect(formatPlain(99996)).toBe('1.00 × 10⁵');
    expect(formatPlain(1e5)).toBe('1.00 × 10⁵');
  });

  it('writes zero as 0 and has no figure for what is not a finite number', () => {
    expect(formatPlain(0)).toBe('0');
    expect(formatPlain(Number.NaN)).toBe(NO_VALUE);
    expect(formatPlain(undefined)).toBe(NO_VALUE);
  });

  it('is what formatQuantity and formatSigned use for a unitless value', () => {
    expect(formatQuantity(0.53, '')).toBe('0.530');
    expect(formatSigned(6.46e10)).toBe('+6.46 × 10¹⁰');
    expect(formatSigned(-0.53)).toBe('-0.530');
  });
});

describe('decibels, degrees and signed margins', () => {
  it('keeps dB and degrees unscaled with fixed decimals', () => {
    expect(formatDb(45.0935686)).toBe('45.1 dB');
    expect(formatDb(-5.5123, 2)).toBe('-5.51 dB');
    expect(formatDeg(179.9999)).toBe('180.0°');
    expect(formatDeg(-0.00001)).toBe('0.0°');
    expect(formatQuantity(1234.5, 'dB')).toBe('1234.5 dB');
    expect(formatQuantity(0.0021, 'A')).toBe('2.10 mA');
  });

  it('writes margins with an explicit sign', () => {
    expect(formatSigned(3.31e-5, 'A')).toBe('+33.1 µA');
    expect(formatSigned(-2, 'dB')).toBe('-2.0 dB');
    expect(formatSigned(10.6058, 'dB')).toBe('+10.6 dB');
    expect(formatSigned(0, 'V')).toBe('0 V');
  });
});

describe('formatTick', () => {
  it('labels decades and 1-2-5 steps with as few digits as they need', () => {
    expect(formatTick(10, 'Hz')).toBe('10 Hz');
    expect(formatTick(1000, 'Hz')).toBe('1 kHz');
    expect(formatTick(2.5e6, 'Hz')).toBe('2.5 MHz');
    expect(formatTick(1e9, 'Hz')).toBe('1 GHz');
    expect(formatTick(100e3, 'Hz')).toBe('100 kHz');
    expect(formatTick(0.1, 'Hz')).toBe('100 mHz');
  });

  it('writes a tick with no unit (a gain, a ratio) without an SI prefix', () => {
    expect(formatTick(1200)).toBe('1200');
    expect(formatTick(1000)).toBe('1000');
    expect(formatTick(0.25)).toBe('0.25');
    expect(formatTick(-400)).toBe('-400');
    expect(formatTick(2e6)).toBe('2 × 10⁶');
    expect(formatTick(2.5e-4)).toBe('2.5 × 10⁻⁴');
    expect(formatTick(0)).toBe('0');
  });
});
