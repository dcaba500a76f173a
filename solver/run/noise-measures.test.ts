/**
 * `analyze noise` seen from the netlist: the noise measures and their band rule, the diagnostics
 * (bad lines, no gain from the input, bounded work, no NaN), the readable report and the sweeps.
 * The densities themselves are checked against textbook formulas in noise.test.ts.
 *
 * Constants: k = 1.380649e-23 J/K and q = 1.602176634e-19 C, exact in the SI since 2019 (CODATA 2018).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { MosOp, SolveResult } from '../circuit/result';
import { formatReport } from '../report/text-report';
import { solveNetlist } from '../solve';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { expectPowersAddUp, K, kelvin, solved } from '../testing/noise-checks';


describe('the noise measures', () => {
  const RC = 'vin: vsrc(in, gnd) 0\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1n\n';

  it('noise_out(f) and noise_in(f) read the densities, interpolated as a power law between grid points', () => {
    const r = solved(`${RC}analyze noise out out in vin from 10 Hz to 10 MHz per decade 1
measure at1k = noise_out(1k)
measure between = noise_out(3k)
measure inref = noise_in(2k)
measure far = noise_out(1M)`);
    const n = r.noise!;
    const at = (f: number) => n.out_density[n.freq_hz.indexOf(f)];
    expect(r.measures.at1k).toBe(at(1e3));
    // Between 1 kHz and 10 kHz the power law through the two samples, at 3 kHz (log-log straight line).
    const alpha = Math.log(at(1e4) ** 2 / at(1e3) ** 2) / Math.log(10);
    expectNearlyEqual(r.measures.between ** 2, at(1e3) ** 2 * 3 ** alpha, 1e-12, 0, 'power law');
    expectNearlyEqual(r.measures.inref, Math.sqrt(4 * K * kelvin(27) * 1e3), 1e-8, 0, 'flat input-referred');
    expect(r.measures.far).toBe(at(1e6));
  });

  it('integrates white noise exactly: √(S·(f2 − f1)) over a band (the power-law rule is exact on a flat density)', () => {
    const r = solved(`iin: isrc(gnd, out) 0\nr1: res(out, gnd) 1k
analyze noise out out in iin from 10 Hz to 100 kHz per decade 3
measure all = noise_out_rms()
measure audio = noise_out_rms(20, 20k)
measure iall = noise_in_rms()`);
    const S = 4 * K * kelvin(27) * 1e3;
    expectNearlyEqual(r.measures.all, Math.sqrt(S * (1e5 - 10)), 1e-8, 0, 'whole band');
    expectNearlyEqual(r.measures.audio, Math.sqrt(S * (2e4 - 20)), 1e-8, 0, '20 Hz to 20 kHz');
    expectNearlyEqual(r.measures.iall, Math.sqrt(((4 * K * kelvin(27)) / 1e3) * (1e5 - 10)), 1e-8, 0, 'input-referred current');
  });

  it('integrates a 1/f density exactly: S0·f0·ln(f2/f1) (flicker noise well below its corner)', () => {
    const r = solved(`model mn: nmos(ucox=200u, vth=0.5, flicker_corner=1G)
vdd: vsrc(vdd, gnd) 5\nvg: vsrc(g, gnd) 0.8\nrd: res(vdd, out) 10k\nm1: nmos(d=out, g=g, s=gnd) mn w=10u l=1u
analyze noise out out in vg from 1 Hz to 1 kHz per decade 1
measure m1only = noise_out_rms()`);
    // Power of m1: white·(1 + fc/f); of rd: white. ∫ over [1, 1000] of white·(1 + fc/f) df = white·(999 + fc·ln 1000).
    const gm = (r.op!.devices.m1 as MosOp).gm;
    const whiteM = 4 * K * kelvin(27) * (2 / 3) * gm * 1e8;
    const whiteR = 4 * K * kelvin(27) * 1e4;
    const expected = whiteM * (999 + 1e9 * Math.log(1000)) + whiteR * 999;
    // The sum of 1/f and white is not one power law: within a segment the rule errs by the
    // white part's share (1e-6 here), and not at all on the 1/f part.
    expectNearlyEqual(r.measures.m1only ** 2, expected, 1e-6, 0, '1/f integral');
  });

  it('says what is missing, refuses frequencies outside the sweep and a reversed band', () => {
    const none = solveNetlist(`${RC}measure n = noise_out(1k)`);
    expect(none.errors.map((e) => e.message)).toEqual([expect.stringContaining('needs a noise analysis')]);
    const r = solveNetlist(`${RC}analyze noise out out in vin from 10 Hz to 10 kHz per decade 1
measure a = noise_out(1M)
measure b = noise_out_rms(1k, 100)
measure c = noise_out_rms(100)
measure d = noise_in()`);
    expect(r.errors.map((e) => [e.line, e.code])).toEqual([[5, 'measure-error'], [6, 'measure-error'], [7, 'measure-error'], [8, 'measure-error']]);
    expect(r.errors[0].message).toContain('outside the noise sweep');
    expect(r.errors[1].message).toContain('lower to a higher');
  });

  it('a noise line with an error of its own leaves the noise measures silent', () => {
    const r = solveNetlist(`${RC}analyze noise out nosuch in vin from 10 Hz to 10 kHz per decade 1\nmeasure n = noise_out(1k)\ncheck n < 1`);
    expect(r.errors.map((e) => [e.line, e.code])).toEqual([[4, 'unknown-node']]);
  });

  it('are available to mismatch runs (the sweep is re-run per run only because a measure reads it)', () => {
    const r = solved(`${RC}analyze noise out out in vin from 10 Hz to 10 kHz per decade 1
measure n = noise_out(1k)
analyze mismatch runs 20 seed 3 res 10%`);
    const stats = r.mismatch!.stats.n;
    // √(4kTR) with R spread by 10 %: the density spreads by about 5 %.
    expectNearlyEqual(stats.p50, Math.sqrt(4 * K * kelvin(27) * 1e3), 0.1, 0, 'median');
    expect(stats.sd).toBeGreaterThan(0);
  });
});

describe('diagnostics: no NaN, bounded work', () => {
  const RC = 'vin: vsrc(in, gnd) 0\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1n\n';
  const codes = (text: string) => solveNetlist(RC + text).errors.map((e) => e.code);

  it('refuses bad request lines where they are read', () => {
    expect(codes('analyze noise out nosuch in vin from 10 Hz to 1 kHz per decade 1')).toEqual(['unknown-node']);
    expect(codes('analyze noise out gnd in vin from 10 Hz to 1 kHz per decade 1')).toEqual(['unknown-node']);
    expect(codes('analyze noise out out in vnope from 10 Hz to 1 kHz per decade 1')).toEqual(['unknown-name']);
    expect(codes('analyze noise out out in r1 from 10 Hz to 1 kHz per decade 1')).toEqual(['not-a-source']);
    expect(codes('analyze noise out out out in vin from 10 Hz to 1 kHz per decade 1')).toEqual(['bad-noise-request']);
    expect(codes('analyze noise out out in vin from 1 Hz to 1 THz per decade 2000')).toEqual(['bad-noise-request']);
    expect(codes('analyze noise out out in vin from 1 kHz to 10 Hz per decade 1')).toEqual(['syntax']);
    expect(codes('analyze noise out out in vin from 10 Hz to 1 kHz')).toEqual(['syntax']);
    expect(codes('analyze noise in vin out out from 10 Hz to 1 kHz per decade 1')).toEqual(['syntax']);
  });

  it('runs one noise analysis per netlist: a second line is ignored with a warning', () => {
    const r = solveNetlist(`${RC}analyze noise out out in vin from 10 Hz to 1 kHz per decade 1\nanalyze noise out in in vin from 10 Hz to 1 kHz per decade 1`);
    expect(r.warnings.map((w) => [w.line, w.code])).toEqual([[5, 'duplicate-analysis']]);
    expect(r.noise!.out).toBe('out');
  });

  it('refuses a sweep of too many points × unknowns, on its line, and keeps the rest of the result', () => {
    const ladder = Array.from({ length: 150 }, (_, k) => `r${k}: res(n${k}, n${k + 1}) 1k\nc${k}: cap(n${k + 1}, gnd) 1p`).join('\n');
    const r = solveNetlist(`vin: vsrc(n0, gnd) 0\n${ladder}\nanalyze noise out n150 in vin from 1 Hz to 1 THz per decade 1500\nmeasure n = noise_out(1k)`);
    expect(r.errors.map((e) => e.code)).toEqual(['sweep-too-large']);
    expect(r.op).toBeDefined();
    expect(r.noise).toBeUndefined();
  });

  it('an input source that does not reach the output: a warning, in_density 0, no NaN', () => {
    const r = solveNetlist('vin: vsrc(a, gnd) 0\nra: res(a, gnd) 1k\nvb: vsrc(b, gnd) 1\nrb: res(b, out) 1k\nro: res(out, gnd) 1k\nanalyze noise out out in vin from 10 Hz to 1 kHz per decade 1\nmeasure x = noise_in(100)\nmeasure y = noise_out(100)');
    expect(r.warnings.map((w) => w.code)).toEqual(['noise-no-gain']);
    expect(r.warnings[0].message).toContain('does not reach the output at any frequency');
    expect(r.noise!.in_density).toEqual([0, 0, 0]);
    expect(r.noise!.out_density[0]).toBeGreaterThan(0);
    expect(r.errors.map((e) => e.message)).toEqual([expect.stringContaining('undefined')]);
    expectNearlyEqual(r.measures.y, Math.sqrt(4 * K * kelvin(27) * 500), 1e-8, 0, 'out');
  });

  it('random circuits with a noise line: finite numbers, contributors adding up, never an internal error', () => {
    const kinds = ['res', 'cap', 'diode', 'npn', 'pnp', 'nmos'] as const;
    fc.assert(
      fc.property(
        fc.array(fc.record({ kind: fc.constantFrom(...kinds), a: fc.nat(5), b: fc.nat(5), c: fc.nat(5), u: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: 1, maxLength: 8 }),
        fc.nat(5),
        fc.boolean(),
        (elements, outIndex, useRef) => {
          const node = (i: number) => (i === 0 ? 'gnd' : `n${i}`);
          const lines = ['vs: vsrc(n1, gnd) 3', 'rs: res(n1, n2) 1k', 'rg2: res(n2, gnd) 10k'];
          for (let i = 3; i <= 5; i++) lines.push(`rg${i}: res(n${i}, gnd) ${1 + i}k`);
          elements.forEach((e, k) => {
            if (e.kind === 'res') lines.push(`x${k}: res(${node(e.a)}, ${node(e.b)}) ${(10 * 1e4 ** e.u).toPrecision(3)}`);
            else if (e.kind === 'cap') lines.push(`x${k}: cap(${node(e.a)}, ${node(e.b)}) ${(1e-12 * 1e4 ** e.u).toPrecision(3)}`);
            else if (e.kind === 'diode') lines.push(`x${k}: diode(a=${node(e.a)}, k=${node(e.b)})`);
            else if (e.kind === 'nmos') lines.push(`x${k}: nmos(d=${node(e.a)}, g=${node(e.b)}, s=${node(e.c)})`);
            else lines.push(`x${k}: ${e.kind}(c=${node(e.a)}, b=${node(e.b)}, e=${node(e.c)})`);
          });
          const out = `n${1 + (outIndex % 5)}`;
          const ref = useRef ? (out === 'n2' ? ' n3' : ' n2') : '';
          lines.push(`analyze noise out ${out}${ref} in vs from 1 Hz to 1 GHz per decade 2`, 'measure a = noise_out_rms()', 'measure b = noise_out(1k)');
          const r = solveNetlist(lines.join('\n'));
          expect(r.errors.map((e) => e.code)).not.toContain('internal-error');
          expect(r.errors.map((e) => e.code)).not.toContain('non-finite-result');
          if (!r.noise) return;
          expect([...r.noise.out_density, ...r.noise.in_density, ...Object.values(r.noise.contributors).flat()].every((x) => Number.isFinite(x) && x >= 0)).toBe(true);
          expectPowersAddUp(r, 1e-9);
        },
      ),
      { numRuns: 60, seed: 5 },
    );
  });
});

describe('the result and the readable report', () => {
  it('keeps the §5 member in the JSON and prints a compact noise table with the rms and the largest contributors', () => {
    const r = solved(`title noisy divider
vin: vsrc(in, gnd) 0
r1: res(in, out) 1k
r2: res(out, gnd) 3k
c1: cap(out, gnd) 1n
analyze noise out out in vin from 10 Hz to 100 MHz per decade 10`);
    const json = JSON.parse(JSON.stringify(r)) as SolveResult;
    expect(Object.keys(json.noise!.contributors)).toEqual(['r1', 'r2']);
    expect(json.noise!.freq_hz).toHaveLength(71);
    const text = formatReport(r);
    expect(text).toContain('Noise at out, input vin (10.00 Hz to 100.0 MHz, 71 points)');
    expect(text).toMatch(/1\.000 kHz\s+\S+ nV\/√Hz\s+\S+ nV\/√Hz/);
    expect(text).toMatch(/rms over the band: output \S+ µV, input-referred \S+ µV/);
    expect(text).toContain('largest contributors at 31.62 kHz');
    // Each resistor's current 4kT/R flows into the same R1‖R2 (and C): the shares go as 1/R, 3 : 1.
    expect(text).toMatch(/r1\s+\S+ nV\/√Hz\s+75\.0 %/);
    expect(text).toMatch(/r2\s+\S+ nV\/√Hz\s+25\.0 %/);
  });

  it('runs inside vary: each value holds its own noise member', () => {
    const r = solved('param rv = 1k\niin: isrc(gnd, out) 0\nr1: res(out, gnd) rv\nanalyze noise out out in iin from 1 kHz to 10 kHz per decade 1\nanalyze vary rv over 1k 4k');
    const [a, b] = r.vary!.runs.map((run) => run.noise!.out_density[0]);
    expectNearlyEqual(b / a, 2, 1e-8, 0, '√(4kT·4k)/√(4kT·1k)');
  });
});
