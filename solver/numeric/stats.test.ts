import { describe, expect, it } from 'vitest';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { sampleStats } from './stats';
import { streamFor } from './random';

describe('sample statistics', () => {
  it('gives percentiles by linear interpolation (type 7: NumPy percentile’s default, common practice)', () => {
    // numpy.percentile(range(1, 11), [5, 50, 95]) → 1.45, 5.5, 9.55
    const s = sampleStats([10, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expectNearlyEqual(s.p5, 1.45, 1e-12, 1e-12);
    expectNearlyEqual(s.p50, 5.5, 1e-12, 1e-12);
    expectNearlyEqual(s.p95, 9.55, 1e-12, 1e-12);
    expect([s.min, s.max]).toEqual([1, 10]);
  });

  it('uses the sample standard deviation (n − 1)', () => {
    // The textbook set 2, 4, 4, 4, 5, 5, 7, 9: mean 5, population sd 2, sample sd √(32/7).
    const s = sampleStats([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(s.mean).toBe(5);
    expectNearlyEqual(s.sd, Math.sqrt(32 / 7), 1e-12, 1e-12);
  });

  it('draws normals with mean 0 and sd 1, the same stream for the same (seed, run) only', () => {
    const draws = (seed: number, run: number) => {
      const r = streamFor(seed, run);
      return Array.from({ length: 20000 }, () => r.normal());
    };
    const a = draws(7, 3);
    expect(draws(7, 3)).toEqual(a);
    expect(draws(7, 4)[0]).not.toBe(a[0]);
    expect(draws(8, 3)[0]).not.toBe(a[0]);
    const s = sampleStats(a);
    // Sampling error of the mean: 1/√20000 ≈ 0.007; of the sd: ≈ 0.005 (4σ allowed).
    expect(Math.abs(s.mean)).toBeLessThan(0.03);
    expectNearlyEqual(s.sd, 1, 0.02, 0);
  });
});
