/**
 * What the noise tests share: the SI constants written out (so a check never shares the solver's
 * own table), a solve that must succeed, and the power sum of the contributors.
 *
 * k = 1.380649e-23 J/K and q = 1.602176634e-19 C, exact in the SI since 2019 (CODATA 2018).
 */
import { expect } from 'vitest';
import type { SolveResult } from '../circuit/result';
import { solveNetlist } from '../run/solve-netlist';
import { expectNearlyEqual } from './nearly-equal';

export const K = 1.380649e-23;
export const Q = 1.602176634e-19;
export const kelvin = (c: number) => c + 273.15;

/** Solves `text`, failing the test on any error. */
export function solved(text: string): SolveResult {
  const r = solveNetlist(text);
  expect(r.errors, JSON.stringify(r.errors)).toEqual([]);
  return r;
}

/** Σ contributors² against out_density² at every frequency. */
export function expectPowersAddUp(r: SolveResult, rel = 1e-9): void {
  const n = r.noise!;
  n.freq_hz.forEach((f, k) => {
    const sum = Object.values(n.contributors).reduce((s, c) => s + c[k] ** 2, 0);
    expectNearlyEqual(sum, n.out_density[k] ** 2, rel, 1e-300, `Σ contributors² at ${f} Hz`);
  });
}
