/**
 * Band figures of a noise spectrum sampled on an ascending frequency grid: the power density
 * between grid points and its integral over a band, for the readable report and the measures
 * (`noise_out`, `noise_out_rms`, …), which both read it from here.
 *
 * Between two grid points the power density is taken as a power law, S(f) = S1·(f/f1)^α with α
 * fixed by the two samples — a straight line on the log–log plot that noise densities are read
 * on. Integrating that law exactly gives, per segment,
 *
 *   ∫ S df = (S2·f2 − S1·f1)/(α + 1),   or S1·f1·ln(f2/f1) when α = −1,
 *
 * which is exact for white, 1/f, 1/f² and f² stretches alike and so needs no dense grid where the
 * density falls off as a power of f; a segment with a zero end falls back to the trapezoid rule.
 */

/** Where |(α + 1)·ln(f2/f1)| is below this, the segment integral is taken from its series. */
const SERIES_LIMIT = 1e-4;

/** ∫ from f1 to f2 of the power law through (f1, s1) and (f2, s2). */
export function segmentIntegral(f1: number, s1: number, f2: number, s2: number): number {
  if (!(f2 > f1)) return 0;
  if (!(s1 > 0) || !(s2 > 0)) return 0.5 * (Math.max(s1, 0) + Math.max(s2, 0)) * (f2 - f1);
  const lnRatio = Math.log(f2 / f1);
  // x = (α + 1)·ln(f2/f1) = ln(s2·f2 / (s1·f1)).
  const x = Math.log(s2 / s1) + lnRatio;
  if (Math.abs(x) < SERIES_LIMIT) return s1 * f1 * lnRatio * (1 + x / 2 + (x * x) / 6 + (x * x * x) / 24);
  return ((s2 * f2 - s1 * f1) * lnRatio) / x;
}

/** The power law through (f1, s1) and (f2, s2) at f (linear when an end is zero). */
export function segmentValue(f1: number, s1: number, f2: number, s2: number, f: number): number {
  if (f <= f1 || !(f2 > f1)) return s1;
  if (f >= f2) return s2;
  if (!(s1 > 0) || !(s2 > 0)) return s1 + ((s2 - s1) * (f - f1)) / (f2 - f1);
  return s1 * Math.exp((Math.log(s2 / s1) * Math.log(f / f1)) / Math.log(f2 / f1));
}

/** Index k of the segment [freq[k], freq[k+1]] holding f (clamped to the grid). */
function segmentOf(freqHz: readonly number[], f: number): number {
  let lo = 0;
  let hi = freqHz.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (freqHz[mid] <= f) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** True when f lies on the swept band (to within rounding of its ends). */
export function inBand(freqHz: readonly number[], f: number): boolean {
  if (freqHz.length === 0 || !Number.isFinite(f)) return false;
  const lo = freqHz[0];
  const hi = freqHz[freqHz.length - 1];
  return f >= lo * (1 - 1e-12) && f <= hi * (1 + 1e-12);
}

/** The power density at f (inside the band), by the power law between the neighbouring points. */
export function powerAt(freqHz: readonly number[], power: ArrayLike<number>, f: number): number {
  if (freqHz.length === 0) return 0;
  if (freqHz.length === 1) return power[0];
  const k = Math.min(segmentOf(freqHz, f), freqHz.length - 2);
  return segmentValue(freqHz[k], power[k], freqHz[k + 1], power[k + 1], f);
}

/**
 * ∫ S df from `fromHz` to `toHz` (default: the whole grid), the band clamped to the grid, each
 * segment integrated as a power law; a partial segment at either end is cut at the power law's
 * value there. In (unit)²: the square root is the rms over the band.
 */
export function bandPower(freqHz: readonly number[], power: ArrayLike<number>, fromHz = freqHz[0], toHz = freqHz[freqHz.length - 1]): number {
  const n = freqHz.length;
  if (n < 2) return 0;
  const lo = Math.max(fromHz, freqHz[0]);
  const hi = Math.min(toHz, freqHz[n - 1]);
  if (!(hi > lo)) return 0;
  let total = 0;
  for (let k = segmentOf(freqHz, lo); k < n - 1 && freqHz[k] < hi; k++) {
    const f1 = freqHz[k];
    const f2 = freqHz[k + 1];
    const a = Math.max(f1, lo);
    const b = Math.min(f2, hi);
    if (!(b > a)) continue;
    const sa = a === f1 ? power[k] : segmentValue(f1, power[k], f2, power[k + 1], a);
    const sb = b === f2 ? power[k + 1] : segmentValue(f1, power[k], f2, power[k + 1], b);
    total += segmentIntegral(a, sa, b, sb);
  }
  return total;
}

/** Densities (V/√Hz) squared into power densities (V²/Hz). */
export function squared(density: readonly number[]): number[] {
  return density.map((d) => d * d);
}
