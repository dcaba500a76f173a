import { describe, expect, it } from 'vitest';
import { cdiv, cx, magnitude, phaseDeg } from '../numeric/complex';
import { curveFromPhasors, unwrapDegrees } from '../numeric/phasor-curve';
import { corner, margin, unity, valueAt, type FreqCurve } from './curve';
import { expectNearlyEqual } from '../testing/nearly-equal';

/** Log-spaced frequencies, `perDecade` points per decade, both ends included. */
function logFreqs(from: number, to: number, perDecade: number): number[] {
  const n = Math.round(Math.log10(to / from) * perDecade);
  return Array.from({ length: n + 1 }, (_, k) => from * Math.pow(10, k / perDecade));
}

/** A(jf) = a0 / Π(1 + jf/p). */
function poles(a0: number, ps: number[], f: number) {
  let z = cx(a0);
  for (const p of ps) z = cdiv(z, { re: 1, im: f / p });
  return z;
}

function sample(name: string, fs: number[], fn: (f: number) => { re: number; im: number }): FreqCurve {
  return { name, freqHz: fs, curve: curveFromPhasors(fs.map(fn)) };
}

describe('curve measures', () => {
  // Single pole: |A| is 3.01 dB down exactly at the pole frequency (any circuits text, e.g.
  // Sedra & Smith, Microelectronic Circuits, 7th ed., §1.6, single-time-constant networks).
  it('corner of a single pole lands on the pole', () => {
    const fs = logFreqs(10, 1e8, 20);
    const c = sample('a', fs, (f) => poles(100, [12_345], f));
    // Linear-in-dB interpolation between samples 1/20 decade apart: a few tenths of a percent.
    expect(corner(c)).toBeCloseTo(12_345, -2);
    expectNearlyEqual(corner(c), 12_345, 0.005, 0);
  });

  // Two-pole response: the unity crossing solves |A(jfu)| = 1 and the phase margin is
  // 180° − atan(fu/p1) − atan(fu/p2) (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed.,
  // ch. 10, stability and frequency compensation, from memory).
  it('unity and margin of a two-pole response', () => {
    const a0 = 1e4;
    const p1 = 1e3;
    const p2 = 2e6;
    // Exact fu by bisection on |A| = 1 (|A| falls monotonically).
    let lo = 1e3;
    let hi = 1e9;
    for (let k = 0; k < 200; k++) {
      const mid = Math.sqrt(lo * hi);
      if (magnitude(poles(a0, [p1, p2], mid)) > 1) lo = mid;
      else hi = mid;
    }
    const fu = lo;
    const pm = 180 - (Math.atan(fu / p1) + Math.atan(fu / p2)) * (180 / Math.PI);
    const c = sample('adm', logFreqs(1, 1e10, 40), (f) => poles(a0, [p1, p2], f));
    expectNearlyEqual(unity(c), fu, 0.01, 0);
    expectNearlyEqual(margin(c), pm, 0.01, 0);
    // An inverting version of the same loop has the same margin (phase measured from 180°).
    const inv = sample('adm', logFreqs(1, 1e10, 40), (f) => {
      const z = poles(a0, [p1, p2], f);
      return { re: -z.re, im: -z.im };
    });
    expectNearlyEqual(margin(inv), pm, 0.01, 0);
  });

  it('at() interpolates on a grid point exactly and between points smoothly', () => {
    const fs = logFreqs(10, 1e6, 10);
    const c = sample('a', fs, (f) => poles(10, [1e3], f));
    const exact = poles(10, [1e3], fs[20]);
    const got = valueAt(c, fs[20]);
    expectNearlyEqual(magnitude(got), magnitude(exact), 5e-13, 0);
    const mid = valueAt(c, 1234);
    const truth = poles(10, [1e3], 1234);
    expectNearlyEqual(magnitude(mid), magnitude(truth), 0.01, 0);
    expect(Math.abs(phaseDeg(mid) - phaseDeg(truth))).toBeLessThan(0.5);
    expect(() => valueAt(c, 1)).toThrow(/outside the ac sweep/);
  });

  it('unwraps phase across ±180°', () => {
    expect(unwrapDegrees([170, -170, -150])).toEqual([170, 190, 210]);
    expect(unwrapDegrees([-170, 170])).toEqual([-170, -190]);
  });

  it('reports curves that never cross instead of inventing a number', () => {
    const fs = logFreqs(10, 1e3, 10);
    const flat = sample('a', fs, () => cx(5));
    expect(() => corner(flat)).toThrow(/stays within 3 dB/);
    expect(() => unity(flat)).toThrow(/stays above 1/);
    const small = sample('b', fs, () => cx(0.5));
    expect(() => unity(small)).toThrow(/already below 1/);
  });
});
