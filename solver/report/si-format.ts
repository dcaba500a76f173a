/**
 * Numbers with SI prefixes for people: `2.000 mA`, `40.00 kΩ`, `500.0 fF`.
 * Four significant figures: enough to compare with a hand calculation, few enough to read.
 */

const PREFIXES: Array<[number, string]> = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

/** At or beyond this an impedance reads as "∞": the engine reports ro = 1e30 Ω for va = ∞. */
export const INFINITE_OHMS = 1e29;

/**
 * `value` with an SI prefix and `unit`, e.g. formatSi(0.002, 'A') → "2.000 mA".
 * Values outside f…T are written in exponent form; non-finite values say so rather than lie.
 */
export function formatSi(value: number, unit = '', digits = 4): string {
  const sep = unit ? ' ' : '';
  if (!Number.isFinite(value)) return `${value}${sep}${unit}`;
  if (value === 0) return `0${sep}${unit}`;
  if (unit === 'Ω' && value >= INFINITE_OHMS) return `∞ ${unit}`;
  const a = Math.abs(value);
  for (const [scale, prefix] of PREFIXES) {
    // Round first so 999.96 m becomes 1.000 and not 1000 m.
    const scaled = Number((value / scale).toPrecision(digits));
    if (Math.abs(scaled) >= 1 || scale === 1e-15) {
      if (Math.abs(scaled) >= 1000 && scale !== 1e12) continue;
      if (a < 1e-15 * 0.001 || a >= 1e15) break;
      return `${scaled.toPrecision(digits)} ${prefix}${unit}`.replace(/ $/, '');
    }
  }
  return `${value.toExponential(digits - 1)}${sep}${unit}`;
}

/** A plain number to `digits` significant figures without exponent for everyday magnitudes. */
export function formatPlain(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e6) return Number(value.toPrecision(digits)).toString();
  return value.toExponential(digits - 1);
}

/** Decibels to two decimals: "39.35 dB". */
export function formatDb(db: number): string {
  return `${db.toFixed(2)} dB`;
}

/** Degrees to one decimal: "180.0°". */
export function formatDeg(deg: number): string {
  return `${deg.toFixed(1)}°`;
}

/**
 * A unitless figure (measure, check value): plain digits in the everyday range, SI prefixes
 * for the very large and very small (a corner at 12.00 M reads better than 1.200e+7).
 */
export function formatFigure(value: number, digits = 4): string {
  const a = Math.abs(value);
  if (value === 0 || (a >= 0.01 && a < 1e4)) return formatPlain(value, digits);
  return formatSi(value, '', digits);
}
