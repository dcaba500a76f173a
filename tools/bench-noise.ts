/**
 * The noise part of `npm run bench`: the time of the noise analysis per frequency point against
 * the AC analysis per frequency point, on the same circuits and the same 20-point grid. Noise
 * factors the matrix once per point, as AC does, and then makes ONE transposed solve for every
 * contributor (analysis/noise.ts) instead of one forward solve per excitation. Target for
 * n ≥ 30: noise/AC ≤ 2.5.
 */
import { performance } from 'node:perf_hooks';
import { createAcSolver } from '../solver/analysis/ac-solve';
import type { Excitation } from '../solver/analysis/engine-api';
import { noiseSpectrum } from '../solver/analysis/noise';
import { noiseSources } from '../solver/analysis/noise-sources';
import { isOpFailure, solveOperatingPoint } from '../solver/analysis/operating-point';
import { linearize } from '../solver/analysis/small-signal';
import type { Circuit } from '../solver/circuit/types';

/**
 * Median µs per call of `a` and of `b`, timed alternately (a, b, a, b, …) for at least `minMs`
 * after a warm-up, so a machine that slows down or speeds up mid-run moves both alike.
 */
function medianPairUs(a: () => void, b: () => void, minMs = 600, maxRuns = 400): [number, number] {
  a();
  b();
  const sa: number[] = [];
  const sb: number[] = [];
  const start = performance.now();
  while (sa.length < maxRuns && (performance.now() - start < minMs || sa.length < 7)) {
    let t0 = performance.now();
    a();
    sa.push((performance.now() - t0) * 1000);
    t0 = performance.now();
    b();
    sb.push((performance.now() - t0) * 1000);
  }
  const median = (x: number[]) => x.sort((p, q) => p - q)[Math.floor(x.length / 2)];
  return [median(sa), median(sb)];
}

/**
 * Prints one row per circuit: unknowns, noise sources, AC µs per point, noise µs per point and
 * their ratio; returns whether every circuit with n ≥ 30 met the target. Each circuit's output is
 * the pair of nodes `outa`/`outb` of its last stage, its input the source `va`.
 */
export function benchNoise(circuits: readonly { circuit: Circuit; outA: string; outB: string }[]): boolean {
  const grid = Array.from({ length: 20 }, (_, k) => 1e3 * 10 ** (k / 4));
  const excitation: Excitation = { sources: new Map([['va', { re: 0.5, im: 0 }], ['vb', { re: -0.5, im: 0 }]]) };
  console.log('\nNoise per frequency point against AC per frequency point (20-point grid, 1 kHz to 56 MHz; target noise/AC ≤ 2.5 for n ≥ 30)');
  const header = ['nodes', 'unknowns', 'sources', 'AC µs/pt', 'noise µs/pt', 'noise/AC'];
  const rows: string[][] = [];
  let ok = true;
  for (const { circuit, outA, outB } of circuits) {
    const op = solveOperatingPoint(circuit);
    if (isOpFailure(op)) throw new Error(op.errors.map((e) => e.message).join('; '));
    const system = linearize(circuit, op);
    const solver = createAcSolver(system);
    const sources = noiseSources(circuit, op, system);
    const [acSweepUs, noiseSweepUs] = medianPairUs(
      () => {
        for (const f of grid) solver.solve(f, [excitation]);
      },
      () => {
        noiseSpectrum(system, solver, sources, { node: outA, ref: outB }, 'va', grid);
      },
    );
    const acUs = acSweepUs / grid.length;
    const noiseUs = noiseSweepUs / grid.length;
    const ratio = noiseUs / acUs;
    if (circuit.nodes.length >= 30) ok &&= ratio <= 2.5;
    rows.push([String(circuit.nodes.length), String(system.size), String(sources.length), acUs.toFixed(1), noiseUs.toFixed(1), ratio.toFixed(2)]);
  }
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => c.padStart(widths[i])).join('  ');
  console.log(line(header));
  for (const r of rows) console.log(line(r));
  console.log(`target for n ≥ 30: noise/AC ≤ 2.5 ${ok ? 'met' : 'NOT met'}`);
  return ok;
}
