/**
 * parseNetlist end to end: statements of netlist-language.md §2 and §3 into a Circuit and
 * Requests. Expected values are the spec's own definitions (tables of §2, §3).
 */
import { describe, expect, it } from 'vitest';
import type { Bjt, Mosfet, VoltageSource } from '../circuit/types';
import { parseNetlist } from '../elaborate/parse-netlist';
import { EXAMPLE } from './test-netlists';
import { expectNearlyEqual } from '../testing/nearly-equal';


describe('the resistor-tail example', () => {
  const r = parseNetlist(EXAMPLE);

  it('parses without diagnostics', () => {
    expect(r.diagnostics).toEqual([]);
    expect(r.circuit).toBeDefined();
  });

  it('keeps nodes in first-appearance order, ground excluded', () => {
    expect(r.circuit?.nodes).toEqual(['vcc', 'vee', 'ina', 'inb', 'outa', 'outb', 'tail']);
  });

  it('evaluates values, params and braced expressions', () => {
    const parts = new Map(r.circuit?.parts.map((p) => [p.name, p]));
    expect(parts.get('rc1')).toMatchObject({ kind: 'res', a: 'vcc', b: 'outa', value: 1200 });
    expect(parts.get('rt')).toMatchObject({ kind: 'res', a: 'tail', b: 'vee', value: 2500 });
    expect(parts.get('vee')).toMatchObject({ kind: 'vsrc', p: 'gnd', n: 'vee', dc: 10 });
    expect((parts.get('va') as VoltageSource).ac).toEqual({ mag: 1, phaseDeg: 0 });
    expect((parts.get('vb') as VoltageSource).ac).toBeUndefined();
  });

  it('resolves the named model with defaults for the keys not written', () => {
    const q2 = r.circuit?.parts.find((p) => p.name === 'q2') as Bjt;
    expect(q2).toMatchObject({ kind: 'npn', c: 'outb', b: 'inb', e: 'tail', area: 1 });
    expect(q2.model.name).toBe('qn');
    expect(q2.model.va).toBe(80);
    expectNearlyEqual(q2.model.cjc, 0.5e-12, 5e-13, 0);
    expectNearlyEqual(q2.model.tauf, 0.3e-9, 5e-13, 0);
    expect(q2.model.betaR).toBe(1); // §2: beta_r default 1
    expect(q2.model.eg).toBe(1.12); // §2: eg default 1.12 eV
    expect(q2.model.pt).toBe(3);
  });

  it('produces the requests', () => {
    expect(r.requests.ports).toMatchObject({ inP: 'va', inN: 'vb', outP: 'outa', outN: 'outb', atHz: 0 });
    expect(r.requests.analyses).toEqual([{ kind: 'ac', fromHz: 10, toHz: 1e9, perDecade: 20, loc: { line: 15, col: 1, endCol: 8 } }]);
    expect(r.requests.measures.map((m) => [m.name, m.expr])).toEqual([
      ['a0', 'db(adm)'],
      ['vmin', 'min(vce("q1"), vce("q2"))'],
    ]);
    expect(r.requests.checks[0]).toMatchObject({ text: 'cmrr_db >= 40', lhs: 'cmrr_db', op: '>=', rhs: '40' });
    expect(r.requests.checks[1]).toMatchObject({ lhs: 'ic("q1")', op: '=', rhs: '0.002', tol: 0.05, tolRelative: true });
    expect(r.requests.params).toEqual({ rc: 1200, rt: 2500 });
  });

  it('lists symbols for completion', () => {
    expect(r.symbols.models).toEqual(['qn']);
    expect(r.symbols.params).toEqual(['rc', 'rt']);
    expect(r.symbols.parts).toContain('q2');
    expect(r.symbols.nodes).toContain('tail');
  });
});

describe('statements', () => {
  it('reads comments, blank lines, indentation and continuations', () => {
    const r = parseNetlist('# header\n\n   v1: vsrc(a, gnd) 1   # supply\nr1: res(a, \\\n  gnd) \\\n  4.7 kΩ\n');
    expect(r.diagnostics).toEqual([]);
    expect(r.circuit?.parts[1]).toMatchObject({ kind: 'res', a: 'a', b: 'gnd', value: 4700 });
  });

  it('applies built-in default models (§2)', () => {
    const r = parseNetlist('v1: vsrc(a, gnd) 1\nr1: res(a, b) 1k\nq1: pnp(c=gnd, b=gnd, e=b)\nm1: nmos(d=a, g=a, s=gnd)\nd1: diode(a=b, k=gnd)');
    expect(r.diagnostics).toEqual([]);
    const [, , q1, m1, d1] = r.circuit?.parts ?? [];
    expect(q1).toMatchObject({ kind: 'pnp', model: { is: 1e-16, beta: 100, va: Infinity, betaR: 1, n: 1, cje: 0, cjc: 0 }, area: 1 });
    expect(m1).toMatchObject({ kind: 'nmos', b: 'gnd', s: 'gnd', model: { ucox: 100e-6, vth: 0.5, lambda: 0 }, w: 1e-6, l: 1e-6, m: 1 });
    expect(d1).toMatchObject({ kind: 'diode', model: { is: 1e-14, n: 1 } });
  });

  it('reads MOS bulk, geometry and multiplier', () => {
    const r = parseNetlist('model mp: pmos(ucox=40u, vth=-0.6, lambda=0.1)\nvdd: vsrc(vdd, gnd) 3\nr1: res(d, gnd) 1k\nm1: pmos(s=vdd, g=gnd, d=d, b=vdd) mp w=20u l=0.5u m=2');
    expect(r.diagnostics).toEqual([]);
    const m1 = r.circuit?.parts.find((p) => p.name === 'm1') as Mosfet;
    expect(m1).toMatchObject({ d: 'd', g: 'gnd', s: 'vdd', b: 'vdd', m: 2 });
    expectNearlyEqual(m1.w, 20e-6, 5e-13, 0);
    expectNearlyEqual(m1.l, 0.5e-6, 5e-13, 0);
    expect(m1.model.vth).toBeCloseTo(0.6, 12); // §2: vth is a magnitude for pmos
  });

  it('reads ac=MAG@PHASE on sources and every controlled source', () => {
    const r = parseNetlist('v1: vsrc(a, gnd) 0 ac=2m@90\ni1: isrc(gnd, b) 1m ac=1u\nr1: res(a, b) 1k\nr2: res(b, gnd) 1k\ne1: vcvs(c, gnd, a, b) 10\ng1: vccs(c, gnd, a, gnd) 2m\nr3: res(c, gnd) 1k');
    expect(r.diagnostics).toEqual([]);
    const parts = r.circuit?.parts ?? [];
    expect(parts[0]).toMatchObject({ kind: 'vsrc', dc: 0, ac: { mag: 0.002, phaseDeg: 90 } });
    expect(parts[1]).toMatchObject({ kind: 'isrc', from: 'gnd', to: 'b', dc: 0.001, ac: { mag: 1e-6, phaseDeg: 0 } });
    expect(parts[4]).toMatchObject({ kind: 'vcvs', p: 'c', n: 'gnd', cp: 'a', cn: 'b', gain: 10 });
    expect(parts[5]).toMatchObject({ kind: 'vccs', from: 'c', to: 'gnd', cp: 'a', cn: 'gnd', gm: 0.002 });
  });

  it('maps options to SolverOptions', () => {
    const r = parseNetlist('option temp = 85\noption rel_tol = 1e-6\noption abs_tol = 1n\noption min_g = 1p\noption max_iter = 400\nv1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1');
    expect(r.diagnostics).toEqual([]);
    expect(r.circuit?.options).toEqual({ temp: 85, relTol: 1e-6, absTol: 1e-9, minG: 1e-12, maxIter: 400 });
  });

  it('lets params use earlier params, and overrides them for vary', () => {
    const text = 'param rc = 1k\nparam rt = 10*rc\nv1: vsrc(a, gnd) 1\nr1: res(a, gnd) rt';
    expect(parseNetlist(text).circuit?.parts[1]).toMatchObject({ value: 10000 });
    expect(parseNetlist(text, { paramOverrides: { rc: 2000 } }).circuit?.parts[1]).toMatchObject({ value: 20000 });
  });

  it('reads every analyze line of §3', () => {
    const text = [
      'param rt = 1k',
      'va: vsrc(a, gnd) 0',
      'r1: res(a, out) rt',
      'r2: res(out, gnd) 1k',
      'analyze transfer va from -100m to 100m step 1m',
      'analyze vary rt over 1k 10k 100k',
      'analyze temp over -40 27 125',
      'analyze noise out out in va from 10 Hz to 10 MHz per decade 10',
      'analyze mismatch runs 500 seed 7 beta 5% is 2% res 0.5%',
      'analyze poles',
    ].join('\n');
    const r = parseNetlist(text);
    expect(r.diagnostics).toEqual([]);
    const [transfer, vary1, temp, noise, mismatch, poles] = r.requests.analyses;
    expect(transfer).toMatchObject({ kind: 'transfer', source: 'va', from: -0.1, to: 0.1 });
    expect((transfer as { step: number }).step).toBeCloseTo(1e-3, 15);
    expect(vary1).toMatchObject({ kind: 'vary', param: 'rt', values: [1000, 10000, 100000] });
    // The log-range form, in a netlist of its own: one vary per netlist, a second is ignored with a warning.
    const logRange = parseNetlist(text.replace('analyze vary rt over 1k 10k 100k', 'analyze vary rt from 1k to 1M per decade 5'));
    const vary2 = logRange.requests.analyses.find((a) => a.kind === 'vary');
    const two = parseNetlist(`${text}\nanalyze vary rt from 1k to 1M per decade 5`);
    expect(two.diagnostics.map((d) => [d.code, d.line])).toEqual([['duplicate-analysis', 11]]);
    expect(two.requests.analyses.filter((a) => a.kind === 'vary')).toHaveLength(1);
    const values2 = (vary2 as { values: number[] }).values;
    expect(values2).toHaveLength(16); // 3 decades × 5 per decade, both ends
    expectNearlyEqual(values2[5], 1e4, 5e-13, 0);
    expect(temp).toMatchObject({ kind: 'temp', valuesC: [-40, 27, 125] });
    expect(noise).toMatchObject({ kind: 'noise', out: 'out', input: 'va', fromHz: 10, toHz: 1e7, perDecade: 10 });
    expect(mismatch).toMatchObject({ kind: 'mismatch', runs: 500, seed: 7 });
    const sigmas = (mismatch as { sigmas: Record<string, number> }).sigmas;
    expect(sigmas.beta).toBeCloseTo(0.05, 15);
    expect(sigmas.is).toBeCloseTo(0.02, 15);
    expect(sigmas.res).toBeCloseTo(0.005, 15);
    expect(poles).toMatchObject({ kind: 'poles' });
  });

  it('reads a single-ended ports line with a frequency', () => {
    const r = parseNetlist('va: vsrc(a, gnd) 0\nvb: vsrc(b, gnd) 0\nr1: res(a, b) 1k\nports in=(va, vb) out=a at 1 kHz');
    expect(r.diagnostics).toEqual([]);
    expect(r.requests.ports).toMatchObject({ inP: 'va', inN: 'vb', outP: 'a', atHz: 1000 });
    expect(r.requests.ports?.outN).toBeUndefined();
  });

  it('reads check operators and tolerances', () => {
    const text = 'v1: vsrc(a, gnd) 1\nr1: res(a, gnd) 1k\nmeasure x = v(a)\ncheck x <= 2\ncheck x > 0.3\ncheck x < 5\ncheck i(v1) = -1m +- 10u\ncheck zin(v1, 1k) = 1k ± 1%';
    const r = parseNetlist(text);
    expect(r.diagnostics).toEqual([]);
    expect(r.requests.checks.map((c) => [c.lhs, c.op, c.rhs, c.tol, c.tolRelative])).toEqual([
      ['x', '<=', '2', undefined, undefined],
      ['x', '>', '0.3', undefined, undefined],
      ['x', '<', '5', undefined, undefined],
      ['i("v1")', '=', '-0.001', 1e-5, undefined],
      ['zin("v1", 1000)', '=', '1000', 0.01, true],
    ]);
  });
});
