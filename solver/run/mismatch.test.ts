import { describe, expect, it } from 'vitest';
import { parseNetlist, solveNetlist, solveWithOutline } from '../index';
import type { MismatchRequest } from '../circuit/analyses';
import type { Circuit } from '../circuit/types';
import { isOpFailure, solveOperatingPoint } from '../analysis/operating-point';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { RESISTOR_PAIR } from '../testing/pair-netlist';
import { inputOffset, mismatchSamples, perturbedCircuit, summarizeMismatch } from './mismatch';

const VT_27C = (1.380649e-23 * 300.15) / 1.602176634e-19;

const PAIR = (mismatch: string) => `title  Resistor-loaded pair
${RESISTOR_PAIR}analyze mismatch ${mismatch}
measure a0 = db(adm)
check a0 >= 40
`;

function parsed(text: string): { circuit: Circuit; requests: ReturnType<typeof parseNetlist>['requests']; request: MismatchRequest } {
  const p = parseNetlist(text);
  return { circuit: p.circuit!, requests: p.requests, request: p.requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch')! };
}

describe('analyze mismatch', () => {
  it('spreads vos of a pair with only IS mismatched as √2·VT·σ (2000 runs, ±10 %)', () => {
    // VOS = VT·ln(IS2/IS1) for a bipolar pair with equal loads: Gray et al., 5th ed.,
    // §3.5.6, offset voltage of the emitter-coupled pair (from memory). With independent relative
    // spreads σ on each IS, sd(VOS) ≈ VT·√2·σ.
    const r = solveNetlist(PAIR('runs 2000 seed 7 is 2%'));
    expect(r.errors).toEqual([]);
    const m = r.mismatch!;
    expect(m.failed_runs).toBe(0);
    expect(m.samples.vos).toHaveLength(2000);
    expectNearlyEqual(m.stats.vos.sd, Math.SQRT2 * VT_27C * 0.02, 0.1, 0, 'sd of vos');
    expect(Math.abs(m.stats.vos.mean)).toBeLessThan(4 * (m.stats.vos.sd / Math.sqrt(2000)));
    expect(Object.keys(m.stats)).toEqual(['adm', 'acm', 'cmrr_db', 'vos', 'a0']);
    expect(m.yield).toBe(1);
  });

  it('finds vos by solving: that differential input brings the output back to zero', () => {
    const { circuit, requests, request } = parsed(PAIR('runs 5 seed 11 is 5% beta 10% res 1%'));
    for (let run = 0; run < 5; run++) {
      const c = perturbedCircuit(circuit, request, run);
      const vos = inputOffset(c, requests.ports!, 0, -90)!;
      const parts = c.parts.map((p) => (p.name === 'va' && p.kind === 'vsrc' ? { ...p, dc: vos / 2 } : p.name === 'vb' && p.kind === 'vsrc' ? { ...p, dc: -vos / 2 } : p));
      const op = solveOperatingPoint({ ...c, parts });
      expect(isOpFailure(op)).toBe(false);
      if (isOpFailure(op)) return;
      const vod = op.report.nodes.outa - op.report.nodes.outb;
      // 1 µV at the output is a few nV at the input of a gain-of-90 stage.
      expect(Math.abs(vod)).toBeLessThan(1e-6);
    }
  });

  it('keeps vos to millivolts on a high-gain mirror-loaded pair whose output rails in some runs', () => {
    // A single-ended gain near 1300: IS spreads of 2 % already push the output towards a rail in
    // some runs, where a plain secant from the linear guess leapt to crossings volts away
    // (−14 V). The offset of a bipolar pair is VT·ln(IS ratio) plus the load mirror's share
    // (Gray et al., 5th ed., §3.5.6, from memory): with 2 % on four devices, a few millivolts.
    const text = `title  Mirror-loaded pair
model  qn: npn(is=1e-16, beta=120, va=80)
model  qp: pnp(is=1e-16, beta=80, va=60)
vcc:   vsrc(vcc, gnd) 10 V
va:    vsrc(ina, gnd) 2.5 V
vb:    vsrc(inb, gnd) 2.5 V
q1:    npn(c=mir, b=ina, e=tail) qn
q2:    npn(c=out, b=inb, e=tail) qn
q3:    pnp(c=mir, b=mir, e=vcc) qp
q4:    pnp(c=out, b=mir, e=vcc) qp
it:    isrc(tail, gnd) 1m
ports  in=(va, vb) out=out
analyze mismatch runs 200 seed 1 is 2%
`;
    const r = solveNetlist(text);
    expect(r.errors).toEqual([]);
    const vos = r.mismatch!.samples.vos;
    expect(vos.length).toBeGreaterThan(190);
    for (const v of vos) expect(Math.abs(v)).toBeLessThan(10e-3);
    // Four devices' independent 2 % IS spreads: sd ≈ VT·√4·0.02 ≈ 1.04 mV (each IS ratio adds VT·σ in quadrature).
    expectNearlyEqual(r.mismatch!.stats.vos.sd, VT_27C * 2 * 0.02, 0.2, 0, 'sd of vos, four devices');
  });

  it('gives the same statistics whether the runs are solved in one piece or in three, in any order', () => {
    const { circuit, requests, request } = parsed(PAIR('runs 60 seed 3 beta 5% is 2% res 0.5%'));
    const whole = summarizeMismatch(request, mismatchSamples(circuit, requests, request, 0, 60));
    const pieces = [...mismatchSamples(circuit, requests, request, 40, 60), ...mismatchSamples(circuit, requests, request, 0, 17), ...mismatchSamples(circuit, requests, request, 17, 40)];
    expect(summarizeMismatch(request, pieces)).toEqual(whole);
    expect(solveNetlist(PAIR('runs 60 seed 3 beta 5% is 2% res 0.5%')).mismatch).toEqual(whole);
    expect(solveNetlist(PAIR('runs 60 seed 4 beta 5% is 2% res 0.5%')).mismatch!.stats.vos).not.toEqual(whole.stats.vos);
  });

  it('counts the yield of the checks over the runs', () => {
    // a0 = 39.35 dB nominally with rt 4.65k in this pair at ±10 V (see the ports tests); a 40 dB
    // check then fails in most runs, a 38 dB one passes in nearly all.
    const low = solveNetlist(PAIR('runs 200 seed 5 beta 10% res 2%').replace('check a0 >= 40', 'check a0 >= 38'));
    expect(low.mismatch!.yield).toBeGreaterThan(0.95);
    const high = solveNetlist(PAIR('runs 200 seed 5 beta 10% res 2%').replace('check a0 >= 40', 'check a0 >= 60'));
    expect(high.mismatch!.yield).toBe(0);
  });

  it('refuses a spread that is not a percentage, and too much work, each on its line', () => {
    const bare = solveNetlist(PAIR('runs 10 beta 5'));
    expect(bare.errors[0]).toMatchObject({ line: 13 });
    expect(bare.errors[0].message).toContain('percentage');
    expect(solveNetlist(PAIR('runs 99999 is 1%')).errors.find((e) => e.code === 'sweep-too-large')?.line).toBe(13);
  });

  it('says what is wrong with the line when the runs are left to the caller (the bench), and hands back only a line that will run', () => {
    const noSpreads = solveWithOutline(PAIR('runs 10 seed 1'), { skip: ['mismatch'] });
    expect(noSpreads.result.mismatch).toBeUndefined();
    expect(noSpreads.result.warnings.find((w) => w.line === 13)?.message).toContain('no spreads');
    expect(noSpreads.skipped).toHaveLength(1);
    const tooMuch = solveWithOutline(PAIR('runs 99999 is 1%'), { skip: ['mismatch'] });
    expect(tooMuch.result.errors.find((e) => e.code === 'sweep-too-large')?.line).toBe(13);
    expect(tooMuch.skipped).toEqual([]);
  });
});
