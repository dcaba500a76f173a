/**
 * The mismatch part of `npm run bench`: runs per second on the mirror-loaded demo netlist (ports
 * at one frequency, no curves), solved by 1 and by 2 worker_threads over the same solver code,
 * each worker taking a contiguous share of the runs (run i's draws depend on (seed, i) only, so
 * the split does not change the numbers — the merged statistics are compared). Target: 2
 * workers ≥ 1.7× the runs per second of 1.
 */
import { performance } from 'node:perf_hooks';
import { Worker, isMainThread, parentPort } from 'node:worker_threads';
import { MIRROR_LOADED } from '../src/app/bench/examples/mirror-loaded';
import { parseNetlist } from '../solver';
import type { MismatchRequest } from '../solver/circuit/analyses';
import { mismatchSamples, summarizeMismatch, type MismatchSample } from '../solver/run/mismatch';

const RUNS = 1600;
const LINE = `analyze mismatch runs ${RUNS} seed 7 beta 5% is 2% res 0.5%`;

/** The demo without its ac sweep (ports at one frequency) and with the mismatch line. */
function netlist(): string {
  return `${MIRROR_LOADED.text.replace(/^analyze ac .*$/m, '')}\n${LINE}\n`;
}

function solveRange(from: number, to: number): MismatchSample[] {
  const parsed = parseNetlist(netlist());
  const request = parsed.requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch')!;
  return mismatchSamples(parsed.circuit!, parsed.requests, request, from, to);
}

if (!isMainThread) {
  // A worker solves each range it is sent, until it is terminated.
  parentPort!.on('message', ({ from, to }: { from: number; to: number }) => parentPort!.postMessage(solveRange(from, to)));
  parentPort!.postMessage('ready');
}

/** A started worker thread, its module loaded and warm. */
async function startWorker(): Promise<Worker> {
  // A worker thread starts without tsx's loader: it registers it, then loads this file.
  const boot = `import('tsx/esm/api').then(async ({ register }) => { register(); await import(${JSON.stringify(import.meta.url)}); });`;
  const w = new Worker(boot, { eval: true });
  await new Promise<void>((resolve, reject) => {
    w.once('message', () => resolve());
    w.once('error', reject);
  });
  return w;
}

function ask(w: Worker, from: number, to: number): Promise<MismatchSample[]> {
  return new Promise((resolve, reject) => {
    w.once('message', resolve);
    w.once('error', reject);
    w.postMessage({ from, to });
  });
}

/** Solves every run over the given (started, warmed) workers; the samples and the wall time in ms. */
async function timed(workers: Worker[]): Promise<{ samples: MismatchSample[]; ms: number }> {
  const share = Math.ceil(RUNS / workers.length);
  const t0 = performance.now();
  const parts = await Promise.all(workers.map((w, k) => ask(w, k * share, Math.min(RUNS, (k + 1) * share))));
  return { samples: parts.flat(), ms: performance.now() - t0 };
}

/** Prints the mismatch rows; true when the 2-worker target is met. */
export async function benchMismatch(): Promise<boolean> {
  const parsed = parseNetlist(netlist());
  const request = parsed.requests.analyses.find((a): a is MismatchRequest => a.kind === 'mismatch')!;
  const pool = [await startWorker(), await startWorker()];
  await Promise.all(pool.map((w) => ask(w, 0, 20))); // warm the JIT
  const one = await timed(pool.slice(0, 1));
  const two = await timed(pool);
  await Promise.all(pool.map((w) => w.terminate()));
  const same = JSON.stringify(summarizeMismatch(request, one.samples)) === JSON.stringify(summarizeMismatch(request, two.samples));
  const rate1 = RUNS / (one.ms / 1000);
  const rate2 = RUNS / (two.ms / 1000);
  const gain = rate2 / rate1;
  console.log(`\nMismatch on the mirror-loaded demo (${RUNS} runs, ports at one frequency, threads started and warm):`);
  console.log(`  1 worker ${rate1.toFixed(0)} runs/s; 2 workers ${rate2.toFixed(0)} runs/s = ${gain.toFixed(2)}× (target ≥ 1.7×) ${gain >= 1.7 ? 'met' : 'NOT met'}; same statistics: ${same ? 'yes' : 'NO'}`);
  return gain >= 1.7 && same;
}
