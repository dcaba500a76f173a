/**
 * Differential pairs through whole netlists: small-signal gains from the half circuits,
 * CMRR of resistor and mirror tails, and the large-signal steering of the tail current.
 */
import { describe, expect, it } from 'vitest';
import { expectNearlyEqual } from '../../solver/testing/nearly-equal';
import { bjt, solveOk, thermalVoltage } from './helpers';

/** A resistor-tail npn pair; `model` lets a test choose ideal (va = ∞) or realistic devices. */
function pairNetlist(opts: { rc: number; rt: number; model: string; extra?: string }): string {
  return `
title Resistor-tail pair
param rc = ${opts.rc}
param rt = ${opts.rt}
model qn: ${opts.model}
vcc:  vsrc(vcc, gnd) 10 V
vee:  vsrc(vee, gnd) -10 V
va:   vsrc(ina, gnd) 0
vb:   vsrc(inb, gnd) 0
rca:  res(vcc, outa) rc
rcb:  res(vcc, outb) rc
q1:   npn(c=outa, b=ina, e=tail) qn
q2:   npn(c=outb, b=inb, e=tail) qn
rtl:  res(tail, vee) rt
${opts.extra ?? ''}
`;
}

describe('resistor-tail pair', () => {
  // Sedra & Smith, Microelectronic Circuits, 7th ed., §9.2 (differential half circuit):
  // adm = −gm·RC for the differential output; §9.3 (common-mode half circuit, 2·RT in the
  // emitter): acm = −gm·RC / (1 + (gm + gπ)·2RT). With va = ∞ and the solver's own gm and rπ the
  // half circuits are exact, so the tolerance only covers rounding and min_g.
  it('adm = −gm·RC and acm = −gm·RC/(1 + (gm + gπ)·2RT)', () => {
    const r = solveOk(pairNetlist({ rc: 5e3, rt: 10e3, model: 'npn(is=1e-16, beta=100)', extra: 'ports in=(va, vb) out=(outa, outb)' }));
    const q1 = bjt(r, 'q1');
    const gpi = 1 / q1.rpi;
    expectNearlyEqual(r.ports!.adm.re, -q1.gm * 5e3, 1e-6, 0);
    expectNearlyEqual(r.ports!.acm.re, (-q1.gm * 5e3) / (1 + (q1.gm + gpi) * 2 * 10e3), 1e-6, 0);
    expect(r.ports!.adm.phase_deg).toBe(180);
    expect(r.ports!.output).toBe('differential');
    // gm = IC/VT for the exponential model (Sedra & Smith, §7.2): the solver's gm agrees.
    expectNearlyEqual(q1.gm, q1.ic / thermalVoltage(27), 1e-6, 0);
  });

  // Common practice: a resistor tail gives a CMRR of a few hundred (around 50 dB) because
  // CMRR ≈ 1 + 2·gm·RT and gm·RT is only the tail's voltage drop over VT (~9 V / 26 mV / …).
  it('CMRR of a resistor tail lands in the 50 dB range', () => {
    const r = solveOk(pairNetlist({ rc: 5e3, rt: 4.65e3, model: 'npn(is=1e-16, beta=100, va=80)', extra: 'ports in=(va, vb) out=(outa, outb)\nmeasure k = cmrr_db' }));
    expect(r.measures.k).toBeGreaterThan(45);
    expect(r.measures.k).toBeLessThan(60);
    // The first-order estimate CMRR ≈ 2·gm·RT (large gm·RT) within 10 %: the (1 + …) and
    // gπ terms are a 1 % effect, ro ‖ RC a few percent.
    const q1 = bjt(r, 'q1');
    expectNearlyEqual(r.ports!.cmrr, 2 * q1.gm * 4.65e3, 0.1, 0);
  });

  // 20·log10 of voltage ratios (common practice): 379 → 51.6 dB, 54,000 → 94.6 dB.
  it('dB conversions through measures', () => {
    const r = solveOk(pairNetlist({ rc: 5e3, rt: 10e3, model: 'npn(is=1e-16)', extra: 'measure a = db(379)\nmeasure b = db(54000)\nmeasure c = db(-379)' }));
    expect(r.measures.a).toBeCloseTo(51.6, 1);
    expect(r.measures.b).toBeCloseTo(94.6, 1);
    expect(r.measures.c).toBeCloseTo(51.6, 1);
  });
});

describe('mirror tail', () => {
  // Common practice: replacing the tail resistor by a current mirror lifts the CMRR from the
  // ~50 dB range to 90 dB and beyond, because CMRR ≈ gm·Rtail and a good mirror's Rtail is
  // megohms (a Wilson mirror: ≈ β·ro/2; Gray et al., 5th ed., §4.2.5).
  it('a Wilson-mirror tail lifts the CMRR above 90 dB', () => {
    const r = solveOk(`
title Pair on a Wilson tail
use mirrors/wilson_npn@3
model qn: npn(is=1e-16, beta=100, va=80)
vcc:  vsrc(vcc, gnd) 10
vee:  vsrc(vee, gnd) -10
va:   vsrc(ina, gnd) 0
vb:   vsrc(inb, gnd) 0
iref: isrc(gnd, ref) 2m
tl:   wilson_npn(in=ref, out=tail, rail=vee)
rca:  res(vcc, outa) 2.5k
rcb:  res(vcc, outb) 2.5k
q1:   npn(c=outa, b=ina, e=tail) qn
q2:   npn(c=outb, b=inb, e=tail) qn
ports in=(va, vb) out=(outa, outb)
measure k = cmrr_db
measure rtail = zout(tail)
check cmrr_db >= 90
`);
    expect(r.measures.k).toBeGreaterThan(90);
    expect(r.checks[0].pass).toBe(true);
    expect(r.checks[0].margin).toBeCloseTo(r.measures.k - 90, 9);
    // CMRR ≈ 2·gm·Rtail for the differential output with acm taken on voc (same sources);
    // zout(tail) includes the pair's emitters (1/(2gm)) in parallel, hence loose.
    const q1 = bjt(r, 'q1');
    expect(r.ports!.cmrr).toBeGreaterThan(q1.gm * 1e6);
  });

  it('a simple-mirror tail sits between (CMRR ≈ 2·gm·ro, about 70 dB)', () => {
    const r = solveOk(`
use mirrors/simple_npn@1
model qn: npn(is=1e-16, beta=100, va=80)
vcc:  vsrc(vcc, gnd) 10
vee:  vsrc(vee, gnd) -10
va:   vsrc(ina, gnd) 0
vb:   vsrc(inb, gnd) 0
iref: isrc(gnd, ref) 2m
tl:   simple_npn(in=ref, out=tail, rail=vee)
rca:  res(vcc, outa) 2.5k
rcb:  res(vcc, outb) 2.5k
q1:   npn(c=outa, b=ina, e=tail) qn
q2:   npn(c=outb, b=inb, e=tail) qn
ports in=(va, vb) out=(outa, outb)
`);
    // acm = −gm·RC/(1 + 2·gm·ro_tail) ⇒ CMRR ≈ 2·gm·ro_tail (Sedra & Smith, §9.3), within 10 %
    // (the (1 + …), gπ and ro-of-the-pair terms).
    const q1 = bjt(r, 'q1');
    const tail = bjt(r, 'tl.qb');
    expectNearlyEqual(r.ports!.cmrr, 2 * q1.gm * tail.ro, 0.1, 0);
    expect(r.ports!.cmrr_db).toBeGreaterThan(60);
    expect(r.ports!.cmrr_db).toBeLessThan(80);
  });
});

describe('large-signal pair on an ideal tail', () => {
  // Sedra & Smith, Microelectronic Circuits, 7th ed., large-signal operation of the BJT differential pair (from memory):
  // IC1 − IC2 = α·IEE·tanh(vid/(2VT)), exact for the exponential model with va = ∞.
  it('ΔIC = α·IEE·tanh(vid/(2VT)) through analyze transfer', () => {
    const iee = 1e-3;
    const r = solveOk(`
title Ideal-tail pair, transfer
model qn: npn(is=1e-16, beta=100)
vcc:  vsrc(vcc, gnd) 10
vee:  vsrc(vee, gnd) -10
va:   vsrc(ina, gnd) 0
vb:   vsrc(inb, gnd) 0
rca:  res(vcc, outa) 2k
rcb:  res(vcc, outb) 2k
q1:   npn(c=outa, b=ina, e=tail) qn
q2:   npn(c=outb, b=inb, e=tail) qn
itl:  isrc(tail, vee) 1m
analyze transfer va from -100m to 100m step 5m
`);
    const t = r.transfer!;
    expect(t.source).toBe('va');
    expect(t.x).toHaveLength(41);
    const vt = thermalVoltage(27);
    const alpha = 100 / 101;
    t.x.forEach((vid, k) => {
      const dic = t.curves['i(rca)'][k] - t.curves['i(rcb)'][k];
      const expected = alpha * iee * Math.tanh(vid / (2 * vt));
      // Absolute tolerance as a fraction of IEE: the curve passes through 0.
      expect(Math.abs(dic - expected)).toBeLessThan(1e-6 * iee);
    });
    expect(t.curves['v(outa)']).toHaveLength(41);
    expect(t.curves['i(itl)'].every((i) => Math.abs(i - iee) < 1e-12)).toBe(true);
  });
});
