/**
 * DC transfer sweeps: warm-started points, fallback, and clean errors.
 */
import { describe, expect, it } from 'vitest';
import type { DiodeOp, MosOp } from '../circuit/result';
import { thermalVoltage } from '../devices/temperature';
import { dcSweep } from './dc-sweep';
import type { OperatingPoint } from './engine-api';
import { solveOperatingPoint } from './operating-point';
import { circuitOf, diodeModel, mosModel } from './test-circuits';

const diodeCircuit = (minG = 0) =>
  circuitOf(
    [
      { kind: 'isrc', name: 'ib', from: 'gnd', to: 'a', dc: 1e-3 },
      { kind: 'diode', name: 'd1', a: 'a', k: 'gnd', model: diodeModel(), area: 1 },
    ],
    { minG },
  );

describe('dcSweep', () => {
  it('follows VD = VT·ln(I/IS + 1) across six decades of current (Shockley; Sedra & Smith, 7th ed., §4.2, from memory)', () => {
    const values = [1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3];
    const sweep = dcSweep(diodeCircuit(), 'ib', values);
    expect(sweep.errors).toEqual([]);
    expect(sweep.x).toEqual(values);
    const vt = thermalVoltage(27);
    sweep.points.forEach((p, k) => {
      expect(Math.abs(p.nodes.a - vt * Math.log(values[k] / 1e-14 + 1))).toBeLessThan(1e-12);
      expect(Math.abs((p.devices.d1 as DiodeOp).id - values[k]) / values[k]).toBeLessThan(1e-12);
      expect(p.parts.ib.i).toBe(values[k]);
    });
  });

  it('traces the MOS square law ID = ½·k·(VGS − Vth)² over a gate sweep, through cut-off (Razavi, 2nd ed., ch. 2, from memory)', () => {
    const c = circuitOf(
      [
        { kind: 'vsrc', name: 'vg', p: 'g', n: 'gnd', dc: 0 },
        { kind: 'vsrc', name: 'vdd', p: 'd', n: 'gnd', dc: 5 },
        { kind: 'nmos', name: 'm1', d: 'd', g: 'g', s: 'gnd', b: 'gnd', model: mosModel(), w: 10e-6, l: 1e-6, m: 1 },
      ],
      { minG: 0 },
    );
    const values = Array.from({ length: 31 }, (_, k) => k * 0.1);
    const sweep = dcSweep(c, 'vg', values);
    expect(sweep.errors).toEqual([]);
    sweep.points.forEach((p, k) => {
      const vov = Math.max(values[k] - 0.5, 0);
      const id = (p.devices.m1 as MosOp).id;
      expect(Math.abs(id - 0.5 * 1e-3 * vov * vov)).toBeLessThan(1e-15 + 1e-12 * id);
    });
  });

  it('starts from a given operating point and leaves the original circuit untouched', () => {
    const c = diodeCircuit(1e-12);
    const start = solveOperatingPoint(c) as OperatingPoint;
    const sweep = dcSweep(c, 'ib', [2e-3, 3e-3], start);
    expect(sweep.points).toHaveLength(2);
    expect(c.parts[0].kind === 'isrc' && c.parts[0].dc).toBe(1e-3);
  });

  it('refuses a name that is not an independent source (the transfer line is checked where it is resolved)', () => {
    expect(() => dcSweep(diodeCircuit(), 'd1', [1])).toThrow(/d1/);
    expect(() => dcSweep(diodeCircuit(), 'nope', [1])).toThrow(/nope/);
  });

  it('drops a point that cannot be solved and says which, keeping the others', () => {
    const sweep = dcSweep(diodeCircuit(), 'ib', [1e-3, NaN, 2e-3]);
    expect(sweep.x).toEqual([1e-3, 2e-3]);
    expect(sweep.points).toHaveLength(2);
    expect(sweep.errors).toHaveLength(1);
    expect(sweep.errors[0].code).toBe('transfer-point');
  });

  it('falls back to the full ladder when a warm start fails (reverse current into a diode, then forward again)', () => {
    // The jump from deep reverse (node near −1e9 V with only min_g) back to forward is far
    // outside a warm start's reach; the point must still be solved.
    const sweep = dcSweep(diodeCircuit(1e-12), 'ib', [1e-3, -1e-3, 1e-3]);
    expect(sweep.errors).toEqual([]);
    expect(sweep.points[1].nodes.a).toBeLessThan(-1e8);
    expect(Math.abs(sweep.points[2].nodes.a - sweep.points[0].nodes.a)).toBeLessThan(1e-12);
  });
});
