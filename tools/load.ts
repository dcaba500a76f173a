/**
 * `npm run load [-- --seconds N] [--clients N]`: the team server under 100 signed-in designers,
 * then the same load while PostgreSQL restarts; every acknowledged save is looked up afterwards
 * as a revision. A tool that measures, not a test: it prints figures, writes
 * `test-results/load.json`, and exits 1 only if an acknowledged save is missing or different, or
 * the server crashed. DEVELOPERS.md, section "Load", says what the figures mean.
 *
 * Parts, in tools/load/: `run.ts` (the sequence), `server.ts` and `clients.ts` (worker threads:
 * the stack, the virtual clients), `cluster.ts`, `pg-control.ts` and `outage.ts` (PostgreSQL
 * stopped and started), `verify.ts`, `tally.ts`, `cpu.ts` and `report.ts` (the figures).
 */
import { resolve } from 'node:path';

function option(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0) return fallback;
  const value = Number(process.argv[i + 1]);
  if (!Number.isInteger(value) || value < 1) {
    console.error(`usage: npm run load -- [--seconds N] [--clients N]  (--${name} wants a whole number)`);
    process.exit(2);
  }
  return value;
}

const seconds = option('seconds', 30);
const clients = option('clients', 100);

// Phase 2 stops PostgreSQL. Other tools (npm test, npm run dev) may be using the project's
// cluster at the same moment, so the load runs on a cluster of its own, beside it, unless told
// otherwise. Set before tools/postgres.ts is loaded: it reads the port once, when imported.
const ownCluster = !process.env.NODEWRIGHT_PG_DATA && !process.env.NODEWRIGHT_PG_PORT;
if (ownCluster) {
  process.env.NODEWRIGHT_PG_PORT = '54339';
  process.env.NODEWRIGHT_PG_DATA = resolve(import.meta.dirname, '..', '.data', 'pg-load');
}

const { runLoad } = await import('./load/run');
// Exit outright: a socket or timer some part left open must not keep the tool hanging.
process.exit(await runLoad({ seconds, clients, ownCluster }));
