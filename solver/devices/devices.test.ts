/**
 * Device models: exact Jacobians (checked against central finite differences — the definition
 * of the derivative, common practice), limiting, temperature, and the textbook limits.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bjtModel, diodeModel, mosModel } from '../analysis/test-circuits';
import type { Bjt, Diode, Mosfet } from '../circuit/types';
import { bjtParams, bjtSmallSignal, evalBjt, type BjtEval } from './bjt';
import { diodeParams, evalDiode } from './diode';
import { criticalVoltage, limitJunctionStep } from './junction';
import { evalMos, mosParams, newMosEval } from './mos';
import { saturationCurrentAt, thermalVoltage } from './temperature';
import { expectNearlyEqual } from '../testing/nearly-equal';

const loc = { line: 1, col: 1 };
const newBjtEval = (): BjtEval => ({ ic: 0, ib: 0, dIcDvbe: 0, dIcDvbc: 0, dIbDvbe: 0, dIbDvbc: 0 });

describe('temperature', () => {
  it('has VT = kT/q = 25.865 mV at 27 °C with the exact SI 2019 constants (BIPM SI Brochure, 9th ed.)', () => {
    expect(thermalVoltage(27)).toBe((1.380649e-23 * 300.15) / 1.602176634e-19);
    expect(thermalVoltage(27)).toBeCloseTo(0.0258648, 6);
  });

  it('leaves IS unchanged at the nominal 27 °C and follows (T/T0)^pt·exp(q·eg/k·(1/T0 − 1/T))', () => {
    expect(saturationCurrentAt(1e-16, 1.12, 3, 27)).toBe(1e-16);
    const t = 398.15;
    const expected = 1e-16 * Math.pow(t / 300.15, 3) * Math.exp(((1.602176634e-19 * 1.12) / 1.380649e-23) * (1 / 300.15 - 1 / t));
    expectNearlyEqual(saturationCurrentAt(1e-16, 1.12, 3, 125), expected, 1e-14, 0);
  });

  it('gives dVBE/dT = (VBE − eg − pt·VT)/T at constant current (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., ch. 12, bandgap references, from memory)', () => {
    const vbe = (tempC: number, is: number) => thermalVoltage(tempC) * Math.log(1e-3 / saturationCurrentAt(is, 1.12, 3, tempC));
    for (const is of [1e-16, 1e-14]) {
      const h = 1e-3;
      const slope = (vbe(27 + h, is) - vbe(27 - h, is)) / (2 * h);
      const expected = (vbe(27, is) - 1.12 - 3 * thermalVoltage(27)) / 300.15;
      expectNearlyEqual(slope, expected, 1e-6, 0);
    }
    // A VBE near 0.65 V falls by roughly 2 mV/°C, as practitioners expect (common practice).
    const typical = (vbe(28, 1e-14) - vbe(26, 1e-14)) / 2;
    expect(typical).toBeLessThan(-1.6e-3);
    expect(typical).toBeGreaterThan(-2.2e-3);
  });
});

describe('bipolar transport model', () => {
  const part = (kind: 'npn' | 'pnp', va: number): Bjt => ({ kind, name: 'q', loc, c: 'c', b: 'b', e: 'e', model: bjtModel({ va, beta: 80, betaR: 2, n: 1.02 }), area: 1.5 });

  it('has an exact Jacobian in every region (central differences)', () => {
    fc.assert(
      fc.property(fc.double({ min: -2, max: 0.85, noNaN: true }), fc.double({ min: -5, max: 0.8, noNaN: true }), fc.boolean(), (vbe, vbc, early) => {
        const p = bjtParams(part('npn', early ? 40 : Infinity), 27);
        const ev = evalBjt(p, vbe, vbc, newBjtEval());
        const h = 1e-6;
        const at = (a: number, b: number) => evalBjt(p, a, b, newBjtEval());
        const fd = (f: (e: BjtEval) => number, dBe: number, dBc: number) =>
          (f(at(vbe + dBe * h, vbc + dBc * h)) - f(at(vbe - dBe * h, vbc - dBc * h))) / (2 * h);
        const floor = 1e-14;
        expectNearlyEqual(ev.dIcDvbe, fd((e) => e.ic, 1, 0), 1e-5, floor);
        expectNearlyEqual(ev.dIcDvbc, fd((e) => e.ic, 0, 1), 1e-5, floor);
        expectNearlyEqual(ev.dIbDvbe, fd((e) => e.ib, 1, 0), 1e-5, floor);
        expectNearlyEqual(ev.dIbDvbc, fd((e) => e.ib, 0, 1), 1e-5, floor);
      }),
      { numRuns: 300, seed: 11 },
    );
  });

  it('reduces to IC = IS·e^(VBE/nVT), gm = IC/(nVT), rπ = β/gm, IB = IC/β in forward activity (Sedra & Smith, 7th ed., §6.2, from memory)', () => {
    const p = bjtParams(part('npn', Infinity), 27);
    const nvt = 1.02 * thermalVoltage(27);
    const ev = evalBjt(p, 0.7, -3, newBjtEval());
    const is = 1.5e-16;
    expectNearlyEqual(ev.ic, is * Math.exp(0.7 / nvt), 1e-9, 0); // up to IS/βR
    // IB = IC/β up to the IS-sized leakage terms (IS/βR ≈ 1e-16 A against 6e-7 A).
    expectNearlyEqual(ev.ib, ev.ic / 80, 1e-9, 0);
    const ss = bjtSmallSignal(ev);
    expectNearlyEqual(ss.gm, ev.ic / nvt, 1e-9, 0);
    expectNearlyEqual(1 / ss.gpi, 80 / ss.gm, 1e-12, 0);
  });

  it('mirrors a pnp exactly: same Jacobian, negated currents', () => {
    const n = bjtParams(part('npn', 30), 27);
    const p = bjtParams(part('pnp', 30), 27);
    expect(p.polarity).toBe(-1);
    const a = evalBjt(n, 0.68, -2, newBjtEval());
    const b = evalBjt(p, 0.68, -2, newBjtEval());
    expect(b).toEqual(a); // the model is evaluated on mirrored voltages; the stamp flips the signs
  });

  it('scales IS and the junction capacitances with area', () => {
    const q: Bjt = { kind: 'npn', name: 'q', loc, c: 'c', b: 'b', e: 'e', model: bjtModel({ cje: 1e-12, cjc: 2e-13 }), area: 4 };
    const p = bjtParams(q, 27);
    expect(p.is).toBe(4e-16);
    expect(p.cje).toBe(4e-12);
    expect(p.cjc).toBe(8e-13);
  });

  it('stays finite far outside any sensible bias', () => {
    const p = bjtParams(part('npn', 20), 27);
    for (const v of [5, 50, 1e3, -1e3]) {
      const ev = evalBjt(p, v, v / 2, newBjtEval());
      expect(Object.values(ev).every(Number.isFinite)).toBe(true);
    }
  });
});

describe('diode', () => {
  const d: Diode = { kind: 'diode', name: 'd', loc, a: 'a', k: 'k', model: diodeModel({ n: 1.8 }), area: 2 };
  it('follows Shockley ID = IS·(e^(VD/nVT) − 1) with an exact gd (Sedra & Smith, 7th ed., §4.2, from memory)', () => {
    const p = diodeParams(d, 27);
    const nvt = 1.8 * thermalVoltage(27);
    for (const vd of [-1, 0, 0.3, 0.6, 0.9]) {
      const ev = evalDiode(p, vd, { id: 0, gd: 0 });
      expectNearlyEqual(ev.id, 2e-14 * Math.expm1(vd / nvt), 1e-12, 0);
      const h = 1e-7;
      const fd = (evalDiode(p, vd + h, { id: 0, gd: 0 }).id - evalDiode(p, vd - h, { id: 0, gd: 0 }).id) / (2 * h);
      expectNearlyEqual(ev.gd, fd, 1e-6, 1e-20);
    }
  });
});

describe('junction limiting', () => {
  it('leaves small steps alone and turns large forward steps logarithmic (Nagel, 1975)', () => {
    const nvt = thermalVoltage(27);
    const vcrit = criticalVoltage(nvt, 1e-16);
    expect(limitJunctionStep(0.7, 0.69, nvt, vcrit)).toBe(0.7);
    expect(limitJunctionStep(-5, 0.7, nvt, vcrit)).toBe(-5);
    const limited = limitJunctionStep(10, 0.7, nvt, vcrit);
    expect(limited).toBeGreaterThan(0.7);
    expect(limited).toBeLessThan(0.7 + 10 * nvt);
    expect(limited).toBeCloseTo(0.7 + nvt * Math.log(1 + (10 - 0.7) / nvt), 12);
  });
});

describe('MOS square law', () => {
  const part = (kind: 'nmos' | 'pmos', gamma = 0.4, lambda = 0.08): Mosfet => ({
    kind, name: 'm', loc, d: 'd', g: 'g', s: 's', b: 'b', model: mosModel({ gamma, phi: 0.7, lambda, cgs: 1e-15, cgd: 2e-16 }), w: 5e-6, l: 0.5e-6, m: 3,
  });

  it('has an exact terminal Jacobian in every region, either polarity and both orientations (central differences)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('nmos' as const, 'pmos' as const),
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 4, maxLength: 4 }),
        (kind, [vg, vd, vs, vb]) => {
          const p = mosParams(part(kind));
          const ev = evalMos(p, vg, vd, vs, vb, newMosEval());
          const h = 1e-7;
          const id = (dg: number, dd: number, ds: number, db: number) => evalMos(p, vg + dg, vd + dd, vs + ds, vb + db, newMosEval()).id;
          const fd = (k: number) => {
            const e = [0, 0, 0, 0];
            e[k] = h;
            const plus = id(e[0], e[1], e[2], e[3]);
            const minus = id(-e[0], -e[1], -e[2], -e[3]);
            return (plus - minus) / (2 * h);
          };
          // Skip points within a step of a region boundary, where the one-sided slopes differ.
          const c = ev.core;
          const vdsEff = Math.abs(kind === 'nmos' ? vd - vs : vs - vd);
          if (Math.abs(c.vov) < 1e-5 || Math.abs(vdsEff - c.vov) < 1e-5 || vdsEff < 1e-5) return;
          const floor = 1e-12;
          expectNearlyEqual(ev.dIdVg, fd(0), 1e-5, floor);
          expectNearlyEqual(ev.dIdVd, fd(1), 1e-5, floor);
          expectNearlyEqual(ev.dIdVs, fd(2), 1e-5, floor);
          expectNearlyEqual(ev.dIdVb, fd(3), 1e-5, floor);
        },
      ),
      { numRuns: 500, seed: 3 },
    );
  });

  it('is continuous in value and slope where triode meets saturation (VDS = Vov)', () => {
    const p = mosParams(part('nmos', 0));
    const vov = 0.4;
    const below = evalMos(p, 0.5 + vov, vov - 1e-9, 0, 0, newMosEval());
    const above = evalMos(p, 0.5 + vov, vov + 1e-9, 0, 0, newMosEval());
    expect(below.core.region).toBe('triode');
    expect(above.core.region).toBe('saturation');
    expectNearlyEqual(below.id, above.id, 1e-8, 0);
    expectNearlyEqual(below.dIdVd, above.dIdVd, 1e-6, 0);
    expectNearlyEqual(below.dIdVg, above.dIdVg, 1e-6, 0);
  });

  it('swaps drain and source for VDS < 0: ID(−VDS) = −ID with the roles exchanged (device symmetry, common practice)', () => {
    const p = mosParams(part('nmos'));
    const fwd = evalMos(p, 1.2, 0.9, 0.1, -0.5, newMosEval());
    const rev = evalMos(p, 1.2, 0.1, 0.9, -0.5, newMosEval());
    expect(rev.swapped).toBe(true);
    expectNearlyEqual(rev.id, -fwd.id, 1e-14, 0);
  });

  it('mirrors a pmos: negated voltages give negated current', () => {
    const n = mosParams(part('nmos'));
    const p = mosParams(part('pmos'));
    const a = evalMos(n, 1.3, 2, 0.2, 0, newMosEval());
    const b = evalMos(p, -1.3, -2, -0.2, 0, newMosEval());
    expectNearlyEqual(b.id, -a.id, 1e-14, 0);
    expect(b.core.region).toBe(a.core.region);
  });

  it('multiplies current and capacitances by m', () => {
    const p = mosParams(part('nmos'));
    expect(p.k).toBeCloseTo(100e-6 * 10 * 3, 15);
    expect(p.cgs).toBeCloseTo(3e-15, 28);
    expect(p.cgd).toBeCloseTo(6e-16, 25);
  });
});
