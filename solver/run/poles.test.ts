/**
 * `analyze poles`: poles and zeros against closed forms and an independent eigenvalue solver,
 * the phase margin against the pole picture, invariance under renumbering, the measures, the
 * report and the diagnostics.
 *
 * References: mathjs `eigs` (a general-purpose library from the registry) on the symmetric
 * C^(−1/2)·G·C^(−1/2); the quadratic formula on denominators derived here by nodal analysis
 * (each derivation is written beside its check); Gray et al., Analysis and Design of Analog
 * Integrated Circuits, 5th ed., for the common-emitter stage's exact two-pole response and the
 * differential half circuit (from memory: the frequency-response chapter).
 */
import fc from 'fast-check';
import { eigs, matrix } from 'mathjs';
import { describe, expect, it } from 'vitest';
import type { BjtOp, PoleZero, SolveResult } from '../circuit/result';
import { formatReport } from '../report/text-report';
import { solveNetlist } from '../solve';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { RESISTOR_PAIR } from '../testing/pair-netlist';
import { MAX_POLES_UNKNOWNS } from '../analysis/poles-zeros';

const TWO_PI = 2 * Math.PI;
/**
 * The linear closed forms hold exactly without min_g, the conductance the solver puts from every
 * node to ground (docs/netlist.md, `option min_g`, default 1e-12 S), which would move a pole by
 * about min_g·R relative (1e-8 at 10 kΩ). The transistor stages keep it (tolerances there say so).
 */
const EXACT = 'option min_g = 0\n';

function solved(text: string): SolveResult {
  const r = solveNetlist(text);
  expect(r.errors, JSON.stringify(r.errors)).toEqual([]);
  expect(r.poles, 'a poles member').toBeDefined();
  return r;
}

/** Complex s in rad/s of a reported pole or zero (reported in Hz). */
const sOf = (p: PoleZero) => ({ re: p.re * TWO_PI, im: p.im * TWO_PI });

/** Roots of a·s² + b·s + c (the quadratic formula), as {re, im}, the one with im ≥ 0 or the smaller magnitude first. */
function quadraticRoots(a: number, b: number, c: number): { re: number; im: number }[] {
  const disc = b * b - 4 * a * c;
  if (disc >= 0) {
    // The numerically stable form: q = −(b + sign(b)·√disc)/2, roots q/a and c/q.
    const q = -0.5 * (b + Math.sign(b || 1) * Math.sqrt(disc));
    return [q / a, c / q].map((re) => ({ re, im: 0 })).sort((x, y) => Math.abs(x.re) - Math.abs(y.re));
  }
  const re = -b / (2 * a);
  const im = Math.sqrt(-disc) / (2 * a);
  return [{ re, im }, { re, im: -im }];
}

function expectRoots(actual: PoleZero[], expected: { re: number; im: number }[], rel: number, what: string): void {
  expect(actual.length, `${what}: count`).toBe(expected.length);
  actual.forEach((p, k) => {
    const s = sOf(p);
    const size = Math.hypot(expected[k].re, expected[k].im);
    expectNearlyEqual(s.re, expected[k].re, rel, rel * size, `${what} ${k + 1} re`);
    expectNearlyEqual(s.im, expected[k].im, rel, rel * size, `${what} ${k + 1} im`);
  });
}

describe('poles of an RC ladder against mathjs eigs (an independent general-purpose eigenvalue solver)', () => {
  it('eight nodes, a capacitor on each: the poles are −eig(C^(−1/2)·G·C^(−1/2)), G and C written from the element values', () => {
    // A current source drives node 1 (open when zeroed), so every unknown is a node voltage with
    // a capacitor to ground: G is the nodal conductance matrix, C = diag(c), both symmetric.
    const R = [1e3, 2.2e3, 4.7e3, 1.5e3, 3.3e3, 6.8e3, 1e3, 2.7e3];
    const Cs = [1e-9, 470e-12, 2.2e-9, 1e-9, 330e-12, 680e-12, 1.5e-9, 820e-12];
    const lines = [EXACT + 'iin: isrc(gnd, n1) 0 ac=1'];
    for (let k = 0; k < 8; k++) lines.push(`c${k + 1}: cap(n${k + 1}, gnd) ${Cs[k]}`);
    for (let k = 0; k < 7; k++) lines.push(`r${k + 1}: res(n${k + 1}, n${k + 2}) ${R[k]}`);
    lines.push(`r8: res(n8, gnd) ${R[7]}`, 'analyze poles');
    const r = solved(lines.join('\n'));

    const n = 8;
    const G = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let k = 0; k < 7; k++) {
      const g = 1 / R[k];
      G[k][k] += g;
      G[k + 1][k + 1] += g;
      G[k][k + 1] -= g;
      G[k + 1][k] -= g;
    }
    G[7][7] += 1 / R[7];
    const A = G.map((row, i) => row.map((g, j) => g / Math.sqrt(Cs[i] * Cs[j])));
    const lambdas = (eigs(matrix(A), { eigenvectors: false }).values as unknown as { toArray(): number[] }).toArray();
    const expected = [...lambdas].sort((a, b) => a - b).map((l) => ({ re: -l, im: 0 }));

    expect(r.poles!.zeros_hz).toEqual([]);
    expect(r.poles!.zeros_of).toBeUndefined();
    // Both sides are backward-stable eigenvalue computations of well-conditioned (symmetric-
    // equivalent) problems; 1e-9 leaves room for the spread of 300 between the time constants.
    expectRoots(r.poles!.poles_hz, expected, 1e-9, 'pole');
    expect(r.poles!.poles_hz.every((p) => p.q === undefined)).toBe(true);
  });
});

describe('two-pole stages against the quadratic formula', () => {
  it('two loaded RC sections (no buffer): D(s) = R1C1R2C2·s² + (R1C1 + R2C2 + R1C2)·s + 1', () => {
    // Nodal analysis (derived here): at a, (va − vin)/R1 + s·C1·va + (va − vo)/R2 = 0; at out,
    // (vo − va)/R2 + s·C2·vo = 0. Eliminating va: vo/vin = 1/D(s) with D as above; no zeros.
    const [R1, C1, R2, C2] = [1e3, 1e-6, 10e3, 220e-9];
    const r = solved(`${EXACT}vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) ${R1}\nc1: cap(a, gnd) ${C1}\nr2: res(a, out) ${R2}\nc2: cap(out, gnd) ${C2}\nanalyze poles out out`);
    expectRoots(r.poles!.poles_hz, quadraticRoots(R1 * C1 * R2 * C2, R1 * C1 + R2 * C2 + R1 * C2, 1), 1e-9, 'pole');
    expect(r.poles!.zeros_hz).toEqual([]);
    expect(r.poles!.zeros_of).toBe('v(out)/vin');
  });

  it('two RC sections isolated by a vcvs buffer: D(s) = (1 + s·R1C1)(1 + s·R2C2), poles −1/(R1C1) and −1/(R2C2)', () => {
    const r = solved(EXACT + 'vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) 1k\nc1: cap(a, gnd) 1u\ne1: vcvs(b, gnd, a, gnd) 1\nr2: res(b, out) 2k\nc2: cap(out, gnd) 3u\nanalyze poles out out');
    expectRoots(r.poles!.poles_hz, [{ re: -1 / 6e-3, im: 0 }, { re: -1 / 1e-3, im: 0 }], 1e-9, 'pole');
  });

  it('a series RLC: D(s) = LC·s² + RC·s + 1, a complex pair with q = √(L/C)/R', () => {
    // Loop equation (derived here): vin = (R + sL + 1/(sC))·i, vc = i/(sC) → vc/vin = 1/D(s).
    const [R, L, C] = [20, 1e-3, 1e-6];
    const r = solved(`${EXACT}vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) ${R}\nl1: ind(a, out) ${L}\nc1: cap(out, gnd) ${C}\nanalyze poles out out`);
    expectRoots(r.poles!.poles_hz, quadraticRoots(L * C, R * C, 1), 1e-9, 'pole');
    const q = Math.sqrt(L / C) / R;
    for (const p of r.poles!.poles_hz) expectNearlyEqual(p.q!, q, 1e-9, 0, 'q');
    expect(r.poles!.poles_hz[0].im).toBeGreaterThan(0);
  });

  it('a resistor-loaded common-emitter stage with Cπ and Cμ: Gray et al. 5th ed. (exact two-pole response)', () => {
    // Nodal analysis at the base b and the collector c (va = ∞, rb = 0, so ro = ∞):
    //   (vb − vs)/Rs + vb/rπ + s·Cπ·vb + s·Cμ·(vb − vc) = 0,   gm·vb + vc/RL + s·Cμ·(vc − vb) = 0.
    // Its determinant over (1/Rs + 1/rπ)·(1/RL) gives the denominator
    //   D(s) = 1 + s·[Rs'·(Cπ + Cμ) + RL·Cμ + gm·Rs'·RL·Cμ] + s²·Rs'·RL·Cπ·Cμ,  Rs' = Rs ∥ rπ,
    // and the numerator gm − s·Cμ: one right-half-plane zero at s = +gm/Cμ.
    const text = `model qn: npn(is=1e-16, beta=100, cje=2p, cjc=0.5p)
vcc: vsrc(vcc, gnd) 10
vin: vsrc(in, gnd) 0.65 ac=1
rs: res(in, b) 1k
q1: npn(c=out, b=b, e=gnd) qn
rl: res(vcc, out) 5k
analyze poles out out`;
    const r = solved(text);
    const q = r.op!.devices.q1 as BjtOp;
    expect(q.region).toBe('active');
    const rsp = 1 / (1 / 1e3 + 1 / q.rpi);
    const RL = 5e3;
    const a = rsp * RL * q.cpi * q.cmu;
    const b = rsp * (q.cpi + q.cmu) + RL * q.cmu + q.gm * rsp * RL * q.cmu;
    // min_g (1e-12 S) on each node and the reported figures' own rounding: 1e-7.
    expectRoots(r.poles!.poles_hz, quadraticRoots(a, b, 1), 1e-7, 'pole');
    expectRoots(r.poles!.zeros_hz, [{ re: q.gm / q.cmu, im: 0 }], 1e-7, 'zero');
    expect(formatReport(r)).toContain('right half-plane');
  });
});

describe('zeros of bridged networks against their closed forms', () => {
  it('an RC divider with a feedforward capacitor (lead network): zero at −1/(R1·C1), pole at −(R1 + R2)/(R1·R2·C1)', () => {
    // Derived here: vo/vi = R2/(R2 + Z1), Z1 = R1/(1 + s·R1·C1) → (1 + s·R1·C1)·R2/(R1 + R2 + s·R1·R2·C1).
    const [R1, C1, R2] = [10e3, 1e-9, 1e3];
    const r = solved(`${EXACT}vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, out) ${R1}\nc1: cap(in, out) ${C1}\nr2: res(out, gnd) ${R2}\nanalyze poles out out`);
    expectRoots(r.poles!.zeros_hz, [{ re: -1 / (R1 * C1), im: 0 }], 1e-9, 'zero');
    expectRoots(r.poles!.poles_hz, [{ re: -(R1 + R2) / (R1 * R2 * C1), im: 0 }], 1e-9, 'pole');
  });

  it('a bridged T (R, R in series, C1 from their middle to ground, C2 bridging): zeros of R²C1C2·s² + 2RC2·s + 1', () => {
    // Derived here by nodal analysis at the middle m and the (unloaded) output:
    //   vm·(2 + s·R·C1) = vi + vo;  vo·(1 + s·R·C2) − vm − s·R·C2·vi = 0, which give
    //   vo/vi = (R²C1C2·s² + 2RC2·s + 1) / (R²C1C2·s² + (RC1 + 2RC2)·s + 1).
    const [R, C1, C2] = [10e3, 100e-9, 1e-9];
    const r = solved(`${EXACT}vin: vsrc(in, gnd) 0 ac=1\nra: res(in, m) ${R}\nrb: res(m, out) ${R}\nc1: cap(m, gnd) ${C1}\nc2: cap(in, out) ${C2}\nanalyze poles out out`);
    const a = R * R * C1 * C2;
    expectRoots(r.poles!.zeros_hz, quadraticRoots(a, 2 * R * C2, 1), 1e-9, 'zero');
    expectRoots(r.poles!.poles_hz, quadraticRoots(a, R * C1 + 2 * R * C2, 1), 1e-9, 'pole');
    // The notch's q = √(C1/C2)/2 = 5 (from the numerator: ω0 = 1/(R√(C1C2)), ω0/q = 2/(R·C1)).
    expectNearlyEqual(r.poles!.zeros_hz[0].q!, Math.sqrt(C1 / C2) / 2, 1e-9, 0, 'q of the zero pair');
  });

  it('a high-pass pair: a double zero at the origin, reported as exactly 0', () => {
    const r = solved(EXACT + 'vin: vsrc(in, gnd) 0 ac=1\nc1: cap(in, a) 1u\nr1: res(a, gnd) 1k\nc2: cap(a, out) 1u\nr2: res(out, gnd) 1k\nanalyze poles out out');
    expect(r.poles!.zeros_hz).toEqual([{ re: 0, im: 0 }, { re: 0, im: 0 }]);
    // Poles of the dual of the loaded RC-RC ladder (same R and C): the roots of R²C²s² + 3RCs + 1.
    expectRoots(r.poles!.poles_hz, quadraticRoots(1e-6, 3e-3, 1), 1e-9, 'pole');
  });
});

describe('the differential half circuit (Gray et al. 5th ed.): adm of a symmetric pair has the CE stage\'s poles and zero', () => {
  it('the common-mode poles (the tail capacitor) cancel out of the zeros of adm', () => {
    const pair = `model qn: npn(is=1e-16, beta=100, cje=2p, cjc=0.5p)
vcc: vsrc(vcc, gnd) 10
vee: vsrc(vee, gnd) -10
va: vsrc(ina, gnd) 0
vb: vsrc(inb, gnd) 0
rsa: res(ina, ba) 1k
rsb: res(inb, bb) 1k
q1: npn(c=outa, b=ba, e=tail) qn
q2: npn(c=outb, b=bb, e=tail) qn
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
rtail: res(tail, vee) 9.3k
ct: cap(tail, gnd) 3p
ports in=(va, vb) out=(outa, outb)
analyze poles`;
    const r = solved(pair);
    const q = r.op!.devices.q1 as BjtOp;
    // In differential mode the tail is an ac ground: each half is the CE stage of the test above.
    const rsp = 1 / (1 / 1e3 + 1 / q.rpi);
    const RL = 5e3;
    const differential = quadraticRoots(rsp * RL * q.cpi * q.cmu, rsp * (q.cpi + q.cmu) + RL * q.cmu + q.gm * rsp * RL * q.cmu, 1);
    expect(r.poles!.zeros_of).toBe('adm');
    expectRoots(r.poles!.zeros_hz, [{ re: q.gm / q.cmu, im: 0 }], 1e-7, 'zero of adm');
    // The circuit's poles include the differential ones (and the common-mode ones besides).
    const poles = r.poles!.poles_hz.map(sOf);
    for (const p of differential) expect(poles.some((s) => Math.abs(s.re - p.re) <= 1e-7 * Math.abs(p.re) && Math.abs(s.im) <= 1e-7 * Math.abs(p.re)), `pole at ${p.re}`).toBe(true);
    expect(poles.length).toBeGreaterThan(2);
  });
});

describe('the phase margin agrees with the pole picture', () => {
  it('a two-pole open loop A0/((1 + s/p1)(1 + s/p2)): margin() = 180° − atan(fu/f1) − atan(fu/f2)', () => {
    // Two RC sections isolated by a vcvs of gain A0 = 1000 (an unloaded output): a textbook two-pole
    // open loop. fu solves |H(j2πfu)| = 1: with x = fu², (1 + x/f1²)(1 + x/f2²) = A0², a quadratic in x.
    const text = `${EXACT}vin: vsrc(in, gnd) 0 ac=1
r1: res(in, a) 10k
c1: cap(a, gnd) 10n
e1: vcvs(b, gnd, a, gnd) 1000
r2: res(b, out) 1k
c2: cap(out, gnd) 1n
analyze poles out out
analyze ac from 100 Hz to 100 MHz per decade 100
measure f1 = pole(1)
measure f2 = pole(2)
measure fu = unity(ac(out))
measure pm = margin(ac(out))`;
    const r = solved(text);
    const { f1, f2, pm, fu } = r.measures;
    expectNearlyEqual(f1, 1 / (TWO_PI * 1e-4), 1e-9, 0, 'f1 = 1/(2π·R1C1)');
    expectNearlyEqual(f2, 1 / (TWO_PI * 1e-6), 1e-9, 0, 'f2 = 1/(2π·R2C2)');
    const A0 = 1000;
    const [qa, qb, qc] = [1 / (f1 * f1 * f2 * f2), 1 / (f1 * f1) + 1 / (f2 * f2), 1 - A0 * A0];
    const x = (-qb + Math.sqrt(qb * qb - 4 * qa * qc)) / (2 * qa);
    const fuPoles = Math.sqrt(x);
    const pmPoles = 180 - (Math.atan(fuPoles / f1) + Math.atan(fuPoles / f2)) * (180 / Math.PI);
    // margin() interpolates a 100-per-decade sweep linearly in log f: over a step h = 0.01 decade the
    // error is at most h²/8 times the curvature of phase (≤ 2 poles × ~120°/decade² for a pole's
    // atan) and of dB, which moves fu by under 1e-4 decade: together far below 0.05°.
    expectNearlyEqual(pm, pmPoles, 0, 0.05, 'phase margin, from the sweep against the poles');
    expectNearlyEqual(fu, fuPoles, 1e-3, 0, 'unity-gain frequency');
    expect(pm).toBeGreaterThan(0);
    expect(pm).toBeLessThan(90);
  });
});

describe('invariance', () => {
  it('the poles do not depend on the order the lines (and so the nodes and unknowns) are written in (property)', () => {
    const lines = [
      'model qn: npn(is=1e-16, beta=100, va=60, cje=1p, cjc=0.3p)',
      'vcc: vsrc(vcc, gnd) 10',
      'vin: vsrc(in, gnd) 0.66 ac=1',
      'rs: res(in, b) 2k',
      'q1: npn(c=c1, b=b, e=gnd) qn',
      'rc: res(vcc, c1) 4k',
      'cc: cap(c1, x) 2p',
      'rx: res(x, gnd) 20k',
      'l1: ind(x, y) 10u',
      'cy: cap(y, gnd) 5p',
      'ry: res(y, gnd) 3k',
    ];
    const poles = (order: string[]) => solved([...order, 'analyze poles out y'].join('\n')).poles!;
    const reference = poles(lines);
    expect(reference.poles_hz.length).toBeGreaterThanOrEqual(4);
    fc.assert(
      fc.property(fc.shuffledSubarray(lines.slice(1), { minLength: lines.length - 1, maxLength: lines.length - 1 }), (order) => {
        const p = poles([lines[0], ...order]);
        for (const [list, ref] of [[p.poles_hz, reference.poles_hz], [p.zeros_hz, reference.zeros_hz]] as const) {
          expect(list.length).toBe(ref.length);
          list.forEach((z, k) => {
            const size = Math.hypot(ref[k].re, ref[k].im);
            expectNearlyEqual(z.re, ref[k].re, 1e-8, 1e-8 * size, 're');
            expectNearlyEqual(z.im, ref[k].im, 1e-8, 1e-8 * size, 'im');
          });
        }
      }),
      { numRuns: 12 },
    );
  }, 60_000);

  it('a capacitor on a source-held node, a vcvs output capacitor and a current-source-fed inductor add no finite pole', () => {
    // Each is an infinite pole of the pencil (a higher-index structure), not a natural frequency:
    // the circuit keeps exactly the one pole −1/(R·C) of its RC section.
    const r = solved(`${EXACT}vin: vsrc(in, gnd) 0 ac=1
cs: cap(in, gnd) 1u
r1: res(in, a) 1k
c1: cap(a, gnd) 1u
e1: vcvs(o, gnd, a, gnd) 2
co: cap(o, gnd) 1n
i1: isrc(gnd, p) 1m
l1: ind(p, gnd) 1m
analyze poles out o`);
    expectRoots(r.poles!.poles_hz, [{ re: -1e3, im: 0 }], 1e-9, 'pole');
    expect(r.poles!.zeros_hz).toEqual([]);
  });
});

describe('the member, the measures and the report', () => {
  it('JSON: poles_hz and zeros_hz of {re, im[, q]} sorted by |s|, a pair with im > 0 first; conventions stated', () => {
    const r = solved('vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) 10\nl1: ind(a, out) 1m\nc1: cap(out, gnd) 1u\nrl: res(out, gnd) 1k\ncf: cap(in, out) 10n\nr9: res(in, z) 1k\nc9: cap(z, gnd) 1n\nanalyze poles out out');
    const json = JSON.parse(JSON.stringify(r)) as SolveResult;
    for (const list of [json.poles!.poles_hz, json.poles!.zeros_hz]) {
      for (const p of list) expect(Object.keys(p).sort()).toEqual(p.im === 0 ? ['im', 're'] : ['im', 'q', 're']);
      const sizes = list.map((p) => Math.hypot(p.re, p.im));
      expect(sizes).toEqual([...sizes].sort((a, b) => a - b));
    }
    const pair = json.poles!.poles_hz.filter((p) => p.im !== 0);
    expect(pair).toHaveLength(2);
    expect(pair[0].im).toBeGreaterThan(0);
    expect(pair[1]).toEqual({ ...pair[0], im: -pair[0].im });
    expect(json.poles!.conventions).toContain('s/2π in Hz');
  });

  it('pole(k) and zero(k) count a conjugate pair once; past the last one is an error naming the count', () => {
    const r = solveNetlist(`${EXACT}vin: vsrc(in, gnd) 0 ac=1
r1: res(in, a) 20
l1: ind(a, out) 1m
c1: cap(out, gnd) 1u
r2: res(in, d) 1k
c2: cap(d, gnd) 1u
analyze poles out out
measure p1 = pole(1)
measure p2 = pole(2)
measure p3 = pole(3)
measure z1 = zero(1)`);
    // 1/(2π·RC) = 159.2 Hz for the RC branch; 1/(2π·√(LC)) = 5.033 kHz for the LC pair.
    expectNearlyEqual(r.measures.p1, 1 / (TWO_PI * 1e-3), 1e-9, 0, 'pole(1)');
    expectNearlyEqual(r.measures.p2, 1 / (TWO_PI * Math.sqrt(1e-9)), 1e-9, 0, 'pole(2)');
    expect(r.measures.p3).toBeUndefined();
    expect(r.errors.map((e) => e.message)).toEqual(expect.arrayContaining([expect.stringContaining('only 2 poles'), expect.stringContaining('no finite zero')]));
  });

  it('the report prints one row per natural frequency with its q, and the conventions', () => {
    const r = solved('vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) 20\nl1: ind(a, out) 1m\nc1: cap(out, gnd) 1u\nanalyze poles out out');
    const text = formatReport(r);
    expect(text).toContain('Poles and zeros');
    expect(text).toMatch(/pole 1 +-?[\d.]+ [kM]?Hz +± [\d.]+ kHz +[\d.]+ kHz +1\.581/);
    expect(text).toContain('2 poles (1 conjugate pair); 0 zeros of v(out)/vin.');
    expect(text).not.toContain('pole 2');
  });

  it('vary re-runs the poles per value', () => {
    const r = solved('vin: vsrc(in, gnd) 0 ac=1\nparam rr = 1k\nr1: res(in, out) rr\nc1: cap(out, gnd) 1u\nanalyze poles\nanalyze vary rr over 1k 2k\nmeasure p = pole(1)');
    expect(r.vary!.runs.map((run) => run.measures.p)).toEqual([expect.closeTo(159.155, 3), expect.closeTo(79.577, 3)]);
    expect(r.vary!.runs[1].poles!.poles_hz).toHaveLength(1);
  });
});

describe('diagnostics', () => {
  it('is no longer "not yet available"', () => {
    const r = solved(`${RESISTOR_PAIR}analyze poles`);
    expect(r.warnings.map((w) => w.code)).not.toContain('analysis-not-available');
    // The pair has no capacitances: no finite poles, and adm has no zeros.
    expect(r.poles!.poles_hz).toEqual([]);
    expect(r.poles!.zeros_hz).toEqual([]);
  });

  it('an unknown `out` node is an error on its name, with a suggestion', () => {
    const r = solveNetlist('vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1n\nanalyze poles out ou');
    expect(r.errors.map((e) => [e.code, e.line, e.col])).toEqual([['unknown-node', 4, 19]]);
    expect(r.errors[0].hint).toContain('out');
    expect(r.poles).toBeUndefined();
    // The circuit itself still solves.
    expect(r.op).toBeDefined();
  });

  it('`out` beside a ports line is ignored with a warning; without a source with ac= there are no zeros', () => {
    const withPorts = solveNetlist(`${RESISTOR_PAIR}analyze poles out outa`);
    expect(withPorts.warnings.map((w) => w.code)).toContain('poles-out-ignored');
    expect(withPorts.poles!.zeros_of).toBe('adm');
    const noAc = solveNetlist('vin: vsrc(in, gnd) 0\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1n\nanalyze poles out out');
    expect(noAc.warnings.map((w) => w.code)).toEqual(['no-ac-source']);
    expect(noAc.poles!.poles_hz).toHaveLength(1);
    expect(noAc.poles!.zeros_of).toBeUndefined();
  });

  it('a transfer that is zero at every frequency has no zeros, with a warning', () => {
    const r = solveNetlist('vin: vsrc(in, gnd) 0 ac=1\nr1: res(in, a) 1k\nc1: cap(a, gnd) 1n\nv2: vsrc(x, gnd) 1\nr2: res(x, out) 1k\nc2: cap(out, gnd) 1n\nanalyze poles out out');
    expect(r.warnings.map((w) => w.code)).toEqual(['poles-no-transfer']);
    expect(r.poles!.poles_hz).toHaveLength(2);
    expect(r.poles!.zeros_hz).toEqual([]);
  });

  it(`a circuit over ${MAX_POLES_UNKNOWNS} unknowns is refused, the error naming its size and the cap`, () => {
    const rungs = MAX_POLES_UNKNOWNS + 10;
    const lines = ['iin: isrc(gnd, n0) 1m'];
    for (let k = 0; k < rungs; k++) lines.push(`r${k}: res(n${k}, n${k + 1}) 1k`, `c${k}: cap(n${k + 1}, gnd) 1p`);
    lines.push(`rl: res(n${rungs}, gnd) 1k`, 'analyze poles');
    const r = solveNetlist(lines.join('\n'));
    expect(r.op).toBeDefined();
    expect(r.poles).toBeUndefined();
    expect(r.errors.map((e) => e.code)).toEqual(['poles-too-large']);
    expect(r.errors[0].message).toContain(`${rungs + 1} unknowns`);
    expect(r.errors[0].message).toContain(`at most ${MAX_POLES_UNKNOWNS}`);
  }, 60_000);
});

describe('zeros a first-order model cannot speak for', () => {
  it('leaves out the petahertz ± pair a near-infinite zero of a cascoded pair comes back as', () => {
    // Regression: a cascoded pair with follower outputs reported zeros at ±3.6e15 Hz beside its
    // real ones (−456 MHz and the Cμ feedforward zero near gm/(2π·Cμ) ≈ 5 GHz).
    const r = solveNetlist(`title cascoded pair with followers
model qn: npn(is=1e-16, beta=120, va=80, cje=2p, cjc=0.6p, tauf=0.25n)
vcc: vsrc(vcc, gnd) 10
vcb: vsrc(cb, gnd) 4.5
va: vsrc(bra, gnd) 2.5 ac=1
vb: vsrc(brb, gnd) 2.5
rga: res(bra, ina) 350
rgb: res(brb, inb) 350
q1: npn(c=ea, b=ina, e=tail) qn
q2: npn(c=eb, b=inb, e=tail) qn
q3: npn(c=ca, b=cb, e=ea) qn
q4: npn(c=cb2, b=cb, e=eb) qn
rca: res(vcc, ca) 8k
rcb: res(vcc, cb2) 8k
q5: npn(c=vcc, b=ca, e=outa) qn
q6: npn(c=vcc, b=cb2, e=outb) qn
rref: res(vcc, bias) 9.3k
qr: npn(c=bias, b=bias, e=gnd) qn
qt: npn(c=tail, b=bias, e=gnd) qn
qsa: npn(c=outa, b=bias, e=gnd) qn area=0.5
qsb: npn(c=outb, b=bias, e=gnd) qn area=0.5
cla: cap(outa, gnd) 5p
clb: cap(outb, gnd) 5p
ports in=(va, vb) out=(outa, outb)
analyze poles
`);
    expect(r.errors).toEqual([]);
    const fastest = Math.max(...r.poles!.poles_hz.map((p) => Math.hypot(p.re, p.im)));
    expect(fastest).toBeLessThan(1e9);
    expect(r.poles!.zeros_hz.length).toBeGreaterThan(0);
    // Nothing near the petahertz: every zero within 10⁴ times the fastest pole (below 10 THz here).
    for (const z of r.poles!.zeros_hz) expect(Math.hypot(z.re, z.im)).toBeLessThan(1e13);
    expect(r.poles!.zeros_hz.some((z) => z.re > 1e9 && z.re < 2e10)).toBe(true);
  });
});
