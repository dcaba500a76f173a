import { describe, expect, it } from 'vitest';
import { expectNearlyEqual, nearlyEqual } from './nearly-equal';

// The definition checked here is |a − e| ≤ max(rel·|e|, abs): common practice (Python's
// math.isclose takes the larger tolerance; NumPy's isclose measures against the reference value).
describe('nearlyEqual', () => {
  it('takes the relative tolerance against the expected value', () => {
    expect(nearlyEqual(1.0000009, 1, 1e-6, 0)).toBe(true);
    expect(nearlyEqual(1.0000011, 1, 1e-6, 0)).toBe(false);
    expect(nearlyEqual(-2e6 - 1.9, -2e6, 1e-6, 0)).toBe(true);
    expect(nearlyEqual(-2e6 - 2.1, -2e6, 1e-6, 0)).toBe(false);
    // Against the expected value, not the larger of the two: 2 is within 50 % of 4; 4 is 100 % off 2.
    expect(nearlyEqual(2, 4, 0.5, 0)).toBe(true);
    expect(nearlyEqual(4, 2, 0.5, 0)).toBe(false);
  });

  it('tests a zero expected value through the absolute tolerance alone', () => {
    expect(nearlyEqual(0, 0, 1e-9, 0)).toBe(true);
    expect(nearlyEqual(1e-13, 0, 1e-9, 0)).toBe(false);
    expect(nearlyEqual(1e-13, 0, 1e-9, 1e-12)).toBe(true);
    expect(nearlyEqual(-1e-11, 0, 1e-9, 1e-12)).toBe(false);
  });

  it('uses the larger of the two tolerances, not their sum', () => {
    // rel·|e| = 1e-3 and abs = 1e-3: the sum would allow 2e-3.
    expect(nearlyEqual(1.0015, 1, 1e-3, 1e-3)).toBe(false);
    expect(nearlyEqual(1.0009, 1, 1e-3, 1e-3)).toBe(true);
    // The absolute floor wins for a tiny expected value.
    expect(nearlyEqual(3e-15, 1e-15, 1e-6, 1e-14)).toBe(true);
  });

  it('never calls NaN close; equal infinities are', () => {
    expect(nearlyEqual(NaN, NaN, 1, 1)).toBe(false);
    expect(nearlyEqual(NaN, 0, 1, 1)).toBe(false);
    expect(nearlyEqual(0, NaN, 1, 1)).toBe(false);
    expect(nearlyEqual(Infinity, Infinity, 0, 0)).toBe(true);
    expect(nearlyEqual(Infinity, -Infinity, 1, 1)).toBe(false);
    expect(nearlyEqual(1e308, Infinity, 1e-3, 0)).toBe(false);
  });

  it('expectNearlyEqual fails with both values in the message', () => {
    expect(() => expectNearlyEqual(1.1, 1, 1e-3, 0, 'gain')).toThrow(/gain: actual 1.1, expected 1, off by/);
    expect(() => expectNearlyEqual(1.0001, 1, 1e-3, 0)).not.toThrow();
  });
});
