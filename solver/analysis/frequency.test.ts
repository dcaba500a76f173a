import { describe, expect, it } from 'vitest';
import { logSweep, unwrapPhaseDeg } from './frequency';

describe('logSweep', () => {
  it('puts N points per decade on exact decade multiples, both ends included', () => {
    const f = logSweep(10, 1e9, 20);
    expect(f.length).toBe(8 * 20 + 1);
    expect(f[0]).toBe(10);
    expect(f[20]).toBe(100);
    expect(f[40]).toBe(1000);
    expect(f[160]).toBe(1e9);
    for (let k = 1; k < f.length; k++) expect(f[k] / f[k - 1]).toBeCloseTo(Math.pow(10, 1 / 20), 12);
  });

  it('includes an end that is not on the grid', () => {
    const f = logSweep(1, 50, 1);
    expect(f).toEqual([1, 10, 50]);
  });

  it('returns a single point for from = to and nothing for nonsense', () => {
    expect(logSweep(1e3, 1e3, 10)).toEqual([1e3]);
    expect(logSweep(0, 1e3, 10)).toEqual([]);
    expect(logSweep(1e3, 10, 10)).toEqual([]);
    expect(logSweep(10, 1e3, 0)).toEqual([]);
    expect(logSweep(10, Infinity, 10)).toEqual([]);
  });
});

describe('unwrapPhaseDeg', () => {
  it('removes 360° jumps so a three-pole roll-off reaches −270° (common practice)', () => {
    expect(unwrapPhaseDeg([-90, -170, 170, 100, 90])).toEqual([-90, -170, -190, -260, -270]);
    expect(unwrapPhaseDeg([170, -170])).toEqual([170, 190]);
  });

  it('passes non-finite entries through without moving the offset', () => {
    expect(unwrapPhaseDeg([-170, NaN, 170])).toEqual([-170, NaN, -190]);
  });
});
