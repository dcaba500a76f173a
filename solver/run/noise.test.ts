/**
 * `analyze noise`: the densities against textbook formulas, and the adjoint method against one
 * forward solve per contributor (the measures, diagnostics and report: noise-measures.test.ts).
 *
 * Constants: k = 1.380649e-23 J/K and q = 1.602176634e-19 C, exact in the SI since 2019 (CODATA
 * 2018), written out here rather than imported so the check does not share the solver's table.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createAcSolver } from '../analysis/ac-solve';
import { noiseSpectrum } from '../analysis/noise';
import { noiseSources, sourceDensity } from '../analysis/noise-sources';
import { isOpFailure, solveOperatingPoint } from '../analysis/operating-point';
import { linearize } from '../analysis/small-signal';
import { bjtModel, circuitOf, diodeModel, mosModel, type PartSpec } from '../analysis/test-circuits';
import type { BjtOp, DiodeOp, MosOp, SolveResult } from '../circuit/result';
import { GROUND } from '../circuit/types';
import { solveNetlist } from '../solve';
import { expectNearlyEqual } from '../testing/nearly-equal';
import { expectPowersAddUp, K, kelvin, Q, solved } from '../testing/noise-checks';


describe('thermal noise of resistors (Nyquist: 4kT/R A²/Hz, i.e. 4kTR V²/Hz across an open resistor)', () => {
  it('a 1 kΩ resistor alone at 27 °C: √(4kTR) V/√Hz, and √(4kT/R) A/√Hz referred to a current-source input', () => {
    const r = solved('iin: isrc(gnd, out) 0\nr1: res(out, gnd) 1k\nanalyze noise out out in iin from 1 Hz to 1 MHz per decade 2');
    const T = kelvin(27);
    for (let k = 0; k < r.noise!.freq_hz.length; k++) {
      // min_g (1e-12 S) parallels the 1 kΩ: 1e-9 of R.
      expectNearlyEqual(r.noise!.out_density[k], Math.sqrt(4 * K * T * 1e3), 1e-8, 0, 'out');
      expectNearlyEqual(r.noise!.in_density[k], Math.sqrt((4 * K * T) / 1e3), 1e-8, 0, 'in');
    }
    expect(r.noise!.out_density[0]).toBeCloseTo(4.0714e-9, 12); // √(4·k·300.15 K·1 kΩ) = 4.0714 nV/√Hz
  });

  it('a divider of two equal resistors driven by a voltage source: each √(kTR), total √(4kT·R/2), input-referred twice that', () => {
    const r = solved('vin: vsrc(in, gnd) 0\nr1: res(in, out) 10k\nr2: res(out, gnd) 10k\nanalyze noise out out in vin from 10 Hz to 10 kHz per decade 1');
    const T = kelvin(27);
    const R = 1e4;
    for (let k = 0; k < 4; k++) {
      expectNearlyEqual(r.noise!.contributors.r1[k], Math.sqrt(K * T * R), 1e-8, 0, 'r1');
      expectNearlyEqual(r.noise!.contributors.r2[k], Math.sqrt(K * T * R), 1e-8, 0, 'r2');
      expectNearlyEqual(r.noise!.out_density[k], Math.sqrt(4 * K * T * (R / 2)), 1e-8, 0, 'out');
      expectNearlyEqual(r.noise!.in_density[k], 2 * Math.sqrt(4 * K * T * (R / 2)), 1e-8, 0, 'in (H = 1/2)');
    }
    expect(Object.keys(r.noise!)).toEqual(['out', 'in', 'freq_hz', 'out_density', 'in_density', 'contributors']);
    expect(r.noise!.freq_hz).toEqual([10, 100, 1000, 10000]);
  });

  it('follows the solve temperature: density ∝ √T over analyze temp (T in kelvin)', () => {
    const r = solved('iin: isrc(gnd, out) 0\nr1: res(out, gnd) 1k\nanalyze noise out out in iin from 1 kHz to 10 kHz per decade 1\nanalyze temp over -40 27 125\nmeasure n = noise_out(1k)');
    const values = r.temp!.values_c;
    r.temp!.runs.forEach((run, i) => {
      expectNearlyEqual(run.noise!.out_density[0], Math.sqrt(4 * K * kelvin(values[i]) * 1e3), 1e-8, 0, `${values[i]} °C`);
      expectNearlyEqual(run.measures.n, Math.sqrt(4 * K * kelvin(values[i]) * 1e3), 1e-8, 0, `measure at ${values[i]} °C`);
    });
  });
});

describe('shot noise (Schottky: 2qI A²/Hz)', () => {
  it('a bipolar collector current into its load: contributor = RC·√(2q·IC), the load √(4kT·RC)', () => {
    // The base is held by a source, so the base shot noise is shorted; va = ∞ leaves RC the only load.
    const r = solved('vcc: vsrc(vcc, gnd) 10\nvbb: vsrc(b, gnd) 0.72\nrc: res(vcc, out) 4.7k\nq1: npn(c=out, b=b, e=gnd)\nanalyze noise out out in vbb from 100 Hz to 100 kHz per decade 1');
    const ic = (r.op!.devices.q1 as BjtOp).ic;
    expect(ic).toBeGreaterThan(1e-4);
    for (let k = 0; k < r.noise!.freq_hz.length; k++) {
      expectNearlyEqual(r.noise!.contributors.q1[k], 4.7e3 * Math.sqrt(2 * Q * ic), 1e-7, 0, 'q1');
      expectNearlyEqual(r.noise!.contributors.rc[k], Math.sqrt(4 * K * kelvin(27) * 4.7e3), 1e-7, 0, 'rc');
    }
    expectPowersAddUp(r);
  });

  it('a diode fed by an ideal current source: √(2q·ID)/gd', () => {
    const r = solved('iin: isrc(gnd, a) 1m\nd1: diode(a=a, k=gnd)\nanalyze noise out a in iin from 1 kHz to 10 kHz per decade 1');
    const d = r.op!.devices.d1 as DiodeOp;
    expectNearlyEqual(r.noise!.out_density[0], Math.sqrt(2 * Q * d.id) / d.gd, 1e-8, 0, 'diode');
    // And against the hand formula VT·√(2q/I) (gd = I/VT up to IS).
    const vt = (K * kelvin(27)) / Q;
    expectNearlyEqual(r.noise!.out_density[0], vt * Math.sqrt((2 * Q) / 1e-3), 1e-9, 0, 'VT·√(2q/I)');
  });
});

describe('MOS channel noise and flicker noise', () => {
  const CS = (flicker: string) => `model mn: nmos(ucox=200u, vth=0.5${flicker})
vdd: vsrc(vdd, gnd) 5
vg: vsrc(g, gnd) 0.8
rd: res(vdd, out) 10k
m1: nmos(d=out, g=g, s=gnd) mn w=10u l=1u
analyze noise out out in vg from 10 Hz to 10 MHz per decade 1`;

  it('common source: contributor = RD·√(4kT·(2/3)·gm) (Razavi, Design of Analog CMOS ICs, 2nd ed., ch. 7)', () => {
    const r = solved(CS(''));
    const gm = (r.op!.devices.m1 as MosOp).gm;
    expect(gm).toBeGreaterThan(0);
    for (const d of r.noise!.contributors.m1) expectNearlyEqual(d, 1e4 * Math.sqrt(4 * K * kelvin(27) * (2 / 3) * gm), 1e-8, 0, 'm1');
    // Input-referred: the channel 4kT(2/3)/gm plus the load 4kT/(gm²·RD), H = gm·RD.
    const expected = Math.sqrt(4 * K * kelvin(27) * (2 / (3 * gm) + 1 / (gm * gm * 1e4)));
    expectNearlyEqual(r.noise!.in_density[0], expected, 1e-8, 0, 'in');
  });

  it('flicker_corner: the 1/f part equals the white part at the corner, so the power is white·(1 + fc/f)', () => {
    const white = solved(CS('')).noise!.contributors.m1;
    const r = solved(CS(', flicker_corner=10k'));
    r.noise!.freq_hz.forEach((f, k) => {
      expectNearlyEqual(r.noise!.contributors.m1[k] ** 2, white[k] ** 2 * (1 + 1e4 / f), 1e-12, 0, `${f} Hz`);
    });
    const at10k = r.noise!.freq_hz.indexOf(1e4);
    expectNearlyEqual(r.noise!.contributors.m1[at10k] ** 2, 2 * white[at10k] ** 2, 1e-12, 0, 'twice the white power at the corner');
    // The resistor's noise is untouched.
    expectNearlyEqual(r.noise!.contributors.rd[0], Math.sqrt(4 * K * kelvin(27) * 1e4), 1e-8, 0, 'rd');
  });

  it('bipolar flicker sits in the base current, diode flicker in its current', () => {
    const net = (fc: string) => `model qn: npn(beta=100${fc})\nmodel dd: diode(is=1e-14${fc})
vcc: vsrc(vcc, gnd) 10\nibb: isrc(gnd, b) 10u\nrc: res(vcc, out) 4.7k\nq1: npn(c=out, b=b, e=gnd) qn
idd: isrc(gnd, a) 1m\nd1: diode(a=a, k=gnd) dd
analyze noise out out in ibb from 100 Hz to 1 MHz per decade 1`;
    const plain = solved(net(''));
    const flicker = solved(net(', flicker_corner=1k'));
    // q1: base shot noise (2q·IB, into rπ) and collector shot noise both reach the output; the
    // collector's is untouched, so only the base part scales by (1 + fc/f).
    const ib = (plain.op!.devices.q1 as BjtOp).ib;
    const ic = (plain.op!.devices.q1 as BjtOp).ic;
    const gm = (plain.op!.devices.q1 as BjtOp).gm;
    const rpi = (plain.op!.devices.q1 as BjtOp).rpi;
    plain.noise!.freq_hz.forEach((f, k) => {
      const base = 2 * Q * ib * (gm * rpi * 4.7e3) ** 2;
      const collector = 2 * Q * ic * 4.7e3 ** 2;
      expectNearlyEqual(plain.noise!.contributors.q1[k] ** 2, base + collector, 1e-7, 0, 'q1 white');
      expectNearlyEqual(flicker.noise!.contributors.q1[k] ** 2, base * (1 + 1e3 / f) + collector, 1e-7, 0, `q1 at ${f} Hz`);
    });
    expect(plain.noise!.contributors.d1[0]).toBe(0); // d1 does not reach out
  });
});

describe('kT/C: the integrated noise of an RC low-pass (Razavi, Design of Analog CMOS ICs, 2nd ed., ch. 7)', () => {
  it('noise_out_rms over 10 Hz … 1 THz (corners 159 kHz and 15.9 kHz) is √(kT/C) within 0.1 %, whatever R', () => {
    for (const r of ['1k', '10k']) {
      const result = solved(`vin: vsrc(in, gnd) 0\nr1: res(in, out) ${r}\nc1: cap(out, gnd) 1n\nanalyze noise out out in vin from 10 Hz to 1T per decade 20\nmeasure n = noise_out_rms()`);
      // Only the bands below 10 Hz and above 1 THz are missing: (2/π)·(10 Hz/fc) of the power, 4e-4 at most.
      expectNearlyEqual(result.measures.n, Math.sqrt((K * kelvin(27)) / 1e-9), 1e-3, 0, `R = ${r}`);
    }
  });

  it('the input-referred density of the low-pass is flat, √(4kTR), because H and the output fall together', () => {
    const r = solved('vin: vsrc(in, gnd) 0\nr1: res(in, out) 1k\nc1: cap(out, gnd) 1n\nanalyze noise out out in vin from 10 Hz to 10 MHz per decade 5');
    for (const d of r.noise!.in_density) expectNearlyEqual(d, Math.sqrt(4 * K * kelvin(27) * 1e3), 1e-8, 0, 'in');
  });
});

describe('bipolar amplifiers: input-referred noise', () => {
  // Hybrid-pi with rb, at low frequency (no capacitances, va = ∞). With R' = RS + rb and the source
  // driving the base through R', H = −gm·RC·rπ/(R' + rπ), and the sources referred to the input
  // (uncorrelated, powers add) give, exactly for this model:
  //   vn² = 4kT·R' + 2q·IB·R'² + (2q·IC + 4kT/RC)·((R' + rπ)/(gm·rπ))²
  // (thermal noise of RS and rb; base shot noise through R'; collector shot noise and the load
  // referred through the gain). Expanding the last term, 2q·IC/gm² = 2kT/gm, so for small R' this
  // is the textbook vi² = 4kT·(rb + 1/(2gm)) of Gray et al., Analysis and Design of Analog
  // Integrated Circuits, 5th ed., ch. 11 (equivalent input noise of a bipolar transistor, from
  // memory), which leaves out the base shot noise through rb and the correlation term.
  function ceExpected(op: BjtOp, rPrime: number, rc: number): number {
    const T = kelvin(27);
    const referred = (rPrime + op.rpi) / (op.gm * op.rpi);
    return 4 * K * T * rPrime + 2 * Q * op.ib * rPrime ** 2 + (2 * Q * op.ic + (4 * K * T) / rc) * referred ** 2;
  }

  it('common emitter with RS = 50 Ω and rb = 100 Ω: the exact hybrid-pi expression to 1e-7', () => {
    const r = solved(`model qn: npn(is=1e-16, beta=100, rb=100)
vcc: vsrc(vcc, gnd) 10
vin: vsrc(in, gnd) 0.78
rs: res(in, b) 50
q1: npn(c=out, b=b, e=gnd) qn
rc: res(vcc, out) 5k
analyze noise out out in vin from 1 Hz to 1 kHz per decade 1`);
    const op = r.op!.devices.q1 as BjtOp;
    expect(op.region).toBe('active');
    for (const d of r.noise!.in_density) expectNearlyEqual(d ** 2, ceExpected(op, 150, 5e3), 1e-7, 0, 'vn²');
    expectPowersAddUp(r);
  });

  it('common emitter driven at the base (RS = 0, rb = 50 Ω): Gray et al.\'s 4kT(rb + 1/(2gm)) within 2 %', () => {
    const r = solved(`model qn: npn(is=1e-16, beta=100, rb=50)
vcc: vsrc(vcc, gnd) 10
vin: vsrc(b, gnd) 0.77
q1: npn(c=out, b=b, e=gnd) qn
rc: res(vcc, out) 5k
analyze noise out out in vin from 1 Hz to 1 kHz per decade 1`);
    const op = r.op!.devices.q1 as BjtOp;
    const textbook = 4 * K * kelvin(27) * (50 + 1 / (2 * op.gm));
    expectNearlyEqual(r.noise!.in_density[0] ** 2, textbook, 0.02, 0, 'Gray et al. vi²');
    expectNearlyEqual(r.noise!.in_density[0] ** 2, ceExpected(op, 50, 5e3), 1e-7, 0, 'exact');
  });

  it('a resistively loaded pair with an ideal tail: twice the CE half circuit\'s power, loads referred through the half gain', () => {
    // The tail is a current source, so each half's noise reaches vod only through vπa − vπb:
    // (1 + R'·gπ)·(vπa − vπb) = vid + (noise voltages) − R'·(base shot currents), and
    // vod = −gm·RC·(vπa − vπb) − RC·(ica − icb) + (load noise). Hence |H| = gm·RC/(1 + R'·gπ) and
    // vn² = 2·[4kT·R' + 2q·IB·R'² + (2q·IC + 4kT/RC)·((1 + R'·gπ)/gm)²] — the CE half circuit's
    // expression twice (half-circuit method, e.g. Gray et al., 5th ed., ch. 11, differential pair noise).
    const r = solved(`model qn: npn(is=1e-16, beta=100, rb=100)
vcc: vsrc(vcc, gnd) 10
vee: vsrc(vee, gnd) -10
va: vsrc(ina, gnd) 0
vb: vsrc(inb, gnd) 0
rsa: res(ina, ba) 50
rsb: res(inb, bb) 50
qa: npn(c=outa, b=ba, e=tail) qn
qb: npn(c=outb, b=bb, e=tail) qn
it: isrc(tail, vee) 2m
rca: res(vcc, outa) 5k
rcb: res(vcc, outb) 5k
analyze noise out outa outb in va from 1 Hz to 1 kHz per decade 1`);
    const op = r.op!.devices.qa as BjtOp;
    const n = r.noise!;
    expect(n.out_ref).toBe('outb');
    for (const d of n.in_density) expectNearlyEqual(d ** 2, 2 * ceExpected(op, 150, 5e3), 1e-7, 0, 'pair vn²');
    const gain = (op.gm * 5e3) / (1 + 150 / op.rpi);
    expectNearlyEqual(n.out_density[0] / n.in_density[0], gain, 1e-7, 0, '|H|');
    // Symmetry: both halves contribute the same; the tail source is noiseless.
    expectNearlyEqual(n.contributors.qa[0], n.contributors.qb[0], 1e-9, 0, 'qa = qb');
    expect(n.contributors.it).toBeUndefined();
    expectPowersAddUp(r);
  });
});

describe('the adjoint method', () => {
  const amplifier = `model qn: npn(is=1e-16, beta=120, va=60, rb=200, cje=1p, cjc=0.4p, tauf=0.3n, flicker_corner=2k)
model mn: nmos(ucox=200u, vth=0.5, lambda=0.05, cgs=20f, cgd=5f)
model dd: diode(cj=2p)
vcc: vsrc(vcc, gnd) 10
vin: vsrc(in, gnd) 0.75
rs: res(in, b) 600
q1: npn(c=c1, b=b, e=e1) qn
re: res(e1, gnd) 100
ce: cap(e1, gnd) 1u
rc: res(vcc, c1) 5k
m1: nmos(d=d2, g=c1, s=s2) mn w=20u l=1u
rss: res(s2, gnd) 2k
rd: res(vcc, d2) 4k
d1: diode(a=d2, k=k3) dd
rk: res(k3, gnd) 20k
cl: cap(d2, gnd) 2p
analyze noise out d2 in vin from 10 Hz to 10 GHz per decade 4
`;

  it('contributors add up in power to the total at every frequency (to 1e-9)', () => {
    const r = solved(amplifier);
    expect(Object.keys(r.noise!.contributors)).toEqual(['rs', 'q1', 're', 'rc', 'm1', 'rss', 'rd', 'd1', 'rk']);
    expectPowersAddUp(r);
  });

  /** Random small circuits built around a bipolar stage, a MOS stage and a diode, with random R and C. */
  const randomCircuit = fc.record({
    values: fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 12, maxLength: 12 }),
    extra: fc.array(fc.record({ kind: fc.constantFrom('res', 'cap'), a: fc.nat(7), b: fc.nat(7), u: fc.double({ min: 0, max: 1, noNaN: true }) }), { maxLength: 5 }),
    differential: fc.boolean(),
    currentInput: fc.boolean(),
    logF: fc.double({ min: 1, max: 9, noNaN: true }),
  });

  it('equals one forward solve per noise source on random circuits (1e-9; an independent check of the transposed solve)', () => {
    fc.assert(
      fc.property(randomCircuit, ({ values: u, extra, differential, currentInput, logF }) => {
        const nodes = ['b', 'c1', 'e1', 'd2', 's2', 'k3', 'in', GROUND];
        const parts: PartSpec[] = [
          { kind: 'vsrc', name: 'vcc', p: 'vcc', n: GROUND, dc: 10 },
          currentInput ? { kind: 'isrc', name: 'src', from: GROUND, to: 'in', dc: 2e-6 + 1e-5 * u[0] } : { kind: 'vsrc', name: 'src', p: 'in', n: GROUND, dc: 0.7 + 0.1 * u[0] },
          { kind: 'res', name: 'rs', a: 'in', b: 'b', value: 100 + 1e4 * u[1] },
          { kind: 'res', name: 'rbias', a: 'b', b: GROUND, value: 1e5 },
          { kind: 'npn', name: 'q1', c: 'c1', b: 'b', e: 'e1', model: bjtModel({ rb: u[2] < 0.2 ? 0 : 300 * u[2], va: 50, cje: 1e-12, cjc: 0.3e-12, flickerCorner: 1e3 * u[3] }), area: 1 },
          { kind: 'res', name: 're', a: 'e1', b: GROUND, value: 10 + 1e3 * u[4] },
          { kind: 'res', name: 'rc', a: 'vcc', b: 'c1', value: 1e3 + 1e4 * u[5] },
          { kind: 'nmos', name: 'm1', d: 'd2', g: 'c1', s: 's2', b: 's2', model: mosModel({ ucox: 2e-4, lambda: 0.05 * u[6], cgs: 1e-14, cgd: 3e-15, flickerCorner: 1e4 * u[7] }), w: 1e-5, l: 1e-6, m: 1 },
          { kind: 'res', name: 'rss', a: 's2', b: GROUND, value: 500 + 5e3 * u[8] },
          { kind: 'res', name: 'rd', a: 'vcc', b: 'd2', value: 1e3 + 1e4 * u[9] },
          { kind: 'diode', name: 'd1', a: 'd2', k: 'k3', model: diodeModel({ cj: 1e-12 }), area: 1 },
          { kind: 'res', name: 'rk', a: 'k3', b: GROUND, value: 1e4 + 1e5 * u[10] },
        ];
        extra.forEach((x, k) => {
          const a = nodes[x.a];
          const b = nodes[x.b];
          if (a !== b && a !== 'in' && b !== 'in') parts.push({ kind: x.kind as 'res' | 'cap', name: `x${k}`, a, b, value: x.kind === 'res' ? 1e2 * 1e3 ** x.u : 1e-13 * 1e3 ** x.u });
        });
        const circuit = circuitOf(parts);
        const op = solveOperatingPoint(circuit);
        if (isOpFailure(op)) return;
        const system = linearize(circuit, op);
        const solver = createAcSolver(system);
        const sources = noiseSources(circuit, op, system);
        const f = 10 ** logF;
        const output = differential ? { node: 'd2', ref: 'c1' } : { node: 'd2' };
        const spectrum = noiseSpectrum(system, solver, sources, output, 'src', [f]);
        // Where the forward solve cannot factor the matrix either, both say so and there is nothing to compare.
        const drive = solver.solve(f, [{ sources: new Map([['src', { re: 1, im: 0 }]]) }])[0];
        expect(spectrum.singular).toEqual(drive.singular ? [0] : []);
        if (drive.singular) return;

        // Forward: inject each source's unit current (leaving a, entering b) and read the output.
        const rowName = new Map([...system.nodeIndex].map(([name, row]) => [row, name]));
        const expected = new Map<number, number>();
        for (const s of sources) {
          const injections = new Map<string, { re: number; im: number }>();
          if (s.a >= 0) injections.set(rowName.get(s.a)!, { re: -1, im: 0 });
          if (s.b >= 0) injections.set(rowName.get(s.b)!, { re: 1, im: 0 });
          const sol = solver.solve(f, [{ injections }])[0];
          const re = sol.v('d2').re - (differential ? sol.v('c1').re : 0);
          const im = sol.v('d2').im - (differential ? sol.v('c1').im : 0);
          expected.set(s.part, (expected.get(s.part) ?? 0) + (re * re + im * im) * sourceDensity(s, f));
        }
        let total = 0;
        for (const power of expected.values()) total += power;
        for (const [part, power] of expected) {
          // A part whose two terminals see the same transimpedance (rs into an ideal current
          // source) contributes a rounding-level difference: tolerance 1e-9 of the total as well.
          expectNearlyEqual(spectrum.partPower.get(part)![0], power, 1e-9, 1e-9 * total, circuit.parts[part].name);
        }
        expectNearlyEqual(spectrum.outPower[0], total, 1e-9, 1e-40, 'total');
        // The gain from the same transposed solve against the forward solve of the input alone.
        const hRe = drive.v('d2').re - (differential ? drive.v('c1').re : 0);
        const hIm = drive.v('d2').im - (differential ? drive.v('c1').im : 0);
        const scale = Math.hypot(hRe, hIm);
        expectNearlyEqual(spectrum.gainRe[0], hRe, 1e-9, 1e-12 * scale, 'Re H');
        expectNearlyEqual(spectrum.gainIm[0], hIm, 1e-9, 1e-12 * scale, 'Im H');
      }),
      { numRuns: 40, seed: 11 },
    );
  });
});
