/**
 * PostgreSQL started, and stopped and started again in phase 2, through the control process
 * (pg-control.ts); and a watcher that notes when the database really goes down and comes back.
 */
import { fork } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import type { ControlAnswer, ControlRequest, Started } from './pg-control';

export interface ClusterControl {
  /** Starts (or reuses) the cluster; the app's URL of `database` and the administrator's. */
  start(database: string): Promise<Started>;
  stop(): Promise<void>;
  close(): Promise<void>;
}

/** Starts the control process and waits until it can act at once. */
export async function clusterControl(): Promise<ClusterControl> {
  const child = fork(fileURLToPath(new URL('./pg-control.ts', import.meta.url)), [], { execArgv: process.execArgv, stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
  let answer: (a: ControlAnswer) => void = () => undefined;
  child.on('message', (a: ControlAnswer) => answer(a));
  const failure = new Promise<never>((_, fail) => {
    child.once('error', fail);
    child.once('exit', (code) => fail(new Error(`the PostgreSQL control process exited (code ${code})`)));
  });
  failure.catch(() => undefined);
  const next = () => Promise.race([new Promise<ControlAnswer>((r) => (answer = r)), failure]);
  await next();
  const ask = async (request: ControlRequest) => {
    child.send(request);
    const a = await next();
    if (!('verb' in a) || !a.ok) throw new Error(`PostgreSQL ${request.verb} failed: ${'message' in a ? a.message : 'no answer'}`);
    return a;
  };
  return {
    start: async (database) => (await ask({ verb: 'start', database })).started!,
    stop: async () => void (await ask({ verb: 'stop' })),
    async close() {
      if (child.exitCode === null && child.signalCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.disconnect();
        await exited;
      }
    },
  };
}

/** Up and down changes of the database, as a fresh connection sees it every `everyMs`. */
export interface Watch {
  changes: { at: number; up: boolean; reason?: string }[];
  stop(): Promise<void>;
}

/** Refusals that mean down for sure; a slow answer on a busy machine does not. */
const DOWN = /ECONNREFUSED|shutting down|starting up|terminating connection|Connection terminated/i;

export function watchDatabase(url: string, everyMs = 100): Watch {
  const changes: Watch['changes'] = [];
  let running = true;
  let up: boolean | undefined;
  const probe = async (): Promise<{ up?: boolean; reason?: string }> => {
    const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 3000, query_timeout: 3000 });
    client.on('error', () => undefined);
    try {
      await client.connect();
      await client.query('SELECT 1');
      return { up: true };
    } catch (err) {
      const e = err as Error & { code?: string };
      const reason = `${e.code ?? ''} ${e.message}`.trim();
      return { up: DOWN.test(reason) ? false : undefined, reason };
    } finally {
      await client.end().catch(() => undefined);
    }
  };
  const loop = (async () => {
    while (running) {
      const seen = await probe();
      if (seen.up !== undefined && seen.up !== up) changes.push({ at: Date.now(), up: seen.up, ...(seen.reason ? { reason: seen.reason } : {}) });
      if (seen.up !== undefined) up = seen.up;
      await new Promise((r) => setTimeout(r, everyMs));
    }
  })();
  return {
    changes,
    async stop() {
      running = false;
      await loop;
    },
  };
}
