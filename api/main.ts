/**
 * Starts the API (and the built app when NODEWRIGHT_STATIC_DIR is set) on the configured port.
 * Expects a migrated database (`tools/start.ts` prepares one). A database that is not up yet is
 * waited for with a bounded back-off; an outage later is answered with 503 and recovers by itself.
 */
import type { Server } from 'node:http';
import type { Logger } from 'pino';
import type { DataSource } from 'typeorm';
import { createApp } from './app';
import { ConfigError, loadConfig, type ApiConfig } from './config';
import { createDataSource } from './data-source';
import { createLogger } from './logger';
import { purgeDeleted } from './services/netlists';

/** Tries to connect for about a minute: 0.25 s, 0.5 s, 1 s … capped at 8 s between tries. */
export async function connectWithRetry(ds: DataSource, logger: Logger, deadlineMs = 60_000): Promise<void> {
  const started = Date.now();
  for (let attempt = 1, wait = 250; ; attempt++, wait = Math.min(wait * 2, 8000)) {
    try {
      await ds.initialize();
      if (attempt > 1) logger.info({ attempt }, 'database reached');
      return;
    } catch (err) {
      if (Date.now() - started + wait > deadlineMs) throw new Error(`The database could not be reached for ${Math.round(deadlineMs / 1000)} s: ${(err as Error).message}`);
      logger.warn({ attempt, retryInMs: wait, reason: (err as Error).message }, 'database not reachable yet; retrying');
      await new Promise((r) => setTimeout(r, wait));
    }
  }
}

export interface RunningApi {
  server: Server;
  dataSource: DataSource;
  url: string;
  close(): Promise<void>;
}

/** Connects, builds the app and listens; used by `main()` and by the tools that serve the product. */
export async function startApi(config: ApiConfig, logger: Logger): Promise<RunningApi> {
  const ds = createDataSource(config.databaseUrl, { onPoolError: (err) => logger.warn({ reason: err.message }, 'database connection lost') });
  await connectWithRetry(ds, logger);
  const { app, close } = createApp({ dataSource: ds, config, logger });
  const purge = () => purgeDeleted(ds).then((n) => n && logger.info({ purged: n }, 'deleted netlists past their restore window removed'), () => undefined);
  void purge();
  const purgeTimer = setInterval(purge, 6 * 3600_000).unref();
  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  return {
    server,
    dataSource: ds,
    url: `http://${config.host}:${port}`,
    async close() {
      clearInterval(purgeTimer);
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
      await close();
      await ds.destroy();
    },
  };
}

export async function main(): Promise<void> {
  let config: ApiConfig;
  try {
    config = loadConfig();
  } catch (err) {
    console.error(err instanceof ConfigError ? err.message : err);
    process.exit(2);
  }
  const logger = createLogger(config.logLevel);
  let running: RunningApi;
  try {
    running = await startApi(config, logger);
  } catch (err) {
    logger.fatal({ reason: (err as Error).message }, 'could not start');
    process.exit(1);
  }
  logger.info(`Nodewright API on ${running.url}`);
  const shutdown = () => {
    void running.close().then(() => process.exit(0));
    setTimeout(() => process.exit(0), 3000).unref();
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}

if (import.meta.filename === process.argv[1]) void main();
