/**
 * Test databases: each test project gets a fresh database on the project's own PostgreSQL,
 * created, migrated and (where asked) seeded at the start of the run.
 */
import { prepareDatabase } from '../../tools/database';
import { startPostgres, type PostgresHandle } from '../../tools/postgres';

export interface TestDatabase {
  url: string;
  pg: PostgresHandle;
}

/** A fresh migrated database named `name` (dropped first if a previous run left it). */
export async function freshTestDatabase(name: string, options: { seed?: boolean } = {}): Promise<TestDatabase> {
  const pg = startPostgres();
  const url = await prepareDatabase(pg, name, { fresh: true, seed: options.seed });
  return { url, pg };
}
