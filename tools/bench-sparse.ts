/**
 * The sparse engine's part of `npm run bench`, on the bench's chains of differential stages:
 *
 *  - AC per frequency point at ≈ 10, 30, 100, 300 and 1000 nodes: the engine (sparse LU, its
 *    pivot order reused from point to point); the former dense path (the engine before the
 *    sparse LU: dense G + jωC, complex LU, no equilibration); today's dense LU (equilibrated,
 *    kept for the tiniest circuits; equilibration alone made it several times faster on these
 *    chains, its pivots keeping the rows sparse); and mathjs's own sparse LU (`slu`, AMD order,
 *    partial pivoting, then `lusolve`) on the same matrix. Targets: from 100 to 1000 nodes the
 *    cost per point grows at most 15×; at 300 nodes the engine is at least 20× faster than the
 *    former dense path.
 *  - The DC operating point of the 162-transistor chain, against the dense path (the same
 *    engine forced dense) and against the figure measured before the sparse engine existed.
 *    Target: at least 10× faster than that figure.
 *  - The dense/sparse crossover (numeric/linear-solver.ts DENSE_CROSSOVER): factor + solve of
 *    the small chains' AC and DC matrices with each LU.
 *
 * Dense and sparse are timed alternately, call by call, so a machine that slows down mid-run
 * (other jobs) moves both alike and the ratios stay honest.
 */
import { performance } from 'node:perf_hooks';
import { complex, lusolve, slu, sparse, type Complex } from 'mathjs';
import { createAcSolver } from '../solver/analysis/ac-solve';
import type { Excitation, LinearSystem, OperatingPoint } from '../solver/analysis/engine-api';
import { NewtonWorkspace } from '../solver/analysis/newton';
import { isOpFailure, solveOperatingPoint, solveWithWorkspace } from '../solver/analysis/operating-point';
import { linearize, sparseOf } from '../solver/analysis/small-signal';
import { circuitOf } from '../solver/analysis/test-circuits';
import type { Circuit } from '../solver/circuit/types';
import { complexLuFactor, complexLuSolve } from '../solver/numeric/complex-lu';
import { createComplexSolver, createRealSolver, DENSE_CROSSOVER } from '../solver/numeric/linear-solver';
import { npnChain } from '../solver/testing/npn-chain';

/**
 * DC operating point of the 162-transistor chain (54 stages, 301 nodes) with the dense engine,
 * measured by `npm run bench` at commit 5de16e2 (before the sparse engine), Node 20, on the
 * development machine: the reference of the ≥ 10× target.
 */
export const DENSE_OP_MS_BEFORE = 48.1;

type ChainFactory = (stages: number) => { circuit: Circuit; transistors: number };

/**
 * Median µs per call of `a` and of `b`, timed alternately after a warm-up; each sample times
 * `batch` calls in a row (calls of a microsecond or two are below the timer's resolution).
 */
function pairUs(a: () => void, b: () => void, minMs: number, maxRuns: number, batch = 1): [number, number] {
  for (let k = 0; k < Math.max(1, Math.min(batch, 1000)); k++) {
    a();
    b();
  }
  const sa: number[] = [];
  const sb: number[] = [];
  const start = performance.now();
  while (sa.length < maxRuns && (performance.now() - start < minMs || sa.length < 3)) {
    let t0 = performance.now();
    for (let k = 0; k < batch; k++) a();
    sa.push(((performance.now() - t0) * 1000) / batch);
    t0 = performance.now();
    for (let k = 0; k < batch; k++) b();
    sb.push(((performance.now() - t0) * 1000) / batch);
  }
  const median = (x: number[]) => x.sort((p, q) => p - q)[Math.floor(x.length / 2)];
  return [median(sa), median(sb)];
}

/** Median µs per call of `fn` after a warm-up. */
function soloUs(fn: () => void, minMs: number, maxRuns: number): number {
  return pairUs(fn, () => undefined, minMs, maxRuns)[0];
}

function requireOp(c: Circuit): OperatingPoint {
  const op = solveOperatingPoint(c);
  if (isOpFailure(op)) throw new Error(op.errors.map((e) => e.message).join('; '));
  return op;
}

const EXCITATION: Excitation = { sources: new Map([['va', { re: 0.5, im: 0 }], ['vb', { re: -0.5, im: 0 }]]) };

/** mathjs's sparse LU on the system at ω: matrix built per point (as a user would), slu, lusolve. */
function mathjsSparsePoint(sys: LinearSystem, omega: number): void {
  const { pattern, g, c } = sparseOf(sys);
  const n = sys.size;
  const rows: Complex[][] = [];
  for (let i = 0; i < n; i++) rows.push(new Array<Complex>(n).fill(complex(0, 0)));
  for (let j = 0; j < n; j++) for (let p = pattern.colPtr[j]; p < pattern.colPtr[j + 1]; p++) rows[pattern.rowIdx[p]][j] = complex(g[p], omega * c[p]);
  const b: Complex[][] = Array.from({ length: n }, () => [complex(0, 0)]);
  const a = sys.sources.get('va');
  const bb = sys.sources.get('vb');
  if (a?.kind === 'vsrc') b[a.row] = [complex(0.5, 0)];
  if (bb?.kind === 'vsrc') b[bb.row] = [complex(-0.5, 0)];
  lusolve(slu(sparse(rows), 1, 1), b);
}

/**
 * One AC point the way the engine did it before the sparse LU (commit 5de16e2): G copied into a
 * dense matrix, jωC added at its nonzeros, the dense complex LU with no equilibration, one solve.
 */
function formerDensePoint(sys: LinearSystem): () => void {
  const n = sys.size;
  const G = sys.G;
  const C = sys.C;
  const cAt = Int32Array.from(Array.from(C.keys()).filter((i) => C[i] !== 0));
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const piv = new Int32Array(n);
  const br = new Float64Array(n);
  const bi = new Float64Array(n);
  let k = 0;
  return () => {
    const omega = 2 * Math.PI * 1e6 * (1 + (k++ % 7) * 0.01);
    re.set(G);
    im.fill(0);
    for (let t = 0; t < cAt.length; t++) im[cAt[t]] = omega * C[cAt[t]];
    complexLuFactor(re, im, n, piv);
    br.fill(0);
    bi.fill(0);
    br[n - 1] = 1;
    complexLuSolve(re, im, n, piv, br, bi);
  };
}

function fmt(v: number): string {
  return v >= 100 ? v.toFixed(0) : v.toPrecision(3);
}

function printTable(header: string[], rows: string[][]): void {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padStart(widths[i])).join('  ');
  console.log(line(header));
  for (const r of rows) console.log(line(r));
}

/** Prints the sparse engine's rows; returns whether every target was met. */
export function benchSparse(chain: ChainFactory): boolean {
  console.log('\nSparse engine: AC per point (≈1 MHz), engine vs the dense LU vs mathjs slu on the same matrix');
  // ≈ 10, 30, 100, 300 and 1000 nodes.
  const stages = [1, 5, 17, 54, 180];
  const rows: { nodes: number; unknowns: number; ours: number; dense: number; former: number; mathjs: number }[] = [];
  const engines: (() => void)[] = [];
  for (const s of stages) {
    const { circuit } = chain(s);
    const sys = linearize(circuit, requireOp(circuit));
    const n = sys.size;
    const ours = createAcSolver(sys);
    const dense = createAcSolver(sys, 'dense');
    let k = 0;
    const f = () => 1e6 * (1 + (k++ % 7) * 0.01);
    engines.push(() => ours.solve(f(), [EXCITATION]));
    const big = n > 500;
    const [oursUs, denseUs] = pairUs(() => ours.solve(f(), [EXCITATION]), () => dense.solve(f(), [EXCITATION]), big ? 3000 : 800, big ? 10 : 2000);
    const mathjsUs = soloUs(() => mathjsSparsePoint(sys, 2 * Math.PI * f()), big ? 3000 : 800, big ? 3 : 200);
    const formerUs = soloUs(formerDensePoint(sys), big ? 3000 : 800, big ? 3 : 2000);
    rows.push({ nodes: circuit.nodes.length, unknowns: n, ours: oursUs, dense: denseUs, former: formerUs, mathjs: mathjsUs });
  }
  printTable(
    ['nodes', 'unknowns', 'engine µs/pt', 'former dense µs', 'former/engine', 'dense LU µs/pt', 'dense/engine', 'mathjs slu µs', 'slu/engine'],
    rows.map((r) => [
      String(r.nodes), String(r.unknowns), fmt(r.ours), fmt(r.former), (r.former / r.ours).toFixed(1), fmt(r.dense), (r.dense / r.ours).toFixed(1),
      fmt(r.mathjs), (r.mathjs / r.ours).toFixed(0),
    ]),
  );
  console.log('(former dense: the AC path before the sparse engine — dense G + jωC, complex LU, no equilibration; dense LU: today\'s equilibrated dense LU, kept for the tiniest circuits)');
  const at100 = rows[2];
  const at300 = rows[3];
  const at1000 = rows[4];
  // The growth from 100 to 1000 nodes, the two timed alternately (the table's rows were timed
  // minutes apart, and a loaded machine can change speed in between).
  const [us100, us1000] = pairUs(engines[2], engines[4], 3000, 400);
  const growth = us1000 / us100;
  const speedup300 = at300.former / at300.ours;
  console.log(`growth ${at100.nodes} → ${at1000.nodes} nodes (${fmt(us100)} → ${fmt(us1000)} µs, timed alternately): ×${growth.toFixed(1)} (target ≤ 15) ${growth <= 15 ? 'met' : 'NOT met'}; at ${at300.nodes} nodes former dense path/engine ×${speedup300.toFixed(0)} (target ≥ 20) ${speedup300 >= 20 ? 'met' : 'NOT met'}, today's dense LU/engine ×${(at300.dense / at300.ours).toFixed(1)}`);

  // The 162-transistor operating point.
  const { circuit, transistors } = chain(54);
  const [opSparseUs, opDenseUs] = pairUs(
    () => solveWithWorkspace(new NewtonWorkspace(circuit)),
    () => solveWithWorkspace(new NewtonWorkspace(circuit, 'dense')),
    2000, 100,
  );
  const opMs = opSparseUs / 1000;
  const gain = DENSE_OP_MS_BEFORE / opMs;
  console.log(`${transistors}-transistor chain (${circuit.nodes.length} nodes) DC operating point: ${fmt(opMs)} ms; dense path now ${fmt(opDenseUs / 1000)} ms (×${(opDenseUs / opSparseUs).toFixed(1)}); before the sparse engine ${DENSE_OP_MS_BEFORE} ms: ×${gain.toFixed(1)} (target ≥ 10) ${gain >= 10 ? 'met' : 'NOT met'}`);

  // Crossover: the dense and the sparse LU on the same small matrices (an RC divider, single-ended
  // npn chains of 1 to 4 stages, then the differential chains).
  console.log(`dense/sparse crossover (factor + solve; DENSE_CROSSOVER = ${DENSE_CROSSOVER} unknowns):`);
  const cross: string[][] = [];
  const divider = circuitOf([
    { kind: 'vsrc', name: 'v1', p: 'a', n: 'gnd', dc: 1 },
    { kind: 'res', name: 'r1', a: 'a', b: 'b', value: 1e3 },
    { kind: 'res', name: 'r2', a: 'b', b: 'gnd', value: 1e3 },
    { kind: 'cap', name: 'c1', a: 'b', b: 'gnd', value: 1e-9 },
  ]);
  const small = [divider, ...[1, 2, 3, 4].map((s) => npnChain(s)), ...[1, 2, 3, 5, 8].map((s) => chain(s).circuit)];
  for (const c of small) {
    const op = requireOp(c);
    const sys = linearize(c, op);
    const { pattern, g, c: cv } = sparseOf(sys);
    const im = Float64Array.from(cv, (v) => 2 * Math.PI * 1e6 * v);
    const br = new Float64Array(sys.size);
    const bi = new Float64Array(sys.size);
    const acDense = createComplexSolver(pattern, 'dense');
    const acSparse = createComplexSolver(pattern, 'sparse');
    const [acD, acS] = pairUs(
      () => { acDense.factor(g, im); br.fill(1); bi.fill(0); acDense.solve(br, bi); },
      () => { acSparse.factor(g, im); br.fill(1); bi.fill(0); acSparse.solve(br, bi); },
      400, 200, 200,
    );
    const ws = new NewtonWorkspace(c);
    ws.prepare(1, c.options.minG);
    ws.values.set(ws.linValues);
    ws.b.set(ws.bLin);
    ws.devices.stateFrom(op.x);
    ws.devices.stamp(op.x, ws.values, ws.b, false);
    const dcDense = createRealSolver(ws.pattern, 'dense');
    const dcSparse = createRealSolver(ws.pattern, 'sparse');
    const x = new Float64Array(sys.size);
    const [dcD, dcS] = pairUs(
      () => { dcDense.factor(ws.values); x.set(ws.b); dcDense.solve(x); },
      () => { dcSparse.factor(ws.values); x.set(ws.b); dcSparse.solve(x); },
      400, 200, 200,
    );
    cross.push([String(sys.size), fmt(acD), fmt(acS), (acD / acS).toFixed(2), fmt(dcD), fmt(dcS), (dcD / dcS).toFixed(2)]);
  }
  printTable(['unknowns', 'AC dense µs', 'AC sparse µs', 'dense/sparse', 'DC dense µs', 'DC sparse µs', 'dense/sparse'], cross);
  return growth <= 15 && speedup300 >= 20 && gain >= 10;
}
