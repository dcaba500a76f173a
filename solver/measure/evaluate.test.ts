import { describe, expect, it } from 'vitest';
import type { CheckRequest, MeasureRequest } from '../circuit/analyses';
import type { OpResult } from '../circuit/result';
import { evaluateMeasures } from './evaluate';
import { parseNetlist } from '../elaborate/parse-netlist';
import type { MeasureContext } from './functions';

// A hand-written operating point: two matched transistors of a pair at 1 mA each.
const op: OpResult = {
  nodes: { outa: 7.6, outb: 7.6, tail: -0.72 },
  sources: { vcc: { v: 10, i: -0.002 } },
  parts: { rc1: { i: 0.001, v: 2.4 } },
  devices: {
    q1: { kind: 'npn', region: 'active', ic: 1e-3, ib: 1e-5, ie: 1.01e-3, vbe: 0.72, vce: 8.32, gm: 0.0387, rpi: 2585, ro: 80e3, cpi: 1e-12, cmu: 5e-13, rb: 0 },
    m1: { kind: 'nmos', region: 'saturation', id: 2e-4, vgs: 0.9, vds: 1.5, vov: 0.4, vth: 0.5, gm: 1e-3, gds: 1e-5, gmb: 0, cgs: 1e-14, cgd: 2e-15 },
  },
};

let line = 0;
const m = (name: string, expr: string): MeasureRequest => ({ name, expr, source: expr, loc: { line: ++line, col: 1 } });
const c = (lhs: string, op: CheckRequest['op'], rhs: string): CheckRequest => ({ text: `${lhs} ${op} ${rhs}`, lhs, op, rhs, loc: { line: ++line, col: 1 } });

function run(measures: MeasureRequest[], checks: CheckRequest[] = [], extra: Partial<MeasureContext> = {}) {
  return evaluateMeasures(measures, checks, { op, params: { rc: 2400 }, ...extra });
}

describe('measure evaluation', () => {
  it('reads operating-point quantities and params', () => {
    const out = run([m('a', 'v("outa") - v("tail")'), m('b', 'ic("q1") * rc'), m('c', 'min(vce("q1"), vds("m1"))'), m('d', 'b / 2'), m('e', 'i("rc1")'), m('f', 'v("outa", "outb")')]);
    expect(out.diagnostics).toEqual([]);
    expect(out.measures.a).toBeCloseTo(8.32, 12);
    expect(out.measures.b).toBeCloseTo(2.4, 12);
    expect(out.measures.c).toBe(1.5);
    expect(out.measures.d).toBeCloseTo(1.2, 12);
    expect(out.measures.e).toBe(0.001);
    expect(out.measures.f).toBe(0);
  });

  it('adm/acm/cmrr: 20·log10 conversions (common practice: 379 → 51.6 dB, 54,000 → 94.6 dB)', () => {
    const out = run([m('a0', 'db(adm)'), m('k', 'cmrr_db'), m('x', 'db(54000)')], [], { ports: { adm: { re: -379, im: 0 }, acm: { re: -1, im: 0 }, cmrr: 379, cmrrDb: 20 * Math.log10(379), atHz: 0 } });
    expect(out.diagnostics).toEqual([]);
    expect(out.measures.a0).toBeCloseTo(51.6, 1);
    expect(out.measures.k).toBeCloseTo(51.6, 1);
    expect(out.measures.x).toBeCloseTo(94.6, 1);
  });

  it('a complex measure is an error that suggests mag, db or phase', () => {
    const out = run([m('z', 'adm')], [], { ports: { adm: { re: 3, im: 4 }, acm: { re: 1, im: 0 }, cmrr: 5, cmrrDb: 14, atHz: 1000 } });
    expect(out.measures).toEqual({});
    expect(out.diagnostics[0].message).toMatch(/complex/);
    expect(out.diagnostics[0].hint).toMatch(/mag\(\), db\(\) or phase\(\)/);
    const ok = run([m('z', 'mag(adm)'), m('p', 'phase(adm)')], [], { ports: { adm: { re: 3, im: 4 }, acm: { re: 1, im: 0 }, cmrr: 5, cmrrDb: 14, atHz: 1000 } });
    expect(ok.measures.z).toBeCloseTo(5, 12);
    expect(ok.measures.p).toBeCloseTo((Math.atan2(4, 3) * 180) / Math.PI, 12);
  });

  it('errors are diagnostics on the measure line, with suggestions', () => {
    const reqs = [m('a', 'ic("q2")'), m('b', 'vgs("q1")'), m('c', 'corner(adm)'), m('d', 'a + 1'), m('e', 'vcee + 1'), m('f', '1 +'), m('g', '1/0'), m('h', 'zout("outa")')];
    const out = run(reqs);
    expect(out.measures).toEqual({});
    const byLine = new Map(out.diagnostics.map((d) => [d.line, d]));
    expect(byLine.get(reqs[0].loc.line)?.hint).toMatch(/q1/);
    expect(byLine.get(reqs[1].loc.line)?.message).toMatch(/bipolar/);
    expect(byLine.get(reqs[2].loc.line)?.message).toMatch(/ac sweep/);
    // `d` uses the failed `a`: a's error is the one message (common practice: no follow-on errors).
    expect(byLine.has(reqs[3].loc.line)).toBe(false);
    expect(byLine.get(reqs[4].loc.line)?.message).toMatch(/unknown name/);
    expect(byLine.get(reqs[5].loc.line)?.message).toMatch(/cannot read/);
    expect(byLine.get(reqs[6].loc.line)?.message).toMatch(/not a finite number/);
    expect(byLine.get(reqs[7].loc.line)?.message).toMatch(/small-signal/);
    expect(out.diagnostics.every((d) => d.severity === 'error')).toBe(true);
    expect(out.diagnostics).toHaveLength(reqs.length - 1);
  });

  it('a measure named like a function is refused once, where it is resolved', () => {
    const parsed = parseNetlist('v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nmeasure gm = 1');
    expect(parsed.diagnostics.map((d) => [d.line, d.code])).toEqual([[3, 'reserved-name']]);
    expect(parsed.requests.measures).toEqual([]);
  });

  it('checks use measures and report pass and margin', () => {
    const out = run([m('vmin', 'min(vce("q1"), 9)')], [c('vmin', '>', '0.3'), c('ic("q1")', '<', '0.5e-3'), c('nosuch', '>', '1')]);
    expect(out.checks).toHaveLength(2);
    expect(out.checks[0]).toMatchObject({ pass: true, value: 8.32, limit: 0.3 });
    expect(out.checks[1]).toMatchObject({ pass: false });
    expect(out.diagnostics).toHaveLength(1);
  });
});

describe('mathjs subset', () => {
  it('offers the everyday functions and nothing of the rest', () => {
    const out = run([m('a', 'exp(log(2))'), m('b', 'pow(2, 10)'), m('c', 'sqrt(16) + abs(-1) + log10(1000) + max(1, 2) + min(3, 4)'), m('d', 'sin(1)')]);
    expect(out.measures.a).toBeCloseTo(2, 12);
    expect(out.measures.b).toBe(1024);
    expect(out.measures.c).toBe(13);
    expect(out.diagnostics.map((d) => d.message)).toEqual([expect.stringMatching(/unknown function `sin`/)]);
  });
});
