/**
 * Shapes (layout and pattern) are shared between circuits that differ only in values, and a
 * workspace handed back and lent again for another circuit of the shape solves it exactly as a
 * new one would: nothing of the circuit before leaks into the next solve.
 */
import { describe, expect, it } from 'vitest';
import type { Circuit, Part } from '../circuit/types';
import { createAcSolver } from './ac-solve';
import { circuitShape } from './circuit-shape';
import { borrowWorkspace, NewtonWorkspace, releaseWorkspace } from './newton';
import { isOpFailure, solveWithWorkspace } from './operating-point';
import { linearize } from './small-signal';
import { bjtModel, circuitOf } from './test-circuits';
import type { OperatingPoint } from './engine-api';

/** A resistor-loaded bipolar pair (the run tests' pair, written as parts). */
function pair(rb = 0): Circuit {
  const qn = bjtModel({ is: 1e-16, beta: 100, va: 80, rb });
  return circuitOf([
    { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
    { kind: 'vsrc', name: 'vee', p: 'vee', n: 'gnd', dc: -10 },
    { kind: 'vsrc', name: 'va', p: 'ina', n: 'gnd', dc: 0 },
    { kind: 'vsrc', name: 'vb', p: 'inb', n: 'gnd', dc: 0 },
    { kind: 'npn', name: 'q1', c: 'outa', b: 'ina', e: 'tail', model: qn, area: 1 },
    { kind: 'npn', name: 'q2', c: 'outb', b: 'inb', e: 'tail', model: qn, area: 1 },
    { kind: 'res', name: 'rca', a: 'vcc', b: 'outa', value: 5e3 },
    { kind: 'res', name: 'rcb', a: 'vcc', b: 'outb', value: 5e3 },
    { kind: 'res', name: 'rtail', a: 'tail', b: 'vee', value: 4.65e3 },
  ]);
}

/** The same circuit object graph with each part copied and its values changed (as a mismatch run makes). */
function revalued(c: Circuit, factor: number, temp = c.options.temp): Circuit {
  const parts = c.parts.map((p): Part => {
    if (p.kind === 'res') return { ...p, value: p.value * factor };
    if (p.kind === 'npn') return { ...p, model: { ...p.model, is: p.model.is * factor, beta: p.model.beta / factor } };
    if (p.kind === 'vsrc' && p.name === 'va') return { ...p, dc: 1e-3 * factor };
    return { ...p };
  });
  return { ...c, parts, options: { ...c.options, temp } };
}

function solved(ws: NewtonWorkspace): OperatingPoint {
  const op = solveWithWorkspace(ws);
  if (isOpFailure(op)) throw new Error(op.errors[0]?.message);
  return op;
}

describe('circuit shapes', () => {
  it('are one for circuits that differ only in values, whether found by the nodes array or by the key', () => {
    const a = pair();
    const b = revalued(a, 1.3, 85);
    expect(circuitShape(b)).toBe(circuitShape(a));
    // A circuit elaborated again (a new nodes array) finds the shape by its key.
    expect(circuitShape(pair())).toBe(circuitShape(a));
  });

  it('differ when a node, a name or a base resistance differs', () => {
    const a = pair();
    const moved: Circuit = { ...a, parts: a.parts.map((p) => (p.name === 'rtail' ? { ...p, b: 'gnd' } : p)) };
    const renamed: Circuit = { ...a, parts: a.parts.map((p) => (p.name === 'vb' ? { ...p, name: 'vin' } : p)) };
    expect(circuitShape(moved).pattern).not.toBe(circuitShape(a).pattern);
    expect(circuitShape(renamed).layout.branchIndex.has('vin')).toBe(true);
    // A base resistance adds each transistor's internal base node: two more unknowns.
    expect(circuitShape(pair(100)).layout.size).toBe(circuitShape(a).layout.size + 2);
  });
});

describe('lent workspaces', () => {
  it('solve a circuit of the shape exactly as a new workspace does, at another temperature and other values', () => {
    const a = pair();
    const first = borrowWorkspace(a);
    solved(first);
    releaseWorkspace(first);
    for (const [factor, temp] of [[1.2, 85], [0.8, -40], [1, 27]] as const) {
      const c = revalued(a, factor, temp);
      const lent = borrowWorkspace(c);
      expect(lent).toBe(first);
      const fresh = solved(new NewtonWorkspace(c, 'auto'));
      const again = solved(lent);
      releaseWorkspace(lent);
      // Bit for bit: the same equations from the same cold start (the LU's pivot order may differ, hence 1e-12).
      for (let i = 0; i < fresh.x.length; i++) expect(Math.abs(again.x[i] - fresh.x[i])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(fresh.x[i])));
      expect(again.report.devices.q1).toEqual(expect.objectContaining({ region: fresh.report.devices.q1.region }));
    }
  });

  it('are never lent twice at once', () => {
    const a = pair();
    const one = borrowWorkspace(a);
    const two = borrowWorkspace(revalued(a, 1.1));
    expect(two).not.toBe(one);
    // The first circuit's workspace still solves its own circuit.
    expect(one.circuit).toBe(a);
    releaseWorkspace(one);
    releaseWorkspace(two);
  });
});

describe('released AC solvers', () => {
  it('lend their LU to the next solver of the shape, which gives the same solution, and refuse to be used again', () => {
    const a = pair();
    const b = revalued(a, 1.2);
    const at = (c: Circuit) => linearize(c, solved(new NewtonWorkspace(c)));
    const excitation = { injections: new Map([['outa', { re: 1e-6, im: 0 }]]) };
    const first = createAcSolver(at(a));
    first.solve(1e6, [excitation]);
    first.release();
    expect(() => first.solve(1e6, [excitation])).toThrow(/after it was released/);
    const lent = createAcSolver(at(b)).solve(1e6, [excitation])[0].v('outa');
    const fresh = createAcSolver(at(b), 'sparse').solve(1e6, [excitation])[0].v('outa');
    expect(Math.abs(lent.re - fresh.re)).toBeLessThanOrEqual(1e-12 * Math.abs(fresh.re));
    expect(Math.abs(lent.im - fresh.im)).toBeLessThanOrEqual(1e-12 * Math.abs(fresh.re) + 1e-18);
  });
});

