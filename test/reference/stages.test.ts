/**
 * Single stages and frequency-domain measures through whole netlists: follower level shift,
 * MOS common-source gain, zin of a resistor, an RC corner, unity crossing and phase margin.
 */
import { describe, expect, it } from 'vitest';
import { expectNearlyEqual } from '../../solver/testing/nearly-equal';
import { mos, solveOk, thermalVoltage } from './helpers';

describe('emitter follower level shift', () => {
  // Sedra & Smith, Microelectronic Circuits, 7th ed., §7.2 (VBE = VT·ln(IC/IS)): the follower
  // shifts DC down by one VBE at its bias current. The library model has va = 80 V, which
  // lowers VBE by VT·ln(1 + VCE/VA) ≈ 2.5 mV (0.3 %); α = β/(β+1) another 0.03 %: tolerance 1 %.
  it('v(in) − v(out) ≈ VT·ln(IBIAS/IS)', () => {
    const r = solveOk(`
title Level shift (library block)
use mirrors/simple_npn@1
use shifters/emitter_follower_npn@1
vcc:  vsrc(vcc, gnd) 10
vee:  vsrc(vee, gnd) -5
vin:  vsrc(in, gnd) 3
ef:   emitter_follower_npn(in=in, out=out, vcc=vcc, vee=vee) ibias=1m
measure shift = v(in) - v(out)
`);
    expectNearlyEqual(r.measures.shift, thermalVoltage(27) * Math.log(1e-3 / 1e-16), 0.01, 0);
  });
});

describe('MOS common-source stage', () => {
  // Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., §3.3.1: Av = −gm·RD with
  // λ = 0, and gm = ucox·(W/L)·Vov for the square law (§2.4); with λ > 0, Av = −gm·(RD ‖ ro).
  it('Av = −gm·RD with λ = 0, gm = ucox·(W/L)·Vov', () => {
    const r = solveOk(`
title CS stage
model mn: nmos(ucox=200u, vth=0.5, lambda=0)
vdd:  vsrc(vdd, gnd) 3
vin:  vsrc(in, gnd) 0.7 ac=1
m1:   nmos(d=out, g=in, s=gnd) mn w=10u l=1u
rd:   res(vdd, out) 10k
analyze ac from 10 Hz to 1 kHz per decade 10
measure gain = mag(at(ac(out), 100))
measure ph = phase(at(ac(out), 100))
`);
    const gm = 200e-6 * 10 * (0.7 - 0.5);
    expectNearlyEqual(r.measures.gain, gm * 10e3, 1e-6, 0);
    expect(Math.abs(Math.abs(r.measures.ph) - 180)).toBeLessThan(1e-6);
    expectNearlyEqual(mos(r, 'm1').gm, gm, 1e-6, 0);
  });

  it('Av = −gm·(RD ‖ ro) with λ = 0.05', () => {
    const r = solveOk(`
model mn: nmos(ucox=200u, vth=0.5, lambda=0.05)
vdd:  vsrc(vdd, gnd) 3
vin:  vsrc(in, gnd) 0.7 ac=1
m1:   nmos(d=out, g=in, s=gnd) mn w=10u l=1u
rd:   res(vdd, out) 10k
analyze ac from 10 Hz to 1 kHz per decade 10
measure gain = mag(at(ac(out), 100))
`);
    const m1 = mos(r, 'm1');
    const ro = 1 / m1.gds;
    expectNearlyEqual(r.measures.gain, m1.gm * ((10e3 * ro) / (10e3 + ro)), 1e-6, 0);
    // Square law with CLM: gm = ucox·(W/L)·Vov·(1 + λ·VDS) (Razavi §2.4).
    expectNearlyEqual(m1.gm, 200e-6 * 10 * 0.2 * (1 + 0.05 * m1.vds), 1e-6, 0);
  });
});

describe('impedances and curve measures', () => {
  // Ohm's law: the source driving a lone resistor sees that resistance, with a positive sign.
  it('zin of a resistor', () => {
    const r = solveOk(`
va: vsrc(in, gnd) 1
r1: res(in, gnd) 4.7k
measure zi = zin(va)
check zi = 4.7k ± 0.01%
`);
    expectNearlyEqual(r.measures.zi, 4.7e3, 1e-6, 0);
    expect(r.checks[0].pass).toBe(true);
  });

  // Single-pole RC low-pass: f−3dB = 1/(2π·R·C) (Sedra & Smith, 7th ed., §1.6). Interpolation
  // between points 1/40 decade apart leaves a small fraction of a percent: tolerance 0.5 %.
  it('RC corner through corner()', () => {
    const r = solveOk(`
title RC low-pass
vin: vsrc(in, gnd) 0 ac=1
r1:  res(in, out) 1k
c1:  cap(out, gnd) 100n
analyze ac from 10 Hz to 1 MHz per decade 40
measure f3 = corner(ac(out))
`);
    expectNearlyEqual(r.measures.f3, 1 / (2 * Math.PI * 1e3 * 100e-9), 0.005, 0);
    expect(r.ac!.curves['ac(out)'].db[0]).toBeCloseTo(0, 3);
  });

  // Two-pole amplifier A0/((1 + s/p1)(1 + s/p2)) built from ideal controlled sources and RC
  // sections: fu solves |A(jfu)| = 1 and the phase margin is 180° − atan(fu/p1) − atan(fu/p2)
  // (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., ch. 10, from memory). Tolerance 1 % for the sweep interpolation.
  it('unity and margin on a two-pole response', () => {
    const r = solveOk(`
title Two-pole response
param a0 = 1e4
vin: vsrc(in, gnd) 0 ac=1
e1:  vcvs(x1, gnd, in, gnd) a0
r1:  res(x1, y1) 1k
c1:  cap(y1, gnd) 159.1549n        # p1 = 1 kHz
e2:  vcvs(x2, gnd, y1, gnd) 1
r2:  res(x2, out) 1k
c2:  cap(out, gnd) 79.57747p       # p2 = 2 MHz
analyze ac from 1 Hz to 10 GHz per decade 40
measure fu = unity(ac(out))
measure pm = margin(ac(out))
measure a0db = db(at(ac(out), 10))
`);
    const p1 = 1 / (2 * Math.PI * 1e3 * 159.1549e-9);
    const p2 = 1 / (2 * Math.PI * 1e3 * 79.57747e-12);
    const mag = (f: number) => 1e4 / Math.sqrt((1 + (f / p1) ** 2) * (1 + (f / p2) ** 2));
    let lo = p1;
    let hi = 1e10;
    for (let k = 0; k < 200; k++) {
      const mid = Math.sqrt(lo * hi);
      if (mag(mid) > 1) lo = mid;
      else hi = mid;
    }
    const pm = 180 - (Math.atan(lo / p1) + Math.atan(lo / p2)) * (180 / Math.PI);
    expectNearlyEqual(r.measures.fu, lo, 0.01, 0);
    expectNearlyEqual(r.measures.pm, pm, 0.01, 0);
    expect(r.measures.a0db).toBeCloseTo(80, 2);
  });
});
