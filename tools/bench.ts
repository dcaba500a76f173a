/**
 * `npm run bench`: speed of the numerical engine on generated amplifier chains.
 *
 * Circuits: chains of bipolar differential stages (collector resistors, emitter degeneration,
 * alternately a resistor tail and a two-transistor mirror tail), each stage's outputs driving the next stage's bases;
 * sized to about 10, 30, 100 and 300 nodes. For each: the DC operating point; the AC solve per
 * frequency point (G + jωC formed into preallocated storage, one complex LU, one back-solve);
 * (a) the floor: a bare copy + complex LU factor + solve of the same matrix with the engine's
 * own LU (sparse from DENSE_CROSSOVER unknowns on, ./bench-sparse.ts); (b) the peer: the same AC
 * system solved with mathjs complex `lusolve`; and, beside them, ml-matrix's LU on the
 * real-equivalent 2n system [[G, −ωC], [ωC, G]], and ml-matrix's real LU against ours on the
 * DC Newton matrix. Then ./bench-sparse.ts: the sparse engine from 10 to 1000 nodes against the
 * dense LU and mathjs's sparse LU, the 162-transistor operating point, the dense/sparse crossover.
 *
 * Targets: ours/floor ≤ 1.5 and peer/ours ≥ 20 for n ≥ 30; a 50-transistor operating point well
 * under 20 ms.
 */
import { performance } from 'node:perf_hooks';
import { complex, lusolve, matrix, type Complex } from 'mathjs';
import { LuDecomposition, Matrix } from 'ml-matrix';
import { createAcSolver } from '../solver/analysis/ac-solve';
import type { Excitation, LinearSystem, OperatingPoint } from '../solver/analysis/engine-api';
import { NewtonWorkspace } from '../solver/analysis/newton';
import { isOpFailure, solveOperatingPoint } from '../solver/analysis/operating-point';
import { linearize } from '../solver/analysis/small-signal';
import { bjtModel, circuitOf, type PartSpec } from '../solver/analysis/test-circuits';
import type { Circuit } from '../solver/circuit/types';
import { createComplexSolver, createRealSolver } from '../solver/numeric/linear-solver';
import { benchMismatch } from './bench-mismatch';
import { benchNoise } from './bench-noise';
import { benchPoles } from './bench-poles';
import { benchSparse } from './bench-sparse';
import { benchSweeps } from './bench-sweeps';

/** A chain of `stages` differential stages; returns the circuit and its transistor count. */
function diffChain(stages: number): { circuit: Circuit; transistors: number } {
  const q = bjtModel({ is: 1e-16, beta: 150, va: 60, cje: 1e-12, cjc: 0.4e-12, tauf: 0.2e-9, rb: 0 });
  const parts: PartSpec[] = [
    { kind: 'vsrc', name: 'vcc', p: 'vcc', n: 'gnd', dc: 10 },
    { kind: 'vsrc', name: 'vee', p: 'vee', n: 'gnd', dc: -10 },
    { kind: 'vsrc', name: 'va', p: 'in_a', n: 'gnd', dc: 0, ac: { mag: 0.5, phaseDeg: 0 } },
    { kind: 'vsrc', name: 'vb', p: 'in_b', n: 'gnd', dc: 0, ac: { mag: 0.5, phaseDeg: 180 } },
  ];
  let transistors = 0;
  let inA = 'in_a';
  let inB = 'in_b';
  for (let s = 0; s < stages; s++) {
    const outA = `s${s}.outa`;
    const outB = `s${s}.outb`;
    const tail = `s${s}.tail`;
    const ea = `s${s}.ea`;
    const eb = `s${s}.eb`;
    parts.push({ kind: 'res', name: `s${s}.rca`, a: 'vcc', b: outA, value: 2e3 });
    parts.push({ kind: 'res', name: `s${s}.rcb`, a: 'vcc', b: outB, value: 2e3 });
    parts.push({ kind: 'cap', name: `s${s}.cl`, a: outA, b: outB, value: 0.2e-12 });
    parts.push({ kind: 'npn', name: `s${s}.qa`, c: outA, b: inA, e: ea, model: q, area: 1 });
    parts.push({ kind: 'npn', name: `s${s}.qb`, c: outB, b: inB, e: eb, model: q, area: 1 });
    // Emitter degeneration keeps each stage's gain just under one, so a long open-loop chain
    // stays well posed (a chain of 80× stages would amplify rounding into volts).
    parts.push({ kind: 'res', name: `s${s}.rea`, a: ea, b: tail, value: 2e3 });
    parts.push({ kind: 'res', name: `s${s}.reb`, a: eb, b: tail, value: 2e3 });
    transistors += 2;
    if (s % 2 === 0) {
      // Mirror tail: about 1 mA from a resistor into a diode-connected transistor.
      const ref = `s${s}.ref`;
      parts.push({ kind: 'res', name: `s${s}.rref`, a: 'gnd', b: ref, value: 9.3e3 });
      parts.push({ kind: 'npn', name: `s${s}.qr`, c: ref, b: ref, e: 'vee', model: q, area: 1 });
      parts.push({ kind: 'npn', name: `s${s}.qt`, c: tail, b: ref, e: 'vee', model: q, area: 1 });
      transistors += 2;
    } else {
      parts.push({ kind: 'res', name: `s${s}.rt`, a: tail, b: 'vee', value: 17e3 });
    }
    inA = outA;
    inB = outB;
  }
  return { circuit: circuitOf(parts, {}, `chain of ${stages} differential stages`), transistors };
}

/** Median time in µs of `fn` over batches lasting at least `minMs` in total. */
function timeUs(fn: () => void, minMs = 300, maxRuns = 2000): number {
  fn(); // warm up
  const samples: number[] = [];
  const start = performance.now();
  while (samples.length < maxRuns && (performance.now() - start < minMs || samples.length < 5)) {
    const t0 = performance.now();
    fn();
    samples.push((performance.now() - t0) * 1000);
  }
  samples.sort((a, b) => a - b);
  return samples[Math.floor(samples.length / 2)];
}

function requireOp(c: Circuit): OperatingPoint {
  const op = solveOperatingPoint(c);
  if (isOpFailure(op)) throw new Error(op.errors.map((e) => e.message).join('; '));
  return op;
}

/** The AC matrix G + jωC as split arrays of values on the system's pattern. */
function formAc(sys: LinearSystem, omega: number): { re: Float64Array; im: Float64Array } {
  const re = Float64Array.from(sys.sparse!.g);
  const im = Float64Array.from(sys.sparse!.c, (c) => omega * c);
  return { re, im };
}

/** Right-hand side of the differential excitation. */
function rhs(sys: LinearSystem): { br: Float64Array; bi: Float64Array } {
  const br = new Float64Array(sys.size);
  const bi = new Float64Array(sys.size);
  const a = sys.sources.get('va');
  const b = sys.sources.get('vb');
  if (a?.kind === 'vsrc') br[a.row] = 0.5;
  if (b?.kind === 'vsrc') br[b.row] = -0.5;
  return { br, bi };
}

interface Row {
  nodes: number;
  unknowns: number;
  transistors: number;
  method: string;
  opMs: number;
  acUs: number;
  floorUs: number;
  peerUs: number;
  mlUs: number;
  newtonLuUs: number;
  mlRealUs: number;
}

function benchOne(stages: number): Row {
  const { circuit, transistors } = diffChain(stages);
  const op = requireOp(circuit);
  const opUs = timeUs(() => requireOp(circuit), 400, 200);
  const sys = linearize(circuit, op);
  const n = sys.size;
  const f = 1e6;
  const omega = 2 * Math.PI * f;
  const excitation: Excitation = { sources: new Map([['va', { re: 0.5, im: 0 }], ['vb', { re: -0.5, im: 0 }]]) };

  // Ours: the AC solver per frequency point.
  const solver = createAcSolver(sys);
  let k = 0;
  const acUs = timeUs(() => {
    solver.solve(f * (1 + (k++ % 7) * 0.01), [excitation]);
  });

  // (a) Floor: bare copy + factor + solve of the same complex matrix with the engine's LU.
  const { re: re0, im: im0 } = formAc(sys, omega);
  const re = new Float64Array(re0.length);
  const im = new Float64Array(im0.length);
  const floorLu = createComplexSolver(sys.sparse!.pattern);
  const { br: br0, bi: bi0 } = rhs(sys);
  const br = new Float64Array(n);
  const bi = new Float64Array(n);
  const floorUs = timeUs(() => {
    re.set(re0);
    im.set(im0);
    floorLu.factor(re, im);
    br.set(br0);
    bi.set(bi0);
    floorLu.solve(br, bi);
  });

  // (b) Peer: mathjs complex lusolve on the same system (matrix built per point, as a user would).
  const peerUs = timeUs(() => {
    const A: Complex[][] = [];
    for (let i = 0; i < n; i++) {
      const row: Complex[] = [];
      for (let j = 0; j < n; j++) row.push(complex(sys.G[i * n + j], omega * sys.C[i * n + j]));
      A.push(row);
    }
    lusolve(matrix(A), Array.from(br0, (v, i) => [complex(v, bi0[i])]));
  }, n > 150 ? 1500 : 600, n > 150 ? 3 : 200);

  // ml-matrix LU on the real-equivalent 2n system.
  const mlUs = timeUs(() => {
    const M = new Matrix(2 * n, 2 * n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const g = sys.G[i * n + j];
        const c = omega * sys.C[i * n + j];
        M.set(i, j, g);
        M.set(i, j + n, -c);
        M.set(i + n, j, c);
        M.set(i + n, j + n, g);
      }
    }
    const b = Matrix.columnVector([...br0, ...bi0]);
    new LuDecomposition(M).solve(b);
  }, 600, n > 150 ? 20 : 500);

  // The DC hot path: our real LU against ml-matrix's on the Newton matrix at the solution.
  const ws = new NewtonWorkspace(circuit);
  ws.prepare(1, circuit.options.minG);
  const a = Float64Array.from(ws.linValues);
  const bDc = Float64Array.from(ws.bLin);
  ws.devices.stateFrom(op.x);
  ws.devices.stamp(op.x, a, bDc, false);
  const lu = createRealSolver(ws.pattern);
  const x = new Float64Array(n);
  const newtonLuUs = timeUs(() => {
    lu.factor(a);
    x.set(bDc);
    lu.solve(x);
  });
  const aDense = ws.pattern.toDense(a);
  const rows2d = Array.from({ length: n }, (_, i) => Array.from(aDense.subarray(i * n, i * n + n)));
  const mlRealUs = timeUs(() => {
    new LuDecomposition(new Matrix(rows2d)).solve(Matrix.columnVector(Array.from(bDc)));
  }, 400, n > 150 ? 50 : 1000);

  return {
    nodes: circuit.nodes.length, unknowns: n, transistors, method: op.method, opMs: opUs / 1000,
    acUs, floorUs, peerUs, mlUs, newtonLuUs, mlRealUs,
  };
}

function fmt(v: number, digits = 3): string {
  return v >= 100 ? v.toFixed(0) : v.toPrecision(digits);
}

async function main(): Promise<void> {
  // Stage counts giving ≈ 10, 30, 100 and 300 nodes (5.5 nodes per stage plus 4 rails/inputs).
  const sizes = [1, 5, 17, 54];
  const rows = sizes.map(benchOne);
  const header = ['nodes', 'unknowns', 'BJTs', 'OP ms', 'AC µs/pt', 'floor µs', 'ours/floor', 'mathjs µs', 'peer/ours', 'ml-2n µs', 'ml-2n/ours', 'DC LU µs', 'ml LU µs'];
  const table = rows.map((r) => [
    String(r.nodes), String(r.unknowns), String(r.transistors), fmt(r.opMs), fmt(r.acUs), fmt(r.floorUs),
    (r.acUs / r.floorUs).toFixed(2), fmt(r.peerUs), (r.peerUs / r.acUs).toFixed(0), fmt(r.mlUs),
    (r.mlUs / r.acUs).toFixed(1), fmt(r.newtonLuUs), fmt(r.mlRealUs),
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...table.map((row) => row[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padStart(widths[i])).join('  ');
  console.log('Nodewright engine bench (median per call; AC at ~1 MHz, differential excitation)\n');
  console.log(line(header));
  for (const row of table) console.log(line(row));

  // The 50-transistor operating point target.
  const { circuit, transistors } = diffChain(17);
  const opMs = timeUs(() => requireOp(circuit), 500, 200) / 1000;
  console.log(`\n${transistors}-transistor chain (${circuit.nodes.length} nodes): DC operating point ${fmt(opMs)} ms (target well under 20 ms)`);

  const big = rows.filter((r) => r.nodes >= 30);
  const okFloor = big.every((r) => r.acUs / r.floorUs <= 1.5);
  const okPeer = big.every((r) => r.peerUs / r.acUs >= 20);
  console.log(`targets for n ≥ 30: ours/floor ≤ 1.5 ${okFloor ? 'met' : 'NOT met'}; peer/ours ≥ 20 ${okPeer ? 'met' : 'NOT met'}; OP < 20 ms ${opMs < 20 ? 'met' : 'NOT met'}`);
  // The output of each chain is its last stage's pair of collectors.
  benchNoise(sizes.map((stages) => ({ circuit: diffChain(stages).circuit, outA: `s${stages - 1}.outa`, outB: `s${stages - 1}.outb` })));
  benchPoles(sizes.map((stages) => ({ circuit: diffChain(stages).circuit, outA: `s${stages - 1}.outa`, outB: `s${stages - 1}.outb` })));
  benchSparse(diffChain);
  benchSweeps();
  await benchMismatch();
}

void main();
