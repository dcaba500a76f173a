/**
 * Summary statistics of a sample: mean, sample standard deviation (n − 1), extremes and
 * percentiles by linear interpolation between order statistics (the "type 7" definition of
 * Hyndman & Fan, 1996 — the default of R's quantile and NumPy's percentile).
 */

export interface SampleStats {
  mean: number;
  sd: number;
  min: number;
  p5: number;
  p50: number;
  p95: number;
  max: number;
}

/** The statistics of `values` (finite numbers); all zero for an empty sample. */
export function sampleStats(values: readonly number[]): SampleStats {
  const n = values.length;
  if (n === 0) return { mean: 0, sd: 0, min: 0, p5: 0, p50: 0, p95: 0, max: 0 };
  const sorted = [...values].sort((a, b) => a - b);
  const mean = values.reduce((s, v) => s + v, 0) / n;
  const sd = n > 1 ? Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1)) : 0;
  return { mean, sd, min: sorted[0], p5: percentile(sorted, 5), p50: percentile(sorted, 50), p95: percentile(sorted, 95), max: sorted[n - 1] };
}

/** The p-th percentile of an ascending sample (type 7). */
export function percentile(sorted: readonly number[], p: number): number {
  const h = ((sorted.length - 1) * p) / 100;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
