/**
 * Bipolar circuits through the engine, against textbook results (va = ∞ unless stated, so the
 * textbook formulas hold exactly for the transport model).
 */
import { describe, expect, it } from 'vitest';
import type { Circuit } from '../circuit/types';
import type { BjtOp } from '../circuit/result';
import { BOLTZMANN, ELEMENTARY_CHARGE } from '../devices/temperature';
import { createAcSolver } from './ac-solve';
import { dcSweep } from './dc-sweep';
import type { OperatingPoint } from './engine-api';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { linearize } from './small-signal';
import { bjtModel, circuitOf } from './test-circuits';
import { expectNearlyEqual } from '../testing/nearly-equal';

function op(c: Circuit): OperatingPoint {
  const r = solveOperatingPoint(c);
  if (isOpFailure(r)) throw new Error(r.errors.map((e) => e.message).join('; '));
  return r;
}
const bjt = (o: OperatingPoint, name: string) => o.report.devices[name] as BjtOp;

describe('diode-connected bipolar', () => {
  it('has VBE = VT·ln(IC/IS + 1) with VT = kT/q, exact SI k and q (Sedra & Smith, 7th ed., from memory)', () => {
    for (const [iref, temp] of [[1e-6, 27], [1e-3, 27], [1e-4, 85]] as const) {
      const c = circuitOf(
        [
          { kind: 'isrc', name: 'iref', from: 'gnd', to: 'c', dc: iref },
          { kind: 'npn', name: 'q1', c: 'c', b: 'c', e: 'gnd', model: bjtModel({ is: 1e-16, eg: 1.12, pt: 3 }), area: 1 },
        ],
        { temp, minG: 0 },
      );
      const q = bjt(op(c), 'q1');
      const t = temp + 273.15;
      const vt = (1.380649e-23 * t) / 1.602176634e-19;
      // IS(T) per the model's temperature law (T0 = 300.15 K); at 27 °C it is IS itself.
      const isT = 1e-16 * Math.pow(t / 300.15, 3) * Math.exp(((1.602176634e-19 * 1.12) / 1.380649e-23) * (1 / 300.15 - 1 / t));
      expectNearlyEqual(q.vbe, vt * Math.log(q.ic / isT + 1), 1e-12, 0);
      // KCL at the node: IREF = IC + IB = IC·(1 + 1/β).
      expectNearlyEqual(q.ic * (1 + 1 / 100), iref, 1e-12, 0);
      expect(q.region).toBe('active');
    }
    expect(BOLTZMANN).toBe(1.380649e-23);
    expect(ELEMENTARY_CHARGE).toBe(1.602176634e-19);
  });

  it('reports the textbook hybrid-pi values gm = IC/VT, rπ = β/gm (Sedra & Smith, 7th ed., §7.2, from memory)', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 5 },
        { kind: 'vsrc', name: 'vb', p: 'b', n: 'gnd', dc: 0.65 },
        { kind: 'npn', name: 'q1', c: 'vcc', b: 'b', e: 'gnd', model: bjtModel({ cje: 1e-12, cjc: 0.5e-12, tauf: 1e-10 }), area: 1 },
      ],
      { minG: 0 },
    );
    const q = bjt(op(c), 'q1');
    const vt = thermal();
    expectNearlyEqual(q.gm, q.ic / vt, 1e-9, 0);
    expectNearlyEqual(q.rpi, 100 / q.gm, 1e-9, 0);
    expect(q.ro).toBe(1e30);
    // Cπ = Cje + gm·τF, Cμ = Cjc (Sedra & Smith, 7th ed., §10.2, from memory).
    expectNearlyEqual(q.cpi, 1e-12 + q.gm * 1e-10, 1e-12, 0);
    expect(q.cmu).toBe(0.5e-12);
  });

  it('gives ro = (VA + VCE)/IC with a finite Early voltage (Sedra & Smith, 7th ed., §6.2 and §7.2, from memory)', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 5 },
        { kind: 'vsrc', name: 'vb', p: 'b', n: 'gnd', dc: 0.65 },
        { kind: 'npn', name: 'q1', c: 'vcc', b: 'b', e: 'gnd', model: bjtModel({ va: 50 }), area: 1 },
      ],
      { minG: 0 },
    );
    const q = bjt(op(c), 'q1');
    expectNearlyEqual(q.ro, (50 + 5) / q.ic, 1e-9, 0);
    expectNearlyEqual(q.ic, 1e-16 * Math.exp(0.65 / thermal()) * (1 + 5 / 50), 1e-6, 0);
  });
});

function thermal(): number {
  return (1.380649e-23 * 300.15) / 1.602176634e-19;
}

describe('two-transistor current mirror', () => {
  it('copies IREF with ratio 1/(1 + 2/β) (Sedra & Smith, Microelectronic Circuits, 7th ed., §8.2.2, from memory)', () => {
    for (const beta of [20, 100, 300]) {
      for (const kind of ['npn', 'pnp'] as const) {
        const m = bjtModel({ beta });
        const s = kind === 'npn' ? 1 : -1;
        const c = circuitOf(
          [
            { kind: 'vsrc', name: 'vcc', p: 'rail', n: 'gnd', dc: 0 },
            { kind: 'isrc', name: 'iref', from: s > 0 ? 'gnd' : 'ref', to: s > 0 ? 'ref' : 'gnd', dc: 1e-4 },
            { kind: kind, name: 'q1', c: 'ref', b: 'ref', e: 'rail', model: m, area: 1 },
            { kind: kind, name: 'q2', c: 'out', b: 'ref', e: 'rail', model: m, area: 1 },
            { kind: 'vsrc', name: 'vout', p: 'out', n: 'gnd', dc: s * 3 },
          ],
          { minG: 0 },
        );
        const o = op(c);
        const io = bjt(o, 'q2').ic;
        expectNearlyEqual(io / 1e-4, 1 / (1 + 2 / beta), 1e-9, 0);
        expect(bjt(o, 'q2').region).toBe('active');
      }
    }
  });
});

/** Resistor-tail differential pair, inputs at 0 V DC. */
function diffPair(opts: { rc: number; re: number; beta?: number; tailSource?: boolean }): Circuit {
  const m = bjtModel({ beta: opts.beta ?? 100 });
  return circuitOf(
    [
      { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
      { kind: 'vsrc', name: 'vee', p: 'vee', n: 'gnd', dc: -10 },
      { kind: 'vsrc', name: 'va', p: 'ina', n: 'gnd', dc: 0 },
      { kind: 'vsrc', name: 'vb', p: 'inb', n: 'gnd', dc: 0 },
      { kind: 'res', name: 'rc1', a: 'vcc', b: 'outa', value: opts.rc },
      { kind: 'res', name: 'rc2', a: 'vcc', b: 'outb', value: opts.rc },
      { kind: 'npn', name: 'q1', c: 'outa', b: 'ina', e: 'tail', model: m, area: 1 },
      { kind: 'npn', name: 'q2', c: 'outb', b: 'inb', e: 'tail', model: m, area: 1 },
      opts.tailSource
        ? { kind: 'isrc', name: 'itail', from: 'tail', to: 'vee', dc: 1e-3 }
        : { kind: 'res', name: 'rt', a: 'tail', b: 'vee', value: opts.re },
    ],
    { minG: 0 },
  );
}

describe('resistor-tail differential pair', () => {
  const rc = 5000;
  const re = 10000;
  const c = diffPair({ rc, re });
  const o = op(c);
  const q1 = bjt(o, 'q1');
  const solver = createAcSolver(linearize(c, o));
  const half = (a: number, b: number) => ({ sources: new Map([['va', { re: a, im: 0 }], ['vb', { re: b, im: 0 }]]) });
  const [dm, cm] = solver.solve(0, [half(0.5, -0.5), half(1, 1)]);

  it('has adm = −gm·RC exactly per half-circuit (Sedra & Smith, Microelectronic Circuits, 7th ed., differential-amplifier chapter, differential half circuit, from memory)', () => {
    const adm = dm.v('outa').re - dm.v('outb').re;
    expectNearlyEqual(adm, -q1.gm * rc, 1e-9, 0);
    expect(Math.abs(dm.v('tail').re)).toBeLessThan(1e-12); // the tail is an AC ground for the differential mode
  });

  it('has acm = −gm·RC / (1 + 2·RE·(gm + 1/rπ)) (Sedra & Smith, Microelectronic Circuits, 7th ed., differential-amplifier chapter, common-mode half circuit, from memory)', () => {
    const acm = (cm.v('outa').re + cm.v('outb').re) / 2;
    expectNearlyEqual(acm, (-q1.gm * rc) / (1 + 2 * re * (q1.gm + 1 / q1.rpi)), 1e-9, 0);
  });

  it('biases both halves equally at IC ≈ α·(0 − VBE − VEE)/(2·RE) (KVL around the tail, common practice)', () => {
    const q2 = bjt(o, 'q2');
    expectNearlyEqual(q1.ic, q2.ic, 1e-12, 0);
    const vtail = o.report.nodes.tail;
    expectNearlyEqual(2 * q1.ie, (vtail + 10) / re, 1e-12, 0);
  });
});

describe('differential pair DC transfer', () => {
  it('splits the tail as ΔIC = α·IEE·tanh(vid/2VT) (Sedra & Smith, Microelectronic Circuits, 7th ed., large-signal operation of the BJT differential pair, from memory)', () => {
    const c = diffPair({ rc: 2000, re: 0, tailSource: true });
    const values = Array.from({ length: 21 }, (_, k) => -0.2 + k * 0.02);
    const sweep = dcSweep(c, 'va', values);
    expect(sweep.errors).toEqual([]);
    expect(sweep.x).toEqual(values);
    const vt = thermal();
    const alpha = 100 / 101;
    sweep.points.forEach((p, k) => {
      const d1 = p.devices.q1 as BjtOp;
      const d2 = p.devices.q2 as BjtOp;
      const expected = alpha * 1e-3 * Math.tanh(values[k] / (2 * vt));
      expect(Math.abs(d1.ic - d2.ic - expected)).toBeLessThan(1e-9 * 1e-3);
    });
  });
});

describe('base resistance', () => {
  it('adds rb in series with the base: zin = rb + rπ at DC (Sedra & Smith, 7th ed., §10.2, hybrid-pi with rx, from memory)', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 5 },
        { kind: 'vsrc', name: 'vb', p: 'b', n: 'gnd', dc: 0.65 },
        { kind: 'npn', name: 'q1', c: 'vcc', b: 'b', e: 'gnd', model: bjtModel({ rb: 200 }), area: 1 },
      ],
      { minG: 0 },
    );
    const o = op(c);
    const q = bjt(o, 'q1');
    expect(q.rb).toBe(200);
    // The external VBE includes the IB·rb drop.
    const [s] = createAcSolver(linearize(c, o)).solve(0, [{ sources: new Map([['vb', { re: 1, im: 0 }]]) }]);
    const ib = -s.branch('vb').re; // p→n through the source is minus the current into the base
    expectNearlyEqual(1 / ib, 200 + q.rpi, 1e-9, 0);
  });
});
