import type { TestProject } from 'vitest/node';
import { buildApp, APP_DIST } from '../../tools/build-app';
import { ensureChromium } from '../support/browser';
import { freshTestDatabase, type TestDatabase } from '../support/test-database';
import { startTeamStack, type RunningStack } from '../../tools/team-stack';

let db: TestDatabase | undefined;
let stack: RunningStack | undefined;

/**
 * The real product: built app + API on a fresh seeded database, with the development identity
 * provider and mail fake, all on ephemeral loopback ports.
 */
export async function setup(project: TestProject): Promise<void> {
  ensureChromium();
  buildApp({ quiet: true });
  db = await freshTestDatabase('nodewright_test_e2e', { seed: true });
  stack = await startTeamStack({ databaseUrl: db.url, appPort: 0, idpPort: 0, smtpPort: 0, inboxPort: 0, staticDir: APP_DIST, logLevel: 'warn' });
  project.provide('baseUrl', stack.url);
  project.provide('inboxUrl', stack.mail.inboxUrl);
  project.provide('databaseUrl', db.url);
}

export async function teardown(): Promise<void> {
  await stack?.close();
  db?.pg.stop();
}
