import type { TestProject } from 'vitest/node';
import { buildApp, APP_DIST } from '../../tools/build-app';
import { ensureChromium } from '../support/browser';
import { freshTestDatabase, type TestDatabase } from '../support/test-database';
import { serveProduct, type RunningServer } from '../../tools/serve';

let db: TestDatabase | undefined;
let server: RunningServer | undefined;

/** The real product: built app + API on a fresh seeded database, on an ephemeral loopback port. */
export async function setup(project: TestProject): Promise<void> {
  ensureChromium();
  buildApp({ quiet: true });
  db = await freshTestDatabase('nodewright_test_e2e', { seed: true });
  server = await serveProduct({ databaseUrl: db.url, host: '127.0.0.1', port: 0, staticDir: APP_DIST, logLevel: 'warn' });
  project.provide('baseUrl', server.url);
}

export async function teardown(): Promise<void> {
  await server?.close();
  db?.pg.stop();
}
