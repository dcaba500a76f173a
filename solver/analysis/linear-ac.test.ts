/**
 * Linear circuits through the whole engine (operating point → linearize → AC solve), checked
 * against closed-form textbook results and against mathjs solving an independently written
 * complex MNA system.
 */
import fc from 'fast-check';
import { add as cadd, complex, lusolve, matrix, subtract, unaryMinus, type Complex, type Matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { GROUND, type Circuit } from '../circuit/types';
import { createAcSolver, acSweep } from './ac-solve';
import type { OperatingPoint, Phasor } from './engine-api';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { linearize } from './small-signal';
import { circuitOf, type PartSpec } from './test-circuits';
import { expectNearlyEqual } from '../testing/nearly-equal';

const mag = (p: Phasor) => Math.hypot(p.re, p.im);
const phaseDeg = (p: Phasor) => (Math.atan2(p.im, p.re) * 180) / Math.PI;

function op(c: Circuit): OperatingPoint {
  const r = solveOperatingPoint(c);
  if (isOpFailure(r)) throw new Error(r.errors.map((e) => e.message).join('; '));
  return r;
}

describe('resistive divider', () => {
  it('gives v(out) = V·R2/(R1 + R2) (Ohm and Kirchhoff, common practice)', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'v1', p: 'in', n: 'gnd', dc: 10 },
        { kind: 'res', name: 'r1', a: 'in', b: 'out', value: 1000 },
        { kind: 'res', name: 'r2', a: 'out', b: 'gnd', value: 3000 },
      ],
      { minG: 0 },
    );
    const r = op(c).report;
    expectNearlyEqual(r.nodes.out, 7.5, 1e-12, 0);
    expectNearlyEqual(r.parts.r1.i, 10 / 4000, 1e-12, 0);
    // The source delivers 2.5 mA, i.e. −2.5 mA p→n through it (§5 convention).
    expectNearlyEqual(r.sources.v1.i, -10 / 4000, 1e-12, 0);
    expect(r.sources.v1.v).toBe(10);
  });

  it('min_g loads the divider exactly as a conductance to ground would', () => {
    const g = 1e-6;
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'v1', p: 'in', n: 'gnd', dc: 10 },
        { kind: 'res', name: 'r1', a: 'in', b: 'out', value: 1000 },
        { kind: 'res', name: 'r2', a: 'out', b: 'gnd', value: 3000 },
      ],
      { minG: g },
    );
    // Thevenin: 7.5 V behind 750 Ω into g (common practice).
    const expected = 7.5 / (1 + 750 * g);
    expectNearlyEqual(op(c).report.nodes.out, expected, 1e-12, 0);
  });
});

describe('RC low-pass', () => {
  // Any first-order low-pass: |H| = 1/√2 (−3.0103 dB) and ∠H = −45° at f = 1/(2πRC)
  // (Sedra & Smith, Microelectronic Circuits, 7th ed., §1.6, STC networks).
  const R = 1000;
  const C = 1e-9;
  const c = circuitOf(
    [
      { kind: 'vsrc', name: 'vin', p: 'in', n: 'gnd', dc: 0, ac: { mag: 1, phaseDeg: 0 } },
      { kind: 'res', name: 'r1', a: 'in', b: 'out', value: R },
      { kind: 'cap', name: 'c1', a: 'out', b: 'gnd', value: C },
    ],
    { minG: 0 },
  );
  const sys = linearize(c, op(c));
  const drive = { sources: new Map([['vin', { re: 1, im: 0 }]]) };

  it('is −3.01 dB and −45° at 1/(2πRC)', () => {
    const [s] = createAcSolver(sys).solve(1 / (2 * Math.PI * R * C), [drive]);
    const h = s.v('out');
    expect(20 * Math.log10(mag(h))).toBeCloseTo(-10 * Math.log10(2), 10);
    expect(phaseDeg(h)).toBeCloseTo(-45, 9);
  });

  it('passes DC unattenuated and falls 20 dB/decade far above the corner', () => {
    const [dc, hi] = acSweep(sys, [0, 1e3 / (2 * Math.PI * R * C)], drive);
    expectNearlyEqual(mag(dc.v('out')), 1, 1e-12, 0);
    // |H| = 1/√(1 + (f/fc)²) at f = 1000·fc.
    expectNearlyEqual(mag(hi.v('out')), 1 / Math.sqrt(1 + 1e6), 1e-12, 0);
  });
});

describe('series RLC', () => {
  // Series resonance: f0 = 1/(2π√(LC)), Q = (1/R)·√(L/C); at f0 the current is V/R in phase with
  // V, and |v(C)| = Q·|V|; the −3 dB points of the current sit at f0·(√(1 + 1/4Q²) ± 1/2Q)
  // (Hayt, Kemmerly & Durbin, Engineering Circuit Analysis, 8th ed., §16.1–16.3).
  const R = 10;
  const L = 1e-3;
  const C = 1e-9;
  const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
  const Q = Math.sqrt(L / C) / R;
  const c = circuitOf(
    [
      { kind: 'vsrc', name: 'vin', p: 'in', n: 'gnd', dc: 0 },
      { kind: 'res', name: 'r1', a: 'in', b: 'm', value: R },
      { kind: 'ind', name: 'l1', a: 'm', b: 'top', value: L },
      { kind: 'cap', name: 'c1', a: 'top', b: 'gnd', value: C },
    ],
    { minG: 0 },
  );
  const solver = createAcSolver(linearize(c, op(c)));
  const drive = { sources: new Map([['vin', { re: 1, im: 0 }]]) };

  it('resonates at 1/(2π√LC) with current V/R and |v(C)| = Q·V', () => {
    const [s] = solver.solve(f0, [drive]);
    const i = s.branch('l1');
    expectNearlyEqual(i.re, 1 / R, 1e-9, 0);
    expect(Math.abs(i.im)).toBeLessThan(1e-9 / R);
    expectNearlyEqual(mag(s.v('top')), Q, 1e-9, 0);
    // The source's own current is the same, p→n through the source, so negative.
    expectNearlyEqual(s.branch('vin').re, -1 / R, 1e-9, 0);
  });

  it('has its −3 dB current points where Q predicts', () => {
    const k = 1 / (2 * Q);
    for (const f of [f0 * (Math.sqrt(1 + k * k) - k), f0 * (Math.sqrt(1 + k * k) + k)]) {
      const [s] = solver.solve(f, [drive]);
      expectNearlyEqual(mag(s.branch('l1')), 1 / (R * Math.SQRT2), 1e-9, 0);
    }
  });
});

describe('isrc and injection excitations', () => {
  it('drives a current from→to and an injection into a node (Ohm, common practice)', () => {
    const c = circuitOf(
      [
        { kind: 'res', name: 'r1', a: 'a', b: 'gnd', value: 100 },
        { kind: 'res', name: 'r2', a: 'b', b: 'gnd', value: 200 },
        { kind: 'isrc', name: 'i1', from: 'a', to: 'b', dc: 0 },
      ],
      { minG: 0 },
    );
    const solver = createAcSolver(linearize(c, op(c)));
    const [viaSource, injected] = solver.solve(0, [
      { sources: new Map([['i1', { re: 1e-3, im: 0 }]]) },
      { injections: new Map([['a', { re: 0, im: 1e-3 }]]) },
    ]);
    expectNearlyEqual(viaSource.v('a').re, -0.1, 1e-12, 0);
    expectNearlyEqual(viaSource.v('b').re, 0.2, 1e-12, 0);
    expectNearlyEqual(injected.v('a').im, 0.1, 1e-12, 0);
    expect(injected.v(GROUND)).toEqual({ re: 0, im: 0 });
  });
});

// ---------------------------------------------------------------------------------------------
// Cross-check: random linear networks, our MNA + complex LU against mathjs `lusolve` on an
// independently written complex MNA (Ho, Ruehli & Brennan, "The modified nodal approach to
// network analysis", IEEE Trans. Circuits Syst., 1975).

interface RandomNet {
  parts: PartSpec[];
  freq: number;
}

const netArb: fc.Arbitrary<RandomNet> = fc
  .record({
    nodes: fc.integer({ min: 2, max: 7 }),
    tree: fc.array(fc.record({ kind: fc.constantFrom('res', 'cap', 'ind'), value: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: 7, maxLength: 7 }),
    extra: fc.array(
      fc.record({
        kind: fc.constantFrom('res', 'cap', 'vccs', 'vcvs', 'isrc'),
        a: fc.nat(99), b: fc.nat(99), c: fc.nat(99), d: fc.nat(99),
        value: fc.double({ min: 0, max: 1, noNaN: true }),
      }),
      { maxLength: 8 },
    ),
    logFreq: fc.double({ min: 2, max: 7, noNaN: true }),
  })
  .map(({ nodes, tree, extra, logFreq }) => {
    const nodeName = (i: number) => (i % (nodes + 1) === 0 ? GROUND : `n${i % (nodes + 1)}`);
    const parts: PartSpec[] = [];
    const scaled = (kind: string, u: number) =>
      kind === 'res' ? 100 * Math.pow(100, u) : kind === 'cap' ? 1e-12 * Math.pow(1000, u) : kind === 'ind' ? 1e-6 * Math.pow(1000, u) : 1e-3 * (u - 0.5);
    // Every node: a resistor to ground, and a spanning chain of R/C/L (inductors only here: no L loops).
    for (let i = 1; i <= nodes; i++) parts.push({ kind: 'res', name: `rg${i}`, a: `n${i}`, b: GROUND, value: 1e3 * (1 + tree[i - 1].value) });
    for (let i = 1; i < nodes; i++) {
      const t = tree[i - 1];
      const e = { name: `t${i}`, a: `n${i}`, b: `n${i + 1}`, value: scaled(t.kind, t.value) };
      parts.push({ kind: t.kind as 'res' | 'cap' | 'ind', ...e });
    }
    parts.push({ kind: 'vsrc', name: 'vin', p: 'in', n: GROUND, dc: 0 });
    parts.push({ kind: 'res', name: 'rin', a: 'in', b: 'n1', value: 50 });
    extra.forEach((x, k) => {
      const a = nodeName(x.a);
      const b = nodeName(x.b);
      if (x.kind === 'res' || x.kind === 'cap') {
        if (a !== b) parts.push({ kind: x.kind, name: `x${k}`, a, b, value: scaled(x.kind, x.value) });
      } else if (x.kind === 'vccs') {
        parts.push({ kind: 'vccs', name: `x${k}`, from: a, to: b, cp: nodeName(x.c), cn: nodeName(x.d), gm: scaled('gm', x.value) });
      } else if (x.kind === 'isrc') {
        if (a !== b) parts.push({ kind: 'isrc', name: `x${k}`, from: a, to: b, dc: 0 });
      } else {
        // A vcvs drives its own output node, loaded and tied back into the network.
        const out = `o${k}`;
        parts.push({ kind: 'vcvs', name: `x${k}`, p: out, n: GROUND, cp: nodeName(x.c), cn: nodeName(x.d), gain: 4 * (x.value - 0.5) });
        parts.push({ kind: 'res', name: `xl${k}`, a: out, b: nodeName(x.a), value: 1e4 });
      }
    });
    return { parts, freq: Math.pow(10, logFreq) };
  });

/** Independent complex MNA of a linear circuit, solved by mathjs. */
function referenceSolve(c: Circuit, freq: number, drives: Map<string, Complex>): Map<string, Complex> {
  const nodes = c.nodes;
  const idx = new Map(nodes.map((n, i) => [n, i]));
  const branches = c.parts.filter((p) => p.kind === 'vsrc' || p.kind === 'vcvs' || p.kind === 'ind');
  const size = nodes.length + branches.length;
  const A: Complex[][] = Array.from({ length: size }, () => Array.from({ length: size }, () => complex(0, 0)));
  const b: Complex[] = Array.from({ length: size }, () => complex(0, 0));
  const add = (r: string | number, col: string | number, v: Complex) => {
    const ri = typeof r === 'number' ? r : idx.get(r);
    const ci = typeof col === 'number' ? col : idx.get(col);
    if (ri === undefined || ci === undefined) return;
    A[ri][ci] = cadd(A[ri][ci], v) as Complex;
  };
  const admittance = (a: string, bb: string, y: Complex) => {
    add(a, a, y); add(bb, bb, y); add(a, bb, unaryMinus(y)); add(bb, a, unaryMinus(y));
  };
  const w = 2 * Math.PI * freq;
  for (const p of c.parts) {
    if (p.kind === 'res') admittance(p.a, p.b, complex(1 / p.value, 0));
    if (p.kind === 'cap') admittance(p.a, p.b, complex(0, w * p.value));
    if (p.kind === 'vccs') {
      const g = complex(p.gm, 0);
      add(p.from, p.cp, g); add(p.from, p.cn, unaryMinus(g)); add(p.to, p.cp, unaryMinus(g)); add(p.to, p.cn, g);
    }
    if (p.kind === 'isrc') {
      const i = drives.get(p.name);
      if (i) {
        const f = idx.get(p.from); const t = idx.get(p.to);
        if (f !== undefined) b[f] = subtract(b[f], i) as Complex;
        if (t !== undefined) b[t] = cadd(b[t], i) as Complex;
      }
    }
  }
  branches.forEach((p, k) => {
    const row = nodes.length + k;
    const [pa, pb] = p.kind === 'ind' ? [p.a, p.b] : [p.p, p.n];
    add(pa, row, complex(1, 0)); add(pb, row, complex(-1, 0));
    add(row, pa, complex(1, 0)); add(row, pb, complex(-1, 0));
    if (p.kind === 'ind') add(row, row, complex(0, -w * p.value));
    if (p.kind === 'vcvs') { add(row, p.cp, complex(-p.gain, 0)); add(row, p.cn, complex(p.gain, 0)); }
    if (p.kind === 'vsrc') b[row] = drives.get(p.name) ?? complex(0, 0);
  });
  const x = (lusolve(matrix(A), matrix(b.map((v) => [v]))) as Matrix).toArray() as unknown as Complex[][];
  return new Map(nodes.map((n, i) => [n, complex(x[i][0])]));
}

describe('cross-check against mathjs lusolve', () => {
  it('random RLC / controlled-source networks agree to 1e-9 relative', () => {
    fc.assert(
      fc.property(netArb, ({ parts, freq }) => {
        const c = circuitOf(parts, { minG: 0 });
        const isrcs = c.parts.filter((p) => p.kind === 'isrc').map((p) => p.name);
        const drives = new Map<string, Phasor>([['vin', { re: 1, im: 0.25 }]]);
        isrcs.forEach((name, k) => drives.set(name, { re: 1e-3 * (k + 1), im: -2e-4 }));
        const ours = createAcSolver(linearize(c, op(c))).solve(freq, [{ sources: drives }])[0];
        const ref = referenceSolve(c, freq, new Map([...drives].map(([k, v]) => [k, complex(v.re, v.im)])));
        let num = 0;
        let den = 0;
        for (const [n, v] of ref) {
          const o = ours.v(n);
          num += (o.re - v.re) ** 2 + (o.im - v.im) ** 2;
          den += v.re ** 2 + v.im ** 2;
        }
        expect(ours.singular).toBe(false);
        expect(Math.sqrt(num / den)).toBeLessThan(1e-9);
      }),
      { numRuns: 150, seed: 20240611 },
    );
  });
});

describe('singular AC systems', () => {
  it('flags a structurally singular system instead of returning NaN', () => {
    const sys = { size: 1, nodeIndex: new Map([['a', 0]]), branchIndex: new Map(), G: new Float64Array(1), C: new Float64Array(1), sources: new Map() };
    const [s] = createAcSolver(sys).solve(1e3, [{ injections: new Map([['a', { re: 1, im: 0 }]]) }]);
    expect(s.singular).toBe(true);
    expect(s.v('a')).toEqual({ re: 0, im: 0 });
  });
});
