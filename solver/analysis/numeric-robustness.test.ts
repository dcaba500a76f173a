/**
 * The engine against numerical trouble: a long gain chain whose cold-start Newton matrices are
 * singular to floating point, a circuit whose conductances differ by 27 decades, and the sparse
 * and dense engines agreeing on a large circuit. KCL is checked on the finished report
 * (./kcl.ts: independent of the MNA assembly).
 */
import { describe, expect, it } from 'vitest';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { circuitOf, diodeModel, type PartSpec } from './test-circuits';
import { kclBalances } from './kcl';
import { linearize } from './small-signal';
import { createAcSolver } from './ac-solve';
import type { OperatingPoint, OpFailure } from './engine-api';
import type { Circuit } from '../circuit/types';
import type { OpResult } from '../circuit/result';
import { npnChain } from '../testing/npn-chain';
import { NewtonWorkspace } from './newton';
import { solveWithWorkspace } from './operating-point';
import { symbolicFor } from '../numeric/sparse-symbolic';
import { SparseRealLu } from '../numeric/sparse-lu';
import { expectNearlyEqual } from '../testing/nearly-equal';

/**
 * The worst KCL imbalance relative to the circuit's current level: max over nodes of |Σ i| over
 * the largest sum of |i| at any node. (A node of a cut-off stage carries femtoamps, so a
 * per-node ratio would measure the rounding of femtoamps rather than the solution.)
 */
function kclRelative(circuit: Circuit, report: OpResult): number {
  let worst = 0;
  let level = 0;
  for (const b of kclBalances(circuit, report).values()) {
    worst = Math.max(worst, Math.abs(b.residual));
    level = Math.max(level, b.scale);
  }
  return worst / level;
}

describe('numerical robustness of the DC engine', () => {
  it('solves a 300-stage resistor-coupled npn chain, KCL balanced to 1e-9 of the circuit currents', () => {
    const circuit = npnChain(300);
    const op = solveOperatingPoint(circuit);
    expect(isOpFailure(op) ? op.errors : []).toEqual([]);
    const report = (op as OperatingPoint).report;
    expect(kclRelative(circuit, report)).toBeLessThan(1e-9);
    // The settled pattern, by hand: a stage driven from vin (1 V through 100 kΩ, 20 kΩ down) is
    // off, so the next one is driven from a high collector and saturates, and so on.
    const q0 = report.devices.q0;
    const q1 = report.devices.q1;
    expect(q0.kind === 'npn' && q0.region).toBe('cutoff');
    expect(q1.kind === 'npn' && q1.region).toBe('saturated');
    // Deep in the chain the alternation repeats exactly (each stage sees the same drive).
    expectNearlyEqual(report.nodes.c200, report.nodes.c202, 1e-9, 1e-12, 'c200 vs c202');
    expectNearlyEqual(report.nodes.c201, report.nodes.c203, 1e-9, 1e-12, 'c201 vs c203');
  });

  it('a sound circuit whose matrix loses all precision is reported as numerically singular, not as a missing DC path', () => {
    // 1 pΩ between a and b, 1 PΩ from b to ground: the ratio 1e27 is beyond double precision,
    // yet every node has a DC path and no sources form a loop.
    const circuit = circuitOf([
      { kind: 'isrc', name: 'i1', from: 'gnd', to: 'a', dc: 1e-6 },
      { kind: 'res', name: 'r1', a: 'a', b: 'b', value: 1e-12 },
      { kind: 'res', name: 'r2', a: 'b', b: 'gnd', value: 1e15 },
    ]);
    const r = solveOperatingPoint(circuit) as OpFailure;
    expect(r.failed).toBe(true);
    expect(r.errors[0].code).toBe('op-numerically-singular');
    expect(r.errors[0].message).toContain('numerical');
    expect(r.errors[0].message).not.toContain('no DC path');
  });

  it('a circuit whose topology is broken is still told so (op-singular)', () => {
    const circuit = circuitOf(
      [
        { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: 1 },
        { kind: 'res', name: 'r1', a: 'a', b: 'gnd', value: 1e3 },
        { kind: 'res', name: 'r2', a: 'x', b: 'y', value: 1e3 },
        { kind: 'isrc', name: 'i1', from: 'x', to: 'y', dc: 1e-3 },
      ],
      { minG: 0 },
    );
    const r = solveOperatingPoint(circuit) as OpFailure;
    expect(r.errors[0].code).toBe('op-singular');
  });
});

describe('the symbolic analysis is reused', () => {
  it('across runs of the same circuit shape with other values (a sweep or Monte Carlo run elaborates a new circuit)', () => {
    // A ladder of 80 sections: a series resistor, a diode to ground at each node.
    const ladder = (r: number) => {
      const parts: PartSpec[] = [{ kind: 'vsrc', name: 'v1', p: 'n0', n: 'gnd', dc: 5 }];
      for (let k = 1; k <= 80; k++) {
        parts.push({ kind: 'res', name: `r${k}`, a: `n${k - 1}`, b: `n${k}`, value: r });
        parts.push({ kind: 'diode', name: `d${k}`, a: `n${k}`, k: 'gnd', model: diodeModel(), area: 1 });
      }
      return circuitOf(parts);
    };
    const a = ladder(1e3);
    const b = ladder(1.1e3);
    const wsA = new NewtonWorkspace(a);
    expect(isOpFailure(solveWithWorkspace(wsA))).toBe(false);
    const wsB = new NewtonWorkspace(b);
    // One pattern (circuit-shape.ts), one ordering for both, and the second run's LU starts from the first run's pivot order.
    expect(symbolicFor(wsB.pattern)).toBe(symbolicFor(wsA.pattern));
    const luB = wsB.solver as SparseRealLu;
    expect(luB.hasPivotOrder).toBe(true);
    expect(isOpFailure(solveWithWorkspace(wsB))).toBe(false);
    expect(luB.fullFactorizations).toBeLessThanOrEqual((wsA.solver as SparseRealLu).fullFactorizations);
  });
});

describe('sparse and dense engines agree', () => {
  it('AC and transposed AC of a 100-stage chain: the sparse LU against the dense one (relative 1e-10)', () => {
    const circuit = npnChain(100);
    const op = solveOperatingPoint(circuit) as OperatingPoint;
    const system = linearize(circuit, op);
    expect(system.size).toBeGreaterThan(200);
    const sparse = createAcSolver(system, 'sparse');
    const dense = createAcSolver(system, 'dense');
    const drive = { sources: new Map([['vin', { re: 1, im: 0 }]]) };
    for (const f of [0, 1e3, 1e6]) {
      const [a] = sparse.solve(f, [drive]);
      const [b] = dense.solve(f, [drive]);
      for (const node of ['b0', 'c0', 'b1', 'c1', 'c99']) {
        expectNearlyEqual(a.v(node).re, b.v(node).re, 1e-10, 1e-15, `${node} re at ${f} Hz`);
        expectNearlyEqual(a.v(node).im, b.v(node).im, 1e-10, 1e-15, `${node} im at ${f} Hz`);
      }
      const e = new Float64Array(system.size);
      e[system.nodeIndex.get('c1')!] = 1;
      const ya = sparse.solveTransposed(f, e, new Float64Array(system.size));
      const yb = dense.solveTransposed(f, e, new Float64Array(system.size));
      expect(ya.singular || yb.singular).toBe(false);
      // Entries that are zero in exact arithmetic come out as rounding noise of the largest.
      const floor = 1e-12 * Math.max(...Array.from(yb.re, Math.abs), ...Array.from(yb.im, Math.abs));
      for (let i = 0; i < system.size; i++) {
        expectNearlyEqual(ya.re[i], yb.re[i], 1e-10, floor, `adjoint re ${i} at ${f} Hz`);
        expectNearlyEqual(ya.im[i], yb.im[i], 1e-10, floor, `adjoint im ${i} at ${f} Hz`);
      }
    }
  });

  it('keeps the dense G and C of a linearised system available (built from the sparse storage)', () => {
    const circuit = npnChain(3);
    const op = solveOperatingPoint(circuit) as OperatingPoint;
    const system = linearize(circuit, op);
    const n = system.size;
    expect(system.G.length).toBe(n * n);
    expect(system.C.length).toBe(n * n);
    const { pattern, g } = system.sparse!;
    for (let j = 0; j < n; j++) {
      for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) expect(system.G[pattern.rowIdx[p] * n + j]).toBe(g[p]);
    }
    // A hand-written system (dense G and C only) is solved as well.
    const byHand = { ...system, sparse: undefined, G: system.G, C: system.C };
    const drive = { sources: new Map([['vin', { re: 1, im: 0 }]]) };
    const [a] = createAcSolver(byHand).solve(1e3, [drive]);
    const [b] = createAcSolver(system).solve(1e3, [drive]);
    expectNearlyEqual(a.v('c2').re, b.v('c2').re, 1e-12, 1e-15, 'c2');
  });
});
