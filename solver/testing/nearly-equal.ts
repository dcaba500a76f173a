/**
 * Closeness of a computed number to the value a test expects, in one place for every numeric
 * test: |actual − expected| ≤ max(rel·|expected|, abs).
 *
 * Common practice, as general numeric libraries define it: Python's `math.isclose` allows the
 * larger of a relative and an absolute tolerance (`abs(a-b) <= max(rel_tol * max(abs(a), abs(b)),
 * abs_tol)`), and NumPy's `isclose` measures the relative part against the reference value, its
 * second argument (`absolute(a - b) <= atol + rtol * absolute(b)`). Here the relative part is taken
 * against the expected value, as in NumPy, and the two tolerances are not added, as in Python.
 *
 * The absolute tolerance is what makes a zero (or tiny) expected value testable: a relative error
 * alone divides by the expected value, so it is infinite or NaN there and any check fails, or, if
 * written as `|a/e − 1|`, passes nothing and says nothing useful.
 */
import { expect } from 'vitest';

/**
 * True when `actual` lies within max(rel·|expected|, abs) of `expected`. NaN is never close to
 * anything; equal infinities are close (as in both libraries above).
 */
export function nearlyEqual(actual: number, expected: number, rel: number, abs: number): boolean {
  if (actual === expected) return true;
  // An infinity is close only to itself: ∞ − x is never within rel·∞.
  if (!Number.isFinite(actual) || !Number.isFinite(expected)) return false;
  return Math.abs(actual - expected) <= Math.max(rel * Math.abs(expected), abs);
}

/** Fails the test unless {@link nearlyEqual}, naming both values, the error and the allowance. */
export function expectNearlyEqual(actual: number, expected: number, rel: number, abs: number, what = ''): void {
  const allowed = Math.max(rel * Math.abs(expected), abs);
  const label = what ? `${what}: ` : '';
  expect(nearlyEqual(actual, expected, rel, abs), `${label}actual ${actual}, expected ${expected}, off by ${Math.abs(actual - expected)} > ${allowed} (rel ${rel}, abs ${abs})`).toBe(true);
}

/**
 * Max-norm relative difference of two vectors, max|a − b| / max|b| (no squares, so tiny entries
 * do not underflow); the plain max difference when `b` is all zeros.
 */
export function maxNormRelativeError(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < a.length; i++) {
    num = Math.max(num, Math.abs(a[i] - b[i]));
    den = Math.max(den, Math.abs(b[i]));
  }
  return den === 0 ? num : num / den;
}
