/**
 * The whole stack (identity fake, mail fake, API) in a worker thread, started as `npm start`
 * starts it. An exception nothing catches ends this worker, which the main thread reports as the
 * server crashing. Between phases it reports its heap, its event loop's delay and its pools' queues.
 */
import { monitorEventLoopDelay, performance, type IntervalHistogram } from 'node:perf_hooks';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { parentPort, workerData } from 'node:worker_threads';
import pg from 'pg';
import { startTeamStack } from '../team-stack';

export interface ServerSetup {
  databaseUrl: string;
  env: Record<string, string>;
}
export type ToServer = { type: 'sample' } | { type: 'report' } | { type: 'close' };
export interface ServerSample {
  /** This thread's heap after a full collection, at the start and end; the most seen between. */
  heapMb: { start: number; max: number; end: number };
  /** Per pool (TypeORM's, the session store's): most requests waiting at once for a connection,
   *  connections handed out, the longest wait for one (ms) and the waits over a second. */
  pools: Record<string, PoolStats>;
  /** How late the server's event loop ran timers (ms): a long synchronous task shows here. */
  loopDelayMs: { p50: number; p99: number; max: number };
}
export type FromServer = { type: 'ready'; url: string } | ({ type: 'report' } & ServerSample) | { type: 'closed' };

const setup = workerData as ServerSetup;
const mb = (bytes: number) => Math.round(bytes / 1048576);

/** The heap kept after a full collection: what a leak would make grow phase after phase. */
function settledHeapMb(): number {
  // gc() is not exposed without a flag at start-up; V8 lets a running process turn it on.
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
  return mb(process.memoryUsage().heapUsed);
}

// The session store's pool is made inside createApp, out of reach. To see every pool's queue and
// how long a request waits for a connection, each pool is noted and timed as it hands one out.
interface PoolStats {
  waitingMax: number;
  acquired: number;
  waitMsMax: number;
  waitsOver1s: number;
}
const pools = new Map<pg.Pool, PoolStats>();
const fresh = (): PoolStats => ({ waitingMax: 0, acquired: 0, waitMsMax: 0, waitsOver1s: 0 });
const connect = pg.Pool.prototype.connect as (this: pg.Pool, ...args: unknown[]) => unknown;
pg.Pool.prototype.connect = function (this: pg.Pool, ...args: unknown[]) {
  if (!pools.has(this)) pools.set(this, fresh());
  const t0 = performance.now();
  const noteWait = () => {
    const s = pools.get(this)!;
    const ms = performance.now() - t0;
    s.acquired++;
    s.waitMsMax = Math.max(s.waitMsMax, ms);
    if (ms > 1000) s.waitsOver1s++;
  };
  const [callback] = args;
  if (typeof callback === 'function') {
    return connect.call(this, (...r: unknown[]) => {
      noteWait();
      return (callback as (...r: unknown[]) => unknown)(...r);
    });
  }
  return (connect.apply(this, args) as Promise<unknown>).finally(noteWait);
} as typeof pg.Pool.prototype.connect;
const poolName = (p: pg.Pool) => `pool of ${(p as unknown as { options: { max: number } }).options.max}`;

const stack = await startTeamStack({ databaseUrl: setup.databaseUrl, appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, logLevel: 'warn', env: setup.env });
let sample: (ServerSample & { timer?: NodeJS.Timeout; delay?: IntervalHistogram }) | undefined;

parentPort!.on('message', async (m: ToServer) => {
  if (m.type === 'sample') {
    const start = settledHeapMb();
    const s: NonNullable<typeof sample> = { heapMb: { start, max: start, end: start }, pools: {}, loopDelayMs: { p50: 0, p99: 0, max: 0 } };
    for (const p of pools.keys()) pools.set(p, fresh());
    s.delay = monitorEventLoopDelay({ resolution: 10 });
    s.delay.enable();
    s.timer = setInterval(() => {
      s.heapMb.max = Math.max(s.heapMb.max, mb(process.memoryUsage().heapUsed));
      for (const [p, stats] of pools) stats.waitingMax = Math.max(stats.waitingMax, p.waitingCount);
    }, 250);
    sample = s;
  } else if (m.type === 'report' && sample) {
    clearInterval(sample.timer);
    const d = sample.delay!;
    d.disable();
    const ms = (ns: number) => Math.round(ns / 1e5) / 10;
    sample.heapMb.end = settledHeapMb();
    for (const [p, stats] of pools) sample.pools[poolName(p)] = { ...stats, waitMsMax: Math.round(stats.waitMsMax) };
    parentPort!.postMessage({ type: 'report', heapMb: sample.heapMb, pools: sample.pools, loopDelayMs: { p50: ms(d.percentile(50)), p99: ms(d.percentile(99)), max: ms(d.max) } } satisfies FromServer);
  } else if (m.type === 'close') {
    await stack.close();
    parentPort!.postMessage({ type: 'closed' } satisfies FromServer);
  }
});
parentPort!.postMessage({ type: 'ready', url: stack.url } satisfies FromServer);
