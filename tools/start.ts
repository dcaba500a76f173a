/**
 * `npm start`: PostgreSQL (project-local), migrations, demo data, the built app, and one server on
 * 127.0.0.1 serving app + API. Ctrl-C or SIGTERM stops everything it started.
 */
import { buildApp, APP_DIST } from './build-app';
import { prepareDatabase } from './database';
import { startPostgres } from './postgres';
import { onStopRequest } from './lifecycle';
import { serveProduct } from './serve';

const started = Date.now();
const pg = startPostgres();
let stopping = false;
let server: Awaited<ReturnType<typeof serveProduct>> | undefined;

async function shutdown(code: number): Promise<void> {
  if (stopping) return;
  stopping = true;
  try {
    await server?.close();
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
  server = await serveProduct({
    databaseUrl,
    host: process.env.NODEWRIGHT_HOST ?? '127.0.0.1',
    port: Number(process.env.NODEWRIGHT_PORT ?? 4280),
    staticDir: APP_DIST,
    logLevel: process.env.NODEWRIGHT_LOG_LEVEL ?? 'info',
  });
  console.log(`\nNodewright is ready at ${server.url}/  (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  console.log(`The bench: ${server.url}/bench — open Examples for the Strainlab demo netlists.`);
  console.log('Press Ctrl-C to stop (PostgreSQL stops with it).');
} catch (e) {
  console.error(`\nCould not start Nodewright: ${(e as Error).message}`);
  await shutdown(1);
}
