/**
 * The linear input range of a transfer curve: the span of the swept input around the steepest
 * point over which the slope stays at or above a stated fraction of its peak. For a bipolar
 * differential pair, whose output follows tanh(vid / 2V_T), 90 % of the peak slope is reached
 * at |vid| = 2V_T·atanh(√0.1) ≈ 0.655·V_T ≈ 17 mV at room temperature.
 */

/** The fraction of the peak slope that bounds the linear range (stated on screen and in docs/netlist.md). */
export const LINEAR_SLOPE_FRACTION = 0.9;

export interface LinearRange {
  /** Input values where the slope has fallen to `fraction` of its peak (or the sweep's ends). */
  lo: number;
  hi: number;
  /** The input at the steepest sample, and the slope there (signed: negative for an inverting output). */
  peakX: number;
  peakSlope: number;
  fraction: number;
  /** The slope had not yet fallen at this end of the sweep: the range reaches past it. */
  loOpen: boolean;
  hiOpen: boolean;
}

/**
 * Slopes dy/dx at every sample: the three-point derivative for uneven spacing inside (exact for
 * a parabola), one-sided differences at the two ends. NaN where a neighbour is not finite.
 */
export function slopes(x: readonly number[], y: readonly number[]): number[] {
  const n = Math.min(x.length, y.length);
  const out = new Array<number>(n).fill(NaN);
  if (n < 2) return out;
  for (let k = 0; k < n; k++) {
    if (k === 0) out[k] = (y[1] - y[0]) / (x[1] - x[0]);
    else if (k === n - 1) out[k] = (y[k] - y[k - 1]) / (x[k] - x[k - 1]);
    else {
      const h1 = x[k] - x[k - 1];
      const h2 = x[k + 1] - x[k];
      const back = (y[k] - y[k - 1]) / h1;
      const ahead = (y[k + 1] - y[k]) / h2;
      out[k] = (back * h2 + ahead * h1) / (h1 + h2);
    }
  }
  return out.map((s) => (Number.isFinite(s) ? s : NaN));
}

/**
 * The linear range of y(x): from the steepest sample outward, the first input on each side where
 * |slope| falls below `fraction`·|peak slope|, placed between samples by linear interpolation of
 * the slope. Undefined for fewer than three samples or a flat curve. `x` may run either way.
 */
export function linearRange(x: readonly number[], y: readonly number[], fraction = LINEAR_SLOPE_FRACTION): LinearRange | undefined {
  const n = Math.min(x.length, y.length);
  if (n < 3 || !(fraction > 0 && fraction < 1)) return undefined;
  // Work on ascending x (a sweep may step downward).
  const ascending = x[n - 1] >= x[0];
  const xs = ascending ? x.slice(0, n) : x.slice(0, n).reverse();
  const ys = ascending ? y.slice(0, n) : y.slice(0, n).reverse();
  const s = slopes(xs, ys);
  let peak = -1;
  for (let k = 0; k < n; k++) if (Number.isFinite(s[k]) && (peak < 0 || Math.abs(s[k]) > Math.abs(s[peak]))) peak = k;
  if (peak < 0) return undefined;
  const peakSlope = s[peak];
  const scale = Math.max(...ys.filter(Number.isFinite).map(Math.abs), 0);
  // A curve whose slope is rounding noise is flat: no range to speak of.
  if (!(Math.abs(peakSlope) * Math.abs(xs[n - 1] - xs[0]) > 1e-9 * Math.max(scale, 1e-30))) return undefined;
  const level = fraction * Math.abs(peakSlope);
  const edge = (dir: 1 | -1): { at: number; open: boolean } => {
    let k = peak;
    while (k + dir >= 0 && k + dir < n && Math.abs(s[k + dir]) >= level) k += dir;
    const next = k + dir;
    if (next < 0 || next >= n) return { at: xs[k], open: true };
    // |s| goes from ≥ level at k to < level at next: interpolate where it crosses the level.
    const a = Math.abs(s[k]);
    const b = Math.abs(s[next]);
    const t = Number.isFinite(b) && a !== b ? (a - level) / (a - b) : 0;
    return { at: xs[k] + t * (xs[next] - xs[k]), open: false };
  };
  const left = edge(-1);
  const right = edge(1);
  return { lo: left.at, hi: right.at, peakX: xs[peak], peakSlope, fraction, loOpen: left.open, hiOpen: right.open };
}

/** The slope at sample `index` as a fraction of the peak slope (for the cursor's readout). */
export function slopeFraction(x: readonly number[], y: readonly number[], index: number, range: LinearRange): number {
  const s = slopes(x, y)[index];
  return Number.isFinite(s) && range.peakSlope !== 0 ? s / range.peakSlope : NaN;
}
