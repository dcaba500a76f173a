/**
 * The load tool's threads. The main thread only directs: the server and the clients each run in
 * a worker, so that a signal (Ctrl-C) is handled at once even while the server is saturated.
 * Under `tsx`, a child that does not acknowledge a signal within some 60 ms is killed outright,
 * and then nothing it started would be stopped.
 */
import { Worker } from 'node:worker_threads';

/** A worker running a TypeScript module, through tsx's loader (a worker does not inherit it). */
export function tsWorker(module: URL, workerData?: unknown): Worker {
  const loader = import.meta.resolve('tsx/esm/api');
  const code = `import { register } from ${JSON.stringify(loader)}; register(); await import(${JSON.stringify(module.href)});`;
  return new Worker(new URL(`data:text/javascript,${encodeURIComponent(code)}`), { workerData });
}

/** The messages of a worker, one at a time; `undefined` once the worker failed or `stopped` fired. */
export function mailbox<T>(worker: Worker, stopped: Promise<void>) {
  const queue: T[] = [];
  let failure: Error | undefined;
  let wake = () => {};
  worker.on('message', (m: T) => {
    queue.push(m);
    wake();
  });
  const end = (err: Error) => {
    failure ??= err;
    wake();
  };
  worker.on('error', end);
  worker.on('exit', (code) => end(new Error(`the worker exited (code ${code})`)));
  let halted = false;
  void stopped.then(() => {
    halted = true;
    wake();
  });
  return {
    /** Why the worker ended, if it did. */
    failure: () => failure,
    async next(): Promise<T | undefined> {
      while (!queue.length && !failure && !halted) await new Promise<void>((r) => (wake = r));
      return queue.shift();
    },
  };
}
