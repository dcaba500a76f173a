/** Timing for the benchmarks (`npm run bench`): measurements, never tests. */
import { performance } from 'node:perf_hooks';

/** Median wall time of `fn` in ms over `runs` calls, after one warm-up call. */
export function medianMs(fn: () => void, runs: number): number {
  fn();
  const samples: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    fn();
    samples.push(performance.now() - t0);
  }
  samples.sort((x, y) => x - y);
  return samples[Math.floor(samples.length / 2)];
}
