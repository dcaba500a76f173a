/**
 * Runs the whole product in this process: API + built app on one port, on a migrated database.
 * Used by `npm start` and by the browser tests.
 */
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../api/app';
import { createDataSource } from '../api/data-source';
import { createLogger } from '../api/logger';

export interface RunningServer {
  url: string;
  close(): Promise<void>;
}

export async function serveProduct(options: { databaseUrl: string; host: string; port: number; staticDir: string; logLevel?: string; sessionSecret?: string }): Promise<RunningServer> {
  const logger = createLogger(options.logLevel ?? 'warn');
  const dataSource = createDataSource(options.databaseUrl);
  await dataSource.initialize();
  const { app, close } = createApp({
    dataSource,
    databaseUrl: options.databaseUrl,
    logger,
    sessionSecret: options.sessionSecret ?? process.env.NODEWRIGHT_SESSION_SECRET ?? 'nodewright-development-only-secret',
    staticDir: options.staticDir,
  });
  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port, options.host, () => resolve(s));
    s.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://${options.host}:${port}`,
    async close() {
      server.closeAllConnections();
      await new Promise<void>((r) => server.close(() => r()));
      await close();
      await dataSource.destroy();
    },
  };
}
