/**
 * The operating-point ladder's robustness: KCL at every converged point of random networks,
 * clean failures naming nodes, regions and warnings, and the stepping fallbacks.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { GROUND, type Circuit } from '../circuit/types';
import type { BjtOp } from '../circuit/result';
import type { OperatingPoint, OpFailure } from './engine-api';
import { kclBalances } from './kcl';
import { ABS_CURRENT_TOL } from './newton';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { bjtModel, circuitOf, diodeModel, mosModel, type PartSpec } from './test-circuits';
import { expectNearlyEqual } from '../testing/nearly-equal';

/** True when every number reachable in `v` is finite. */
function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

const networkArb = fc
  .record({
    nodes: fc.integer({ min: 1, max: 6 }),
    supply: fc.double({ min: -12, max: 12, noNaN: true }),
    grounds: fc.array(fc.double({ min: 2, max: 6, noNaN: true }), { minLength: 6, maxLength: 6 }),
    elements: fc.array(
      fc.record({
        kind: fc.constantFrom('res', 'diode', 'npn', 'pnp', 'nmos', 'pmos', 'isrc', 'vsrc'),
        pins: fc.array(fc.nat(20), { minLength: 4, maxLength: 4 }),
        value: fc.double({ min: 0, max: 1, noNaN: true }),
      }),
      { minLength: 1, maxLength: 10 },
    ),
  })
  .map(({ nodes, supply, grounds, elements }) => {
    // Devices see the supply only through resistors: a junction straight across a stiff source
    // would carry kiloamperes, whose cancelling exponentials no double can balance to 1e-9.
    const node = (i: number) => (i % (nodes + 1) === 0 ? GROUND : `n${i % (nodes + 1)}`);
    const parts: PartSpec[] = [
      { kind: 'vsrc', name: 'vs', p: 'vcc', n: GROUND, dc: supply },
      { kind: 'res', name: 'rs', a: 'vcc', b: 'n1', value: 100 * grounds[5] },
    ];
    for (let i = 1; i <= nodes; i++) parts.push({ kind: 'res', name: `rg${i}`, a: `n${i}`, b: GROUND, value: Math.pow(10, grounds[i - 1]) });
    let vsources = 0;
    elements.forEach((e, k) => {
      const [a, b, c, d] = e.pins.map(node);
      const name = `e${k}`;
      if (e.kind === 'res' && a !== b) parts.push({ kind: 'res', name, a, b, value: Math.pow(10, 2 + 4 * e.value) });
      if (e.kind === 'diode' && a !== b) parts.push({ kind: 'diode', name, a, k: b, model: diodeModel(), area: 1 });
      if (e.kind === 'isrc' && a !== b) parts.push({ kind: 'isrc', name, from: a, to: b, dc: 1e-3 * (e.value - 0.5) });
      if (e.kind === 'vsrc' && a !== b && vsources++ === 0) {
        // One extra source, in series with a resistor so no source loop can form.
        parts.push({ kind: 'vsrc', name, p: `s${k}`, n: b, dc: 5 * (e.value - 0.5) });
        parts.push({ kind: 'res', name: `${name}r`, a: `s${k}`, b: a, value: 1000 });
      }
      if (e.kind === 'nmos' || e.kind === 'pmos') {
        const model = mosModel({ lambda: 0.2 * e.value, gamma: e.value > 0.5 ? 0.4 : 0, phi: 0.7 });
        parts.push({ kind: e.kind, name, d: a, g: b, s: c, b: e.value > 0.7 ? d : c, model, w: 1e-6 + 20e-6 * e.value, l: 1e-6, m: 1 });
      }
      if (e.kind === 'npn' || e.kind === 'pnp') parts.push({ kind: e.kind, name, c: a, b, e: c, model: bjtModel({ beta: 20 + 200 * e.value, va: e.value > 0.5 ? 50 : Infinity }), area: 1 });
    });
    return circuitOf(parts);
  });

describe('KCL at every converged operating point', () => {
  it('holds at every node of random resistor/source/diode/bipolar/MOS networks, residual < 1e-9 relative (Kirchhoff)', () => {
    let converged = 0;
    fc.assert(
      fc.property(networkArb, (c: Circuit) => {
        let r: OperatingPoint | OpFailure | undefined;
        expect(() => (r = solveOperatingPoint(c))).not.toThrow();
        if (isOpFailure(r!)) {
          expect(r.errors.length).toBeGreaterThan(0);
          expect(r.errors[0].message.length).toBeGreaterThan(10);
          return;
        }
        converged++;
        expect(allFinite(r!.report)).toBe(true);
        // Relative to the currents meeting at each node, with the solver's absolute current
        // floor (1e-15 A) for nodes where nothing flows.
        for (const [, b] of kclBalances(c, r!.report)) expect(Math.abs(b.residual)).toBeLessThanOrEqual(1e-9 * b.scale + ABS_CURRENT_TOL);
      }),
      { numRuns: 300, seed: 7 },
    );
    // The property must have been exercised, not vacuously true.
    expect(converged).toBeGreaterThanOrEqual(295);
  });
});

describe('failures are diagnostics, never exceptions', () => {
  it('names the worst nodes and what was tried when Newton cannot converge', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
        { kind: 'res', name: 'r1', a: 'vcc', b: 'a', value: 100 },
        { kind: 'diode', name: 'd1', a: 'a', k: 'b', model: diodeModel(), area: 1 },
        { kind: 'diode', name: 'd2', a: 'b', k: 'gnd', model: diodeModel(), area: 1 },
      ],
      { maxIter: 2 },
    );
    const r = solveOperatingPoint(c);
    expect(isOpFailure(r)).toBe(true);
    const e = (r as OpFailure).errors[0];
    expect(e.code).toBe('op-no-convergence');
    // The nodes still out of balance and the devices still moving are named (messages are ours).
    expect(e.message).toMatch(/do not add up at (a|b) \(/);
    expect(e.message).toMatch(/d1 \(VD swinging by .*d2 \(VD|d2 \(VD swinging by .*d1 \(VD/);
    expect(e.message).toMatch(/Newton–Raphson/);
    expect(e.message).toMatch(/gmin stepping/);
    expect(e.message).toMatch(/source stepping/);
    expect(e.line).toBeGreaterThan(0);
  });

  it('solves the same circuit with the default iteration limit', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
      { kind: 'res', name: 'r1', a: 'vcc', b: 'a', value: 100 },
      { kind: 'diode', name: 'd1', a: 'a', k: 'b', model: diodeModel(), area: 1 },
      { kind: 'diode', name: 'd2', a: 'b', k: 'gnd', model: diodeModel(), area: 1 },
    ]);
    const r = solveOperatingPoint(c) as OperatingPoint;
    expect(r.method).toBe('newton');
    // Shockley: both diodes carry the same current, VD = VT·ln(ID/IS + 1) (Sedra & Smith, 7th ed., §4.2, from memory).
    const d = r.report.devices.d1;
    expect(d.kind).toBe('diode');
    if (d.kind === 'diode') {
      const vt = (1.380649e-23 * 300.15) / 1.602176634e-19;
      expect(Math.abs(d.vd - vt * Math.log(d.id / 1e-14 + 1))).toBeLessThan(1e-12);
      expectNearlyEqual(d.id, (10 - r.report.nodes.a) / 100, 1e-9, 0);
    }
  });

  it('reports a node with no DC path as a singular system, naming it', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: 1 },
        { kind: 'cap', name: 'c1', a: 'a', b: 'float', value: 1e-12 },
        { kind: 'cap', name: 'c2', a: 'float', b: 'gnd', value: 1e-12 },
      ],
      { minG: 0 },
    );
    const r = solveOperatingPoint(c) as OpFailure;
    expect(r.failed).toBe(true);
    expect(r.errors[0].code).toBe('op-singular');
    expect(r.errors[0].message).toContain('float');
  });

  it('reports a loop of voltage sources as singular', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: 1 },
      { kind: 'vsrc', name: 'v2', p: 'a', n: 'gnd', dc: 2 },
    ]);
    const r = solveOperatingPoint(c) as OpFailure;
    expect(r.errors[0].code).toBe('op-singular');
  });

  it('refuses non-finite values with a diagnostic instead of NaN', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: NaN },
      { kind: 'res', name: 'r1', a: 'a', b: 'gnd', value: 1 },
    ]);
    const r = solveOperatingPoint(c) as OpFailure;
    expect(r.errors[0].code).toBe('bad-value');
    expect(r.errors[0].message).toContain('v1');
  });

  it('refuses a temperature at or below absolute zero', () => {
    const c = circuitOf([{ kind: 'diode', name: 'd1', a: 'a', k: 'gnd', model: diodeModel(), area: 1 }], { temp: -273.15 });
    expect((solveOperatingPoint(c) as OpFailure).errors[0].code).toBe('bad-temperature');
  });

  it('solves a circuit without nodes to an empty report', () => {
    const r = solveOperatingPoint(circuitOf([])) as OperatingPoint;
    expect(r.report).toEqual({ nodes: {}, sources: {}, parts: {}, devices: {} });
  });

  it('keeps a zero-ohm resistor finite', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: 1 },
      { kind: 'res', name: 'r0', a: 'a', b: 'b', value: 0 },
      { kind: 'res', name: 'r1', a: 'b', b: 'gnd', value: 1000 },
    ]);
    const r = solveOperatingPoint(c) as OperatingPoint;
    expect(allFinite(r.report)).toBe(true);
    expect(Math.abs(r.report.nodes.b - 1)).toBeLessThan(1e-6);
  });
});

describe('regions and warnings', () => {
  const sat = circuitOf([
    { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 5 },
    { kind: 'res', name: 'rb', a: 'vcc', b: 'b', value: 10e3 },
    { kind: 'res', name: 'rc', a: 'vcc', b: 'c', value: 10e3, loc: { line: 12, col: 3 } },
    { kind: 'npn', name: 'q1', c: 'c', b: 'b', e: 'gnd', model: bjtModel(), area: 1, loc: { line: 7, col: 1 } },
  ]);

  it('flags a saturated bipolar at its own line', () => {
    const r = solveOperatingPoint(sat) as OperatingPoint;
    const q = r.report.devices.q1 as BjtOp;
    expect(q.region).toBe('saturated');
    expect(q.vce).toBeLessThan(0.3);
    expect(r.warnings).toHaveLength(1);
    expect(r.warnings[0]).toMatchObject({ severity: 'warning', code: 'bjt-saturated', line: 7, col: 1 });
    expect(r.warnings[0].message).toContain('q1');
  });

  it('flags reverse-active and cut-off bipolars', () => {
    const rev = circuitOf([
      { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 5 },
      { kind: 'res', name: 'rb', a: 'vcc', b: 'b', value: 100e3 },
      { kind: 'res', name: 're', a: 'vcc', b: 'e', value: 10e3 },
      // Collector and emitter swapped: the collector junction is the forward one.
      { kind: 'npn', name: 'q1', c: 'gnd', b: 'b', e: 'e', model: bjtModel(), area: 1 },
      { kind: 'npn', name: 'q2', c: 'vcc', b: 'gnd', e: 'gnd', model: bjtModel(), area: 1 },
    ]);
    const r = solveOperatingPoint(rev) as OperatingPoint;
    expect((r.report.devices.q1 as BjtOp).region).toBe('reverse');
    expect((r.report.devices.q2 as BjtOp).region).toBe('cutoff');
    expect(r.warnings.map((w) => w.code).sort()).toEqual(['bjt-cutoff', 'bjt-reverse']);
  });
});

describe('stepping fallbacks', () => {
  /** A stack of diode-connected transistors hit hard from a stiff supply: plain Newton needs many steps. */
  const stack = (maxIter: number) => {
    const parts: PartSpec[] = [
      { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 30 },
      { kind: 'res', name: 'r1', a: 'vcc', b: 'n0', value: 10 },
    ];
    for (let i = 0; i < 6; i++) {
      const below = i === 5 ? 'gnd' : `n${i + 1}`;
      parts.push({ kind: 'npn', name: `q${i}`, c: `n${i}`, b: `n${i}`, e: below, model: bjtModel(), area: 1 });
    }
    return circuitOf(parts, { maxIter });
  };

  it('falls back to gmin or source stepping when Newton runs out of iterations, and agrees with plain Newton', () => {
    const reference = solveOperatingPoint(stack(200)) as OperatingPoint;
    expect(reference.method).toBe('newton');
    const limit = reference.iterations - 1;
    const stepped = solveOperatingPoint(stack(limit));
    expect(isOpFailure(stepped)).toBe(false);
    const s = stepped as OperatingPoint;
    expect(['gmin-stepping', 'source-stepping']).toContain(s.method);
    for (const n of Object.keys(reference.report.nodes)) {
      expect(Math.abs(s.report.nodes[n] - reference.report.nodes[n])).toBeLessThan(1e-9);
    }
  });
});
