/**
 * The sequence of `npm run load`: PostgreSQL, a fresh seeded database, the stack and the
 * clients (each in a worker); phase 1 (steady), verify; phase 2 (PostgreSQL stopped a third of
 * the way in and started 5 s later), verify; the summary. Whatever happens, Ctrl-C included,
 * what it started is stopped.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { dirname, resolve } from 'node:path';
import type { Worker } from 'node:worker_threads';
import pg from 'pg';
import { prepareDatabase } from '../database';
import { onStopRequest } from '../lifecycle';
import { startPostgres, stopPostgres } from '../postgres';
import type { ClientsSetup, FromClients, ToClients } from './clients';
import { clusterControl, watchDatabase, type ClusterControl, type Watch } from './cluster';
import type { Started } from './pg-control';
import { cpuMeter } from './cpu';
import { outageOf, scheduleRestart, type Restart } from './outage';
import { figuresOf, printOutage, printPhase, printSummary, type PhaseFigures } from './report';
import type { FromServer, ServerSetup, ToServer } from './server';
import type { Ack, PhaseResult } from './tally';
import { mailbox, tsWorker } from './threads';
import { verificationLine, verified, verifyAcks, type Verification } from './verify';

const DATABASE = 'nodewright_load';
const TIMEOUT_MS = 10_000;
const SHARED_NETLISTS = 4;
const OUTPUT = resolve(import.meta.dirname, '..', '..', 'test-results', 'load.json');

export interface LoadOptions {
  seconds: number;
  clients: number;
  /** The cluster is the load tool's own: stop it at the end even if an earlier run left it running. */
  ownCluster: boolean;
}

async function verifyIn(url: string, acks: Ack[], unanswered: PhaseResult['unanswered']): Promise<Verification> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    return await verifyAcks((sql, params) => client.query(sql, params).then((r) => r.rows), acks, unanswered);
  } finally {
    await client.end();
  }
}

export async function runLoad(o: LoadOptions): Promise<number> {
  let started: Started | undefined;
  let server: Worker | undefined;
  let clients: Worker | undefined;
  let control: ClusterControl | undefined;
  let watch: Watch | undefined;
  let restart: Restart | undefined;
  const crashes: string[] = [];
  let closing = false;
  let stopReason: string | undefined;
  let wake = () => {};
  const stopped = new Promise<void>((r) => (wake = r));
  const stop = (reason: string) => {
    stopReason ??= reason;
    clients?.postMessage({ type: 'stop' } satisfies ToClients);
    wake();
  };
  onStopRequest((reason) => {
    console.log(`\n${reason}: stopping what was started…`);
    stop(reason);
  });

  const phases: PhaseFigures[] = [];
  try {
    const t0 = Date.now();
    control = await clusterControl();
    started = await control.start(DATABASE);
    const { url, adminUrl } = started;
    if (stopReason) return 1;
    const databaseUrl = await prepareDatabase({ ...started, url: () => url, adminUrl: () => adminUrl, stop: () => undefined }, DATABASE, { fresh: true, seed: true });
    if (stopReason) return 1;
    const env = { NODEWRIGHT_SIGNIN_RATE: '100000', NODEWRIGHT_SHARED_RATE: '100000', NODEWRIGHT_SESSION_SECRET: randomBytes(32).toString('hex') };
    server = tsWorker(new URL('./server.ts', import.meta.url), { databaseUrl, env } satisfies ServerSetup);
    const fromServer = mailbox<FromServer>(server, stopped);
    const up = await fromServer.next();
    if (up?.type !== 'ready') throw new Error(`the server did not start: ${fromServer.failure()?.message ?? stopReason}`);
    // From here, the server's worker ending by itself is a crash.
    server.on('error', (err) => crashes.push(err.stack ?? err.message));
    server.on('exit', (code) => {
      if (closing) return;
      crashes.push(`the server's thread ended (code ${code})`);
      stop('the server crashed');
    });
    const closeServer = async () => {
      closing = true;
      server!.postMessage({ type: 'close' } satisfies ToServer);
      await Promise.race([fromServer.next(), new Promise((r) => setTimeout(r, 5000))]);
    };
    console.log(`PostgreSQL on port ${started.port} (${started.startedHere ? 'started' : 'already running'}), database ${DATABASE}, server at ${up.url} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);

    clients = tsWorker(new URL('./clients.ts', import.meta.url), { url: up.url, clients: o.clients, shared: SHARED_NETLISTS, timeoutMs: TIMEOUT_MS } satisfies ClientsSetup);
    const fromClients = mailbox<FromClients>(clients, stopped);
    const ready = await fromClients.next();
    if (ready?.type !== 'ready') throw new Error(`the clients could not start: ${ready?.type === 'failed' ? ready.message : (fromClients.failure()?.message ?? stopReason)}`);
    console.log(`${o.clients} clients signed in through the provider's form in ${(ready.signInMs / 1000).toFixed(1)} s; ${ready.netlists} netlists (${SHARED_NETLISTS} shared); the ${ready.blocks} seed blocks in the catalogue`);

    const dataDir = process.env.NODEWRIGHT_PG_DATA!;
    /** One phase with the server's and the machine's figures around it. */
    const runPhase = async (name: string, seconds = o.seconds) => {
      server!.postMessage({ type: 'sample' } satisfies ToServer);
      const loadBefore = loadavg()[0];
      const cpu = cpuMeter(dataDir, server!, clients!);
      let rss = 0;
      const rssTimer = setInterval(() => (rss = Math.max(rss, process.memoryUsage.rss())), 250);
      clients!.postMessage({ type: 'run', phase: name, seconds } satisfies ToClients);
      const m = await fromClients.next();
      clearInterval(rssTimer);
      if (m?.type === 'failed') throw new Error(`the clients failed: ${m.message}`);
      if (m?.type !== 'done') return undefined;
      const cpuFigures = cpu(name === 'restart');
      server!.postMessage({ type: 'report' } satisfies ToServer);
      const r = await fromServer.next();
      if (r?.type !== 'report') return undefined;
      const load = [loadBefore, loadavg()[0]].map((l) => Math.round(l * 10) / 10);
      return { result: m.result, cpu: cpuFigures, server: { heapMb: r.heapMb, rssMbMax: Math.round(rss / 1048576), pools: r.pools, loopDelayMs: r.loopDelayMs, loadAverage: load, crashed: [...crashes] } };
    };

    console.log(`\nPhase 1: ${o.clients} clients, ${o.seconds} s, about 25 % block library reads, 52 % netlist reads, 23 % saves…`);
    const steady = await runPhase('steady');
    if (!steady || stopReason) return 1;
    const v1 = await verifyIn(databaseUrl, steady.result.acks, steady.result.unanswered);
    phases.push(figuresOf(steady.result, v1, steady.server, steady.cpu));
    printPhase(phases[0]);
    console.log(`  ${verificationLine(v1)}`);

    const stopAfter = Math.min(10, o.seconds / 3);
    console.log(`\nPhase 2: the same load; PostgreSQL stops at ${stopAfter.toFixed(0)} s and starts again 5 s later…`);
    watch = watchDatabase(databaseUrl);
    restart = scheduleRestart(control, DATABASE, stopAfter * 1000, stopped);
    const restarting = await runPhase('restart');
    await restart.done().catch((err: Error) => stop(`restarting PostgreSQL failed: ${err.message}`));
    await new Promise((r) => setTimeout(r, 300)); // the watcher's next probe sees the database up
    await watch.stop();
    if (!restarting || stopReason) return 1;
    const v2 = await verifyIn(databaseUrl, [...steady.result.acks, ...restarting.result.acks], [...steady.result.unanswered, ...restarting.result.unanswered]);
    phases.push(figuresOf(restarting.result, v2, restarting.server, restarting.cpu, outageOf(restarting.result, restart.marks, watch)));
    printPhase(phases[1]);
    printOutage(phases[1]);
    console.log(`  ${verificationLine(v2)} (both phases)`);

    // After the restart the server must still answer promptly, not hang on dead connections.
    const health = await fetch(`${up.url}/api/health`, { signal: AbortSignal.timeout(TIMEOUT_MS) }).then((r) => r.status, (e: Error) => e.name);
    console.log(`  afterwards: GET /api/health → ${health}`);
    await closeServer();

    printSummary(phases);
    const ok = phases.every((f) => verified(f.verification)) && !crashes.length;
    mkdirSync(dirname(OUTPUT), { recursive: true });
    writeFileSync(OUTPUT, `${JSON.stringify({ at: new Date().toISOString(), clients: o.clients, seconds: o.seconds, cores: availableParallelism(), healthAfter: health, ok, crashes, phases }, null, 2)}\n`);
    console.log(`\n${ok ? 'No acknowledged save lost; the server did not crash.' : 'FAILED: an acknowledged save is missing or different, or the server crashed.'}  Figures in ${OUTPUT}`);
    return ok ? 0 : 1;
  } catch (err) {
    console.error(`\nThe load run stopped: ${(err as Error).message}`);
    return 1;
  } finally {
    restart?.cancel();
    await watch?.stop().catch(() => undefined);
    await clients?.terminate().catch(() => undefined);
    closing = true;
    await server?.terminate().catch(() => undefined);
    await restart?.done().catch(() => undefined);
    if (crashes.length) console.error(`\nThe server crashed:\n${crashes.join('\n')}`);
    // Leave the cluster as found: stopped if this run started it (or it is the tool's own),
    // running if it was running before. Past the signal's acknowledgement, blocking is harmless.
    try {
      if (started?.startedHere || o.ownCluster) stopPostgres();
      else if (started && restart?.down()) startPostgres();
    } catch (err) {
      console.error(`PostgreSQL: ${(err as Error).message}`);
    }
    await control?.close().catch(() => undefined);
  }
}
