import { describe, expect, it } from 'vitest';
import type { PortsRequest } from '../circuit/analyses';
import type { Circuit } from '../circuit/types';
import { createAcSolver } from './ac-solve';
import { isOpFailure, solveOperatingPoint } from './operating-point';
import { CMRR_CAP, analyzePorts, cmrrOf } from './ports';
import { linearize } from './small-signal';
import { bjtModel, circuitOf } from './test-circuits';
import { inputImpedance, outputImpedance } from '../measure/impedance';
import { logSweep } from './frequency';
import { solveNetlist } from '../solve';
import { expectNearlyEqual } from '../testing/nearly-equal';

/** Resistor-tail npn pair: RC = 5 kΩ per side, RT = 10 kΩ, ±10 V rails (default model, va = ∞). */
function pair(rc = 5e3, rt = 10e3, cjc = 0): Circuit {
  const model = bjtModel({ cjc });
  return circuitOf([
    { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
    { kind: 'vsrc', name: 'vee', p: 'vee', n: 'gnd', dc: -10 },
    { kind: 'vsrc', name: 'va', p: 'ina', n: 'gnd', dc: 0 },
    { kind: 'vsrc', name: 'vb', p: 'inb', n: 'gnd', dc: 0 },
    { kind: 'res', name: 'rca', a: 'vcc', b: 'outa', value: rc },
    { kind: 'res', name: 'rcb', a: 'vcc', b: 'outb', value: rc },
    { kind: 'npn', name: 'q1', c: 'outa', b: 'ina', e: 'tail', model, area: 1 },
    { kind: 'npn', name: 'q2', c: 'outb', b: 'inb', e: 'tail', model, area: 1 },
    { kind: 'res', name: 'rt', a: 'tail', b: 'vee', value: rt },
  ]);
}

function solved(c: Circuit) {
  const op = solveOperatingPoint(c);
  if (isOpFailure(op)) throw new Error(JSON.stringify(op.errors));
  const system = linearize(c, op);
  return { op, system, solver: createAcSolver(system) };
}

const loc = { line: 3, col: 1 };
const req = (outN?: string, atHz = 0): PortsRequest => ({ inP: 'va', inN: 'vb', outP: 'outa', outN, atHz, loc });

describe('ports', () => {
  // Sedra & Smith, Microelectronic Circuits, 7th ed., §9.2–9.3 (BJT differential pair):
  // differential output adm = −gm·RC; common-mode half circuit with 2·RT in the emitter:
  // acm(single side) = −gm·RC / (1 + (gm + gπ)·2RT). With the model's own gm and rπ these hold
  // exactly for the hybrid-pi circuit, so the tolerance is rounding only.
  it('resistor-tail pair: adm, acm and CMRR from the half circuits', () => {
    const { op, system, solver } = solved(pair());
    const q1 = op.report.devices.q1 as { gm: number; rpi: number };
    const rc = 5e3;
    const rt = 10e3;
    const acmExpected = (-q1.gm * rc) / (1 + (q1.gm + 1 / q1.rpi) * 2 * rt);
    const diff = analyzePorts(system, solver, req('outb'));
    expect(diff.result?.output).toBe('differential');
    expectNearlyEqual(diff.result!.adm.re, -q1.gm * rc, 5e-7, 0);
    // voc = (v(outa) + v(outb))/2 moves like one side: the same acm as the single-ended output.
    expectNearlyEqual(diff.result!.acm.re, acmExpected, 5e-7, 0);
    expectNearlyEqual(diff.result!.cmrr, (q1.gm * rc) / Math.abs(acmExpected), 5e-7, 0);
    expect(diff.result!.cmrr_db).toBeCloseTo(20 * Math.log10(diff.result!.cmrr), 9);

    const single = analyzePorts(system, solver, req());
    expect(single.result!.output).toBe('single-ended');
    expectNearlyEqual(single.result!.adm.re, (-q1.gm * rc) / 2, 5e-7, 0);
    expectNearlyEqual(single.result!.acm.re, acmExpected, 5e-7, 0);
    expectNearlyEqual(single.result!.cmrr, Math.abs(single.result!.adm.re / single.result!.acm.re), 5e-10, 0);
    expect(single.result!.adm.phase_deg).toBe(180);
    expect(single.result!.conventions).toMatch(/vid = va − vb/);
  });

  // An ideal current-source tail (infinite output resistance): the common mode cannot move the
  // collectors, so acm is zero but for the min_g leakage; CMRR is huge yet finite.
  it('ideal current-source tail gives a huge, finite CMRR', () => {
    const c = pair();
    const parts = c.parts.filter((p) => p.name !== 'rt');
    parts.push({ kind: 'isrc', name: 'itail', from: 'tail', to: 'vee', dc: 2e-3, loc });
    const { system, solver } = solved({ ...c, parts });
    const out = analyzePorts(system, solver, req('outb'));
    expect(out.result!.cmrr_db).toBeGreaterThan(150);
    expect(out.result!.cmrr_db).toBeLessThanOrEqual(300);
    expect(Number.isFinite(out.result!.acm.db)).toBe(true);
  });

  it('curves over an ac sweep agree with the figure at low frequency and roll off with cjc (Miller capacitance at the collector)', () => {
    const { system, solver } = solved(pair(5e3, 10e3, 2e-12));
    const sweep = logSweep(1e3, 1e10, 10);
    const out = analyzePorts(system, solver, req(), sweep);
    expect(out.curves).toBeDefined();
    expectNearlyEqual(out.curves!.adm.mag[0], out.result!.adm.mag, 5e-5, 0);
    expect(out.curves!.adm.mag[sweep.length - 1]).toBeLessThan(out.curves!.adm.mag[0] / 10);
    expect(out.curves!.cmrr.phase_deg.every((p) => p === 0)).toBe(true);
  });

  it('unknown names on the ports line are reported once, where the line is resolved', () => {
    const text = [
      'vcc: vsrc(vcc, gnd) 10', 'va: vsrc(ina, gnd) 0', 'vb: vsrc(inb, gnd) 0',
      'ra: res(vcc, outa) 1k', 'rb: res(vcc, outb) 1k', 'r1: res(ina, outa) 1k', 'r2: res(inb, outb) 1k',
      'ports in=(va, vbb) out=(outc, outb)',
    ].join('\n');
    const result = solveNetlist(text);
    expect(result.ports).toBeUndefined();
    expect(result.errors.map((d) => [d.line, d.code])).toEqual([[8, 'unknown-name'], [8, 'unknown-node']]);
    expect(result.errors[0].hint).toMatch(/vb/);
  });

  it('cmrrOf guards zero gains', () => {
    expect(cmrrOf({ re: 10, im: 0 }, { re: 0, im: 0 }).cmrr).toBe(CMRR_CAP);
    expect(cmrrOf({ re: 0, im: 0 }, { re: 0, im: 0 })).toMatchObject({ cmrr: 1, silent: true });
    expect(cmrrOf({ re: 379, im: 0 }, { re: -1, im: 0 }).cmrr).toBe(379);
  });
});

describe('zin and zout', () => {
  // Ohm's law: a source driving a resistor sees that resistor, positive.
  it('zin of a voltage source and of a current source driving a resistor is +R', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'vs', p: 'a', n: 'gnd', dc: 1 },
      { kind: 'res', name: 'r1', a: 'a', b: 'gnd', value: 4.7e3 },
      { kind: 'isrc', name: 'is', from: 'gnd', to: 'b', dc: 1e-3 },
      { kind: 'res', name: 'r2', a: 'b', b: 'gnd', value: 2.2e3 },
      { kind: 'isrc', name: 'is2', from: 'c', to: 'gnd', dc: 1e-3 },
      { kind: 'res', name: 'r3', a: 'c', b: 'gnd', value: 330 },
    ]);
    const { system, solver } = solved(c);
    // min_g (1e-12 S from every node to ground) leaks in parallel: a few parts in 1e9.
    expectNearlyEqual(inputImpedance(system, solver, 'vs', 0).re, 4.7e3, 5e-7, 0);
    expectNearlyEqual(inputImpedance(system, solver, 'is', 0).re, 2.2e3, 5e-7, 0);
    expectNearlyEqual(inputImpedance(system, solver, 'is2', 0).re, 330, 5e-7, 0);
    expect(() => inputImpedance(system, solver, 'vz', 0)).toThrow(/no independent source/);
  });

  // Series RC seen by the source: Z = R + 1/(jωC).
  it('zin is complex at a frequency', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'vs', p: 'a', n: 'gnd', dc: 0 },
      { kind: 'res', name: 'r1', a: 'a', b: 'm', value: 1e3 },
      { kind: 'cap', name: 'c1', a: 'm', b: 'gnd', value: 1e-9 },
    ]);
    const { system, solver } = solved(c);
    const f = 1e5;
    const z = inputImpedance(system, solver, 'vs', f);
    expectNearlyEqual(z.re, 1e3, 5e-7, 0);
    expectNearlyEqual(z.im, -1 / (2 * Math.PI * f * 1e-9), 5e-7, 0);
  });

  // Divider Thevenin resistance: R1‖R2 with the source shorted.
  it('zout of a divider is R1‖R2', () => {
    const c = circuitOf([
      { kind: 'vsrc', name: 'vs', p: 'a', n: 'gnd', dc: 10 },
      { kind: 'res', name: 'r1', a: 'a', b: 'o', value: 10e3 },
      { kind: 'res', name: 'r2', a: 'o', b: 'gnd', value: 40e3 },
    ]);
    const { system, solver } = solved(c);
    expectNearlyEqual(outputImpedance(system, solver, 'o', 0).re, 8e3, 5e-7, 0);
    expect(() => outputImpedance(system, solver, 'gnd', 0)).toThrow(/reference node/);
  });
});
