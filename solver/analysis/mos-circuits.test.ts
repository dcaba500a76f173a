/**
 * MOS circuits through the engine against the square-law textbook results
 * (Razavi, Design of Analog CMOS Integrated Circuits, 2nd ed., ch. 2 and 3).
 */
import { describe, expect, it } from 'vitest';
import type { Circuit } from '../circuit/types';
import type { MosOp } from '../circuit/result';
import { createAcSolver } from './ac-solve';
import type { OperatingPoint } from './engine-api';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { linearize } from './small-signal';
import { circuitOf, mosModel } from './test-circuits';
import { expectNearlyEqual } from '../testing/nearly-equal';

function op(c: Circuit): OperatingPoint {
  const r = solveOperatingPoint(c);
  if (isOpFailure(r)) throw new Error(r.errors.map((e) => e.message).join('; '));
  return r;
}
const mos = (o: OperatingPoint, name: string) => o.report.devices[name] as MosOp;

/** A MOS with gate, drain (and bulk, optionally) held by ideal sources; source grounded. */
function biased(kind: 'nmos' | 'pmos', vgs: number, vds: number, model = mosModel(), vbs = 0): Circuit {
  const s = kind === 'nmos' ? 1 : -1;
  return circuitOf(
    [
      { kind: 'vsrc', name: 'vg', p: 'g', n: 'gnd', dc: s * vgs },
      { kind: 'vsrc', name: 'vd', p: 'd', n: 'gnd', dc: s * vds },
      { kind: 'vsrc', name: 'vbulk', p: 'bk', n: 'gnd', dc: s * vbs },
      { kind, name: 'm1', d: 'd', g: 'g', s: 'gnd', b: 'bk', model, w: 10e-6, l: 1e-6, m: 2 },
    ],
    { minG: 0 },
  );
}

const K = 100e-6 * 10 * 2; // ucox·(W/L)·m

describe('square law', () => {
  it('gives ID = ½·µCox·(W/L)·Vov²·(1 + λVDS) in saturation and gm = 2·ID/Vov (Razavi, 2nd ed., from memory)', () => {
    for (const kind of ['nmos', 'pmos'] as const) {
      const o = op(biased(kind, 0.8, 2, mosModel({ lambda: 0.05 })));
      const m = mos(o, 'm1');
      const vov = 0.3;
      expect(m.region).toBe('saturation');
      expectNearlyEqual(m.id, 0.5 * K * vov * vov * (1 + 0.05 * 2), 1e-12, 0);
      expectNearlyEqual(m.gm, (2 * m.id) / vov, 1e-12, 0);
      // gds = λ·ID/(1 + λVDS), the exact slope of the saturation law (Razavi, 2nd ed., ch. 2, from memory).
      expectNearlyEqual(m.gds, (0.05 * m.id) / (1 + 0.05 * 2), 1e-12, 0);
      expectNearlyEqual(m.vov, vov, 1e-12, 0);
      expect(o.warnings).toEqual([]);
    }
  });

  it('gives ID = µCox·(W/L)·(Vov·VDS − VDS²/2) in triode and warns (Razavi, 2nd ed., from memory)', () => {
    const o = op(biased('nmos', 1.5, 0.2));
    const m = mos(o, 'm1');
    expect(m.region).toBe('triode');
    expectNearlyEqual(m.id, K * (1.0 * 0.2 - 0.02), 1e-12, 0);
    expect(o.warnings.map((w) => w.code)).toEqual(['mos-triode']);
    expect(o.warnings[0].line).toBe(4);
  });

  it('is cut off below threshold with a warning', () => {
    const o = op(biased('nmos', 0.3, 1));
    expect(mos(o, 'm1').region).toBe('cutoff');
    expect(mos(o, 'm1').id).toBe(0);
    expect(o.warnings.map((w) => w.code)).toEqual(['mos-cutoff']);
  });

  it('raises Vth by γ(√(2φF + VSB) − √(2φF)) and gives gmb = gm·γ/(2√(2φF + VSB)) (Razavi, 2nd ed., from memory)', () => {
    const model = mosModel({ gamma: 0.45, phi: 0.8 });
    const o = op(biased('nmos', 1.5, 3, model, -1));
    const m = mos(o, 'm1');
    const vth = 0.5 + 0.45 * (Math.sqrt(0.8 + 1) - Math.sqrt(0.8));
    expectNearlyEqual(m.vth, vth, 1e-12, 0);
    expectNearlyEqual(m.id, 0.5 * K * (1.5 - vth) ** 2, 1e-12, 0);
    expectNearlyEqual(m.gmb, (m.gm * 0.45) / (2 * Math.sqrt(0.8 + 1)), 1e-12, 0);
  });
});

describe('common-source stage', () => {
  it('has Av = −gm·(RD ∥ ro) with ro = 1/gds (Razavi, 2nd ed., from memory)', () => {
    const rd = 10e3;
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vdd', p: 'vdd', n: 'gnd', dc: 3 },
        { kind: 'vsrc', name: 'vin', p: 'g', n: 'gnd', dc: 0.7 },
        { kind: 'res', name: 'rd', a: 'vdd', b: 'out', value: rd },
        { kind: 'nmos', name: 'm1', d: 'out', g: 'g', s: 'gnd', b: 'gnd', model: mosModel({ lambda: 0.1 }), w: 10e-6, l: 1e-6, m: 1 },
      ],
      { minG: 0 },
    );
    const o = op(c);
    const m = mos(o, 'm1');
    expect(m.region).toBe('saturation');
    const [s] = createAcSolver(linearize(c, o)).solve(0, [{ sources: new Map([['vin', { re: 1, im: 0 }]]) }]);
    const ro = 1 / m.gds;
    expectNearlyEqual(s.v('out').re, (-m.gm * rd * ro) / (rd + ro), 1e-9, 0);
  });

  it('diode-connected nmos fed by a current settles at Vov = √(2·I/K) (Razavi, 2nd ed., ch. 2 square law solved for Vov, from memory)', () => {
    const c = circuitOf([
      { kind: 'isrc', name: 'ib', from: 'gnd', to: 'x', dc: 50e-6 },
      { kind: 'nmos', name: 'm1', d: 'x', g: 'x', s: 'gnd', b: 'gnd', model: mosModel(), w: 4e-6, l: 1e-6, m: 1 },
    ]);
    const o = op(c);
    expectNearlyEqual(o.report.nodes.x, 0.5 + Math.sqrt((2 * 50e-6) / (100e-6 * 4)), 1e-6, 0);
  });
});
