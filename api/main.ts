/**
 * Starts the API (and the built app when NODEWRIGHT_STATIC_DIR is set) on the configured port.
 * Expects a migrated database; `tools/start.ts` prepares one.
 */
import { createApp } from './app';
import { configFromEnv } from './config';
import { createDataSource } from './data-source';
import { createLogger } from './logger';

export async function main(): Promise<void> {
  const config = configFromEnv();
  const logger = createLogger(config.logLevel);
  const dataSource = createDataSource(config.databaseUrl);
  await dataSource.initialize();
  const { app, close } = createApp({ dataSource, databaseUrl: config.databaseUrl, logger, sessionSecret: config.sessionSecret, staticDir: config.staticDir });
  const server = app.listen(config.port, config.host, () => {
    logger.info(`Nodewright API on http://${config.host}:${config.port}`);
  });
  const shutdown = () => {
    server.close(() => void Promise.all([close(), dataSource.destroy()]).then(() => process.exit(0)));
    setTimeout(() => process.exit(0), 3000).unref();
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
}

if (import.meta.filename === process.argv[1]) void main();
