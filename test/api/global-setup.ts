import type { TestProject } from 'vitest/node';
import { freshTestDatabase, type TestDatabase } from '../support/test-database';

let db: TestDatabase | undefined;

/** One fresh seeded database per run of the api project, on the real PostgreSQL. */
export async function setup(project: TestProject): Promise<void> {
  db = await freshTestDatabase('nodewright_test_api', { seed: true });
  project.provide('databaseUrl', db.url);
}

export async function teardown(): Promise<void> {
  db?.pg.stop();
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    baseUrl: string;
    inboxUrl: string;
  }
}
