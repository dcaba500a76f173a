/**
 * Frequency grids and phase handling for AC sweeps.
 */

/** Most points a sweep may have: a bad request gets a bounded grid, not a hang. */
export const MAX_SWEEP_POINTS = 100000;

/**
 * Logarithmic grid from `fromHz` to `toHz` with `perDecade` points per decade: fromHz·10^(k/N),
 * both ends included, values within 1e-12 of a power of ten snapped onto it exactly (so a sweep
 * from 10 Hz has exactly 100 Hz, 1 kHz …). Returns [] for a meaningless request.
 */
export function logSweep(fromHz: number, toHz: number, perDecade: number): number[] {
  if (!(fromHz > 0) || !(toHz >= fromHz) || !Number.isFinite(toHz) || !(perDecade >= 1) || !Number.isFinite(perDecade)) return [];
  const n = Math.round(perDecade);
  const decades = Math.log10(toHz / fromHz);
  const count = Math.min(Math.floor(decades * n + 1e-9), MAX_SWEEP_POINTS - 2);
  const out: number[] = [];
  for (let k = 0; k <= count; k++) out.push(snapDecade(fromHz * Math.pow(10, k / n)));
  const last = out[out.length - 1];
  if (toHz > last * (1 + 1e-9)) out.push(toHz);
  else out[out.length - 1] = toHz;
  if (out.length > 1 && out[0] !== fromHz) out[0] = fromHz;
  return out;
}

function snapDecade(f: number): number {
  const e = Math.round(Math.log10(f));
  const p = Math.pow(10, e);
  return Math.abs(f - p) <= 1e-12 * p ? Number(`1e${e}`) : f;
}

/**
 * Unwraps a phase sequence in degrees: adds multiples of 360° so that consecutive points never
 * jump by more than 180°. Non-finite entries pass through unchanged and do not move the offset.
 */
export function unwrapPhaseDeg(phases: readonly number[]): number[] {
  const out: number[] = [];
  let offset = 0;
  let prev = NaN;
  for (const p of phases) {
    if (!Number.isFinite(p)) {
      out.push(p);
      continue;
    }
    if (Number.isFinite(prev)) {
      let q = p + offset;
      while (q - prev > 180) {
        offset -= 360;
        q -= 360;
      }
      while (q - prev < -180) {
        offset += 360;
        q += 360;
      }
    }
    const value = p + offset;
    out.push(value);
    prev = value;
  }
  return out;
}
