/**
 * `npm start`: PostgreSQL (project-local, password authentication), migrations, demo data, the
 * built app, the development identity provider and mail fake, and one server on 127.0.0.1
 * serving app + API. Ctrl-C or SIGTERM stops everything it started.
 */
import { buildApp, APP_DIST } from './build-app';
import { prepareDatabase } from './database';
import { clusterSecrets, startPostgres } from './postgres';
import { onStopRequest } from './lifecycle';
import { startTeamStack, type RunningStack } from './team-stack';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../api/services/seed';
import { devPorts } from './ports';

const started = Date.now();
const pg = startPostgres();
let stopping = false;
let stack: RunningStack | undefined;

async function shutdown(code: number): Promise<void> {
  if (stopping) return;
  stopping = true;
  try {
    await stack?.close();
  } catch {
    /* already closing */
  }
  pg.stop();
  process.exit(code);
}
onStopRequest(() => void shutdown(0));

try {
  const databaseUrl = await prepareDatabase(pg, process.env.NODEWRIGHT_DB ?? 'nodewright', { seed: true });
  buildApp();
  const ports = devPorts();
  stack = await startTeamStack({
    databaseUrl,
    host: process.env.NODEWRIGHT_HOST ?? '127.0.0.1',
    ...ports,
    staticDir: APP_DIST,
    logLevel: process.env.NODEWRIGHT_LOG_LEVEL ?? 'info',
    env: process.env.NODEWRIGHT_SESSION_SECRET ? {} : { NODEWRIGHT_SESSION_SECRET: clusterSecrets()!.sessionSecret },
  });
  console.log(`\nNodewright is ready at ${stack.url}/  (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  console.log(`The bench: ${stack.url}/bench — open Examples for the Strainlab demo netlists.`);
  console.log(`Sign in (development identity provider at ${stack.idp.issuer}) with password "${DEMO_PASSWORD}" as:`);
  for (const a of DEMO_ACCOUNTS) console.log(`  ${a.email.padEnd(26)} ${a.membership ? `${a.membership.role} of ${a.membership.workspace}` : 'no workspace yet (invite them)'}`);
  console.log(`Mail sent by the server lands in the development inbox: ${stack.mail.inboxUrl}`);
  console.log('Press Ctrl-C to stop (PostgreSQL stops with it).');
} catch (e) {
  console.error(`\nCould not start Nodewright: ${(e as Error).message}`);
  await shutdown(1);
}
