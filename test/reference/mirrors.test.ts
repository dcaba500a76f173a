/**
 * Current mirrors and current sources through whole netlists, against the textbook design
 * equations. The mirror ratios compare the *error term* (1 − IO/IREF), not the ratio itself, so
 * that a wrong base-current bookkeeping cannot hide inside a ratio of 0.9998.
 */
import { describe, expect, it } from 'vitest';
import { expectNearlyEqual } from '../../solver/testing/nearly-equal';
import { bjt, solveOk, thermalVoltage } from './helpers';

const BETA = 100;

describe('bipolar mirrors (va = ∞, so the formulas are exact up to the exp(−1) terms)', () => {
  // Sedra & Smith, Microelectronic Circuits, 7th ed., §8.2.2 (simple bipolar mirror):
  // IO/IREF = 1/(1 + 2/β).
  it('simple mirror: IO/IREF = 1/(1 + 2/β)', () => {
    const r = solveOk(`
title Simple mirror
model qi: npn(is=1e-16, beta=${BETA})
vcc:  vsrc(vcc, gnd) 5
iref: isrc(vcc, ref) 1m
qa:   npn(c=ref, b=ref, e=gnd) qi
qb:   npn(c=out, b=ref, e=gnd) qi
vo:   vsrc(out, gnd) 2.5
measure ratio = ic(qb) / 1m
`);
    const error = 1 - r.measures.ratio;
    expectNearlyEqual(error, 1 - 1 / (1 + 2 / BETA), 1e-6, 0);
  });

  // Sedra & Smith, Microelectronic Circuits, 7th ed., §8.6.1 (mirror with base-current
  // compensation): IO/IREF = 1/(1 + 2/(β(β + 1))).
  it('base-current helper mirror: IO/IREF = 1/(1 + 2/(β(β+1)))', () => {
    const r = solveOk(`
title Helper mirror (library block)
use mirrors/helper_npn@1
vcc:  vsrc(vcc, gnd) 5
iref: isrc(vcc, ref) 1m
m1:   helper_npn(in=ref, out=out, rail=gnd, supply=vcc)
vo:   vsrc(out, gnd) 2.5
`);
    // The library model has va = 80 V: qa and qb see different VCE (VBE+VBE vs 2.5 V), which
    // changes IO by (1 + VCE/VA) factors. Compare the pure base-current error with the VA
    // factors divided out of the solver's own numbers.
    const qa = bjt(r, 'm1.qa');
    const qb = bjt(r, 'm1.qb');
    const earlyRatio = (1 + qb.vce / 80) / (1 + qa.vce / 80);
    const ratio = qb.ic / 1e-3 / earlyRatio;
    // With finite VA the base current stays IS·exp(VBE/VT)/β while the collector current gains
    // (1 + VCE/VA): each device's effective β becomes β(1 + VCE/VA), about 1 % for qa
    // (VCE = VBE) and 4 % for the helper (VCE ≈ 3.5 V), so the error term moves by ~5 %.
    expectNearlyEqual(1 - ratio, 1 - 1 / (1 + 2 / (BETA * (BETA + 1))), 0.1, 0);
  });

  it('base-current helper mirror with an ideal model: the error term exactly', () => {
    const r = solveOk(`
model qi: npn(is=1e-16, beta=${BETA})
vcc:  vsrc(vcc, gnd) 5
iref: isrc(vcc, ref) 1m
qa:   npn(c=ref, b=base, e=gnd) qi
qb:   npn(c=out, b=base, e=gnd) qi
qh:   npn(c=vcc, b=ref, e=base) qi
vo:   vsrc(out, gnd) 2.5
measure ratio = ic(qb) / 1m
`);
    expectNearlyEqual(1 - r.measures.ratio, 1 - 1 / (1 + 2 / (BETA * (BETA + 1))), 1e-4, 0);
  });

  // Sedra & Smith, Microelectronic Circuits, 7th ed., §8.6.3 (Wilson mirror):
  // IO/IREF = 1 − 2/(β² + 2β + 2).
  it('Wilson mirror: IO/IREF = 1 − 2/(β² + 2β + 2)', () => {
    const r = solveOk(`
title Wilson mirror, ideal transistors
model qi: npn(is=1e-16, beta=${BETA})
vcc:  vsrc(vcc, gnd) 5
iref: isrc(vcc, ref) 1m
qa:   npn(c=ref, b=mid, e=gnd) qi
qb:   npn(c=mid, b=mid, e=gnd) qi
qc:   npn(c=out, b=ref, e=mid) qi
vo:   vsrc(out, gnd) 3
measure ratio = ic(qc) / 1m
`);
    expectNearlyEqual(1 - r.measures.ratio, 2 / (BETA * BETA + 2 * BETA + 2), 1e-4, 0);
  });

  // Sedra & Smith, Microelectronic Circuits, 7th ed., §8.6.4 (Widlar current source):
  // IO·RE = VT·ln(IREF/IO). The design equation neglects base currents (β = 100: about 1 % in
  // each of IREF and IO, so ~2 % in the product); the exact collector-current form
  // IE2·RE = VT·ln(IC1/IC2) holds to rounding.
  it('Widlar source: IO·RE = VT·ln(IREF/IO)', () => {
    const r = solveOk(`
title Widlar source (library block)
use mirrors/widlar_npn@1
vcc:  vsrc(vcc, gnd) 10
iref: isrc(vcc, ref) 1m
w1:   widlar_npn(in=ref, out=out, rail=gnd) r_e=11.9k
vo:   vsrc(out, gnd) 5
measure io = ic(w1.qb)
`);
    const vt = thermalVoltage(27);
    const io = r.measures.io;
    const re = 11.9e3;
    expectNearlyEqual(io * re, vt * Math.log(1e-3 / io), 0.02, 0);
    const qa = bjt(r, 'w1.qa');
    const qb = bjt(r, 'w1.qb');
    // Exact form with the Early factors: IC = IS·exp(VBE/VT)·(1 + VCE/VA) in forward activity.
    const lhs = qb.ie * re;
    const rhs = vt * Math.log((qa.ic / (1 + qa.vce / 80)) / (qb.ic / (1 + qb.vce / 80)));
    expectNearlyEqual(lhs, rhs, 1e-5, 0);
    // The design point: about 10 µA from 1 mA.
    expectNearlyEqual(io, 10e-6, 0.05, 0);
  });

  // Sedra & Smith, Microelectronic Circuits, 7th ed., BJT cascode output resistance (from memory): Rout = ro2 + (1 + gm2·ro2)(ro1 ‖ rπ2), exact for the hybrid-pi circuit
  // with the solver's own gm, rπ, ro. Measured two ways: zout at a resistor-loaded output
  // (the load divided out) and zin of a voltage source holding the output.
  it('cascode output resistance ro2 + (1 + gm2·ro2)(ro1 ‖ rπ2) via zout and zin', () => {
    const r = solveOk(`
title Cascode output resistance
model qc: npn(is=1e-16, beta=${BETA}, va=50)
vcc:  vsrc(vcc, gnd) 12
vb1:  vsrc(b1, gnd) 0.75
vb2:  vsrc(b2, gnd) 2
q1:   npn(c=x, b=b1, e=gnd) qc
q2:   npn(c=out, b=b2, e=x) qc
rl:   res(vcc, out) 1k
measure zo = zout(out)
`);
    const q1 = bjt(r, 'q1');
    const q2 = bjt(r, 'q2');
    const par = (a: number, b: number) => (a * b) / (a + b);
    const rout = q2.ro + (1 + q2.gm * q2.ro) * par(q1.ro, q2.rpi);
    // zout sees rl in parallel; min_g (1e-12 S per node) adds a few ppm of Rout.
    const fromZout = 1 / (1 / r.measures.zo - 1 / 1e3);
    expectNearlyEqual(fromZout, rout, 1e-3, 0);
    // The first-order estimate Rout ≈ β·ro2 when gm·ro ≫ 1 and ro1 ≫ rπ2 (same sources), with
    // the small-signal β = gm·rπ: the Early factor raises IC but not IB, so gm·rπ = β(1 + VCE/VA),
    // some 20 % above the model's beta here. ro1 ‖ rπ2 < rπ2 costs ~5 %: tolerance 10 %.
    expectNearlyEqual(rout, q2.gm * q2.rpi * q2.ro, 0.1, 0);

    const held = solveOk(`
model qc: npn(is=1e-16, beta=${BETA}, va=50)
vb1:  vsrc(b1, gnd) 0.75
vb2:  vsrc(b2, gnd) 2
q1:   npn(c=x, b=b1, e=gnd) qc
q2:   npn(c=out, b=b2, e=x) qc
vo:   vsrc(out, gnd) 8
measure zo = zin(vo)
`);
    const h1 = bjt(held, 'q1');
    const h2 = bjt(held, 'q2');
    expectNearlyEqual(held.measures.zo, h2.ro + (1 + h2.gm * h2.ro) * par(h1.ro, h2.rpi), 1e-4, 0);
  });
});

describe('MOS mirror', () => {
  // Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., §5.1 (basic current mirror):
  // IO/IREF = (W/L)2/(W/L)1 · (1 + λ·VDS2)/(1 + λ·VDS1), exact for the square law.
  it('nmos mirror ratio with channel-length modulation', () => {
    const r = solveOk(`
title nmos mirror (library block)
use mirrors/simple_nmos@1
vdd:  vsrc(vdd, gnd) 3
iref: isrc(vdd, ref) 100u
m1:   simple_nmos(in=ref, out=out, rail=gnd) ratio=2
vo:   vsrc(out, gnd) 1.5
measure io = id(m1.mb)
`);
    const ma = r.op!.devices['m1.ma'] as { vds: number };
    expectNearlyEqual(r.measures.io, 2 * 100e-6 * (1 + 0.05 * 1.5) / (1 + 0.05 * ma.vds), 1e-6, 0);
  });
});

describe('mirror tail against resistor tail (facts of the trade)', () => {
  it('the library blocks elaborate and solve', () => {
    const r = solveOk(`
use mirrors/cascode_npn@1
vcc:  vsrc(vcc, gnd) 10
iref: isrc(vcc, ref) 1m
m1:   cascode_npn(in=ref, out=out, rail=gnd)
vo:   vsrc(out, gnd) 5
measure ro_out = zin(vo)
measure io = i(vo)
`);
    // Output current close to the reference (base-current errors ≈ 4/β) and Rout ≈ β·ro/2 or
    // more (Gray et al., 5th ed., §4.2.4, cascode mirror: about β·ro/2 with the diode stack).
    expect(Math.abs(r.measures.io) / 1e-3).toBeGreaterThan(0.94);
    const ro = 80 / 1e-3;
    expect(r.measures.ro_out).toBeGreaterThan((BETA * ro) / 4);
  });
});
