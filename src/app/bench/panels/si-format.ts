/**
 * Numbers for the result panels: engineering notation with SI prefixes (f p n µ m k M G T),
 * three significant digits and a unit, e.g. `2.00 mA`, `1.29 kΩ`, `77.3 mS`, `1.00 pF`.
 *
 * Three digits is what a designer reads off a bench at a glance; the exact numbers stay in the
 * JSON and in the CSV export. Decibels and degrees are not scaled by prefixes (a "kdB" is
 * nonsense): they keep a fixed number of decimals. Dimensionless figures (gains, ratios, CMRR)
 * take no prefix either — "530 m" of a gain or "64.6 G" of a CMRR reads as a unit that is not
 * there — but plain figures, and powers of ten beyond 10⁻³…10⁵: `0.530`, `180`, `6.46 × 10¹⁰`.
 */
import { INFINITE_OHMS } from '../../../../solver';

const PREFIXES: ReadonlyArray<readonly [exponent: number, prefix: string]> = [
  [12, 'T'], [9, 'G'], [6, 'M'], [3, 'k'], [0, ''], [-3, 'm'], [-6, 'µ'], [-9, 'n'], [-12, 'p'], [-15, 'f'],
];

/** What a value reads as when there is none to show (missing or not finite). */
export const NO_VALUE = '—';

/** Units the panels know how to write; '' is a plain number. */
export type Unit = '' | 'V' | 'A' | 'Ω' | 'S' | 'F' | 'Hz' | 's' | 'dB' | '°' | 'W';

/**
 * `value` in engineering notation with an SI prefix and `unit`:
 * formatSi(0.002, 'A') → "2.00 mA"; formatSi(1e30, 'Ω') → "∞" (the engine's ro for va = ∞).
 * Values beyond f…T fall back to a power of ten ("1.00 × 10⁻¹⁸ A"), never to a misleading
 * prefix. Without a unit the value is a plain figure (formatPlain): formatSi(0.53) → "0.530".
 */
export function formatSi(value: number | undefined | null, unit: Unit | string = '', digits = 3): string {
  if (value === undefined || value === null || !Number.isFinite(value)) return NO_VALUE;
  // A prefix on a plain number would read as a unit: dimensionless figures are written plainly.
  if (!unit) return formatPlain(value, digits);
  if (value === 0) return `0 ${unit}`;
  if (unit === 'Ω' && value >= INFINITE_OHMS) return '∞';
  // Round to the digits first, so 999.6 reads "1.00 k" and not "1000".
  const rounded = Number(value.toPrecision(digits));
  const { exponent, mantissa } = engineering(rounded, digits);
  const entry = PREFIXES.find(([e]) => e === exponent);
  if (!entry) return `${powerOfTen(rounded, digits)} ${unit}`;
  return `${mantissa.toPrecision(digits)} ${entry[1]}${unit}`;
}

/** Below this magnitude, and from PLAIN_MAX up, a dimensionless figure is a power of ten. */
export const PLAIN_MIN = 1e-3;
export const PLAIN_MAX = 1e5;

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

/**
 * A dimensionless figure as a designer writes it: `digits` significant digits, plain between
 * 10⁻³ and 10⁵ (formatPlain(0.530133) → "0.530", formatPlain(179.75) → "180"), a power of ten
 * beyond (formatPlain(6.46e10) → "6.46 × 10¹⁰", formatPlain(2.5e-6) → "2.50 × 10⁻⁶"). The
 * "× 10ⁿ" form is the one of data sheets and textbooks; "6.46e10" is a programmer's spelling.
 */
export function formatPlain(value: number | undefined | null, digits = 3): string {
  if (value === undefined || value === null || !Number.isFinite(value)) return NO_VALUE;
  if (value === 0) return '0';
  // Round first, so that 99 996 becomes 1.00 × 10⁵ and 0.00099996 reads 0.00100.
  const rounded = Number(value.toPrecision(digits));
  const magnitude = Math.abs(rounded);
  if (magnitude >= PLAIN_MIN && magnitude < PLAIN_MAX) {
    const exponent = Math.floor(Math.log10(magnitude));
    return rounded.toFixed(Math.max(0, digits - 1 - exponent));
  }
  return powerOfTen(rounded, digits);
}

/** "6.46 × 10¹⁰": `digits` significant digits and a superscript exponent. */
function powerOfTen(value: number, digits: number): string {
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  const power = String(Number(exponent)).replace(/[-0-9]/g, (c) => SUPERSCRIPT[c]);
  return `${mantissa} × 10${power}`;
}

/** Like formatSi but with an explicit sign, for margins: "+1.50 mA", "-2.00 dB". */
export function formatSigned(value: number | undefined | null, unit: Unit | string = ''): string {
  const text = formatQuantity(value, unit);
  if (text === NO_VALUE || text === '∞' || text.startsWith('-') || value === 0) return text;
  return `+${text}`;
}

/** Decibels with a fixed number of decimals: formatDb(39.353) → "39.4 dB". */
export function formatDb(db: number | undefined | null, decimals = 1): string {
  if (db === undefined || db === null || !Number.isFinite(db)) return NO_VALUE;
  return `${fixed(db, decimals)} dB`;
}

/** Degrees with a fixed number of decimals: formatDeg(-135.04) → "-135.0°". */
export function formatDeg(deg: number | undefined | null, decimals = 1): string {
  if (deg === undefined || deg === null || !Number.isFinite(deg)) return NO_VALUE;
  return `${fixed(deg, decimals)}°`;
}

/** Any quantity in its own manner: dB and ° with decimals, plain numbers plainly, everything else with SI prefixes. */
export function formatQuantity(value: number | undefined | null, unit: Unit | string = ''): string {
  if (unit === 'dB') return formatDb(value);
  if (unit === '°') return formatDeg(value);
  return formatSi(value, unit);
}

/**
 * A short axis label: as few digits as the value needs, e.g. 1000 → "1 kHz", 2.5e6 → "2.5 MHz".
 * Without a unit (a gain, a ratio) no SI prefix: 1200 → "1200", 2e6 → "2 × 10⁶".
 */
export function formatTick(value: number, unit: Unit | string = ''): string {
  if (!Number.isFinite(value)) return NO_VALUE;
  if (value === 0) return unit ? `0 ${unit}` : '0';
  const rounded = Number(value.toPrecision(6));
  if (!unit) {
    const magnitude = Math.abs(rounded);
    if (magnitude >= PLAIN_MIN && magnitude < PLAIN_MAX) return String(rounded);
    const digits = rounded.toExponential().split('e')[0].replace(/[-.]/g, '').length;
    return powerOfTen(rounded, digits);
  }
  const { exponent, mantissa } = engineering(rounded, 6);
  const entry = PREFIXES.find(([e]) => e === exponent);
  if (!entry) return `${rounded.toExponential().replace('e+', 'e')}${unit ? ' ' + unit : ''}`;
  return `${mantissa} ${entry[1]}${unit}`.trimEnd();
}

/**
 * Splits a non-zero value into mantissa·10^exponent with the exponent a multiple of 3 and
 * 1 ≤ |mantissa| < 1000 after rounding to `digits` (log10 alone can land a hair off a boundary).
 */
function engineering(value: number, digits: number): { exponent: number; mantissa: number } {
  let exponent = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  let mantissa = Number((value / Math.pow(10, exponent)).toPrecision(digits));
  if (Math.abs(mantissa) >= 1000) {
    exponent += 3;
    mantissa = Number((value / Math.pow(10, exponent)).toPrecision(digits));
  } else if (Math.abs(mantissa) < 1) {
    exponent -= 3;
    mantissa = Number((value / Math.pow(10, exponent)).toPrecision(digits));
  }
  return { exponent, mantissa };
}

/** Fixed decimals without a "-0.0". */
function fixed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}
