/**
 * Database preparation shared by `npm start`, `npm test` and `npm run db:migrate`:
 * create the database when missing (or afresh), run the committed migrations, optionally seed.
 */
import pg from 'pg';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../api/data-source';
import { seedDemoData } from '../api/services/seed';
import { seedLibrary } from './seed-library';
import { PG_USER, type PostgresHandle } from './postgres';

function quoteIdent(name: string): string {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Unsafe database name: ${name}`);
  return `"${name}"`;
}

/** Creates `name` on the cluster; with `fresh`, drops it first. */
export async function ensureDatabase(pgHandle: PostgresHandle, name: string, fresh = false): Promise<void> {
  const client = new pg.Client({ connectionString: pgHandle.adminUrl('postgres') });
  await client.connect();
  try {
    if (fresh) await client.query(`DROP DATABASE IF EXISTS ${quoteIdent(name)} WITH (FORCE)`);
    const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    // Owned by the app role, so its migrations can create tables, though it is no superuser.
    if (!rowCount) await client.query(`CREATE DATABASE ${quoteIdent(name)} OWNER ${quoteIdent(PG_USER)}`);
  } finally {
    await client.end();
  }
}

/** Runs pending migrations on `url`; returns the initialised DataSource (caller destroys it). */
export async function migrate(url: string): Promise<DataSource> {
  const ds = createDataSource(url);
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  return ds;
}

/** Everything `npm start` needs of the database: it exists, is migrated and has the demo data. */
export async function prepareDatabase(pgHandle: PostgresHandle, name: string, options: { fresh?: boolean; seed?: boolean } = {}): Promise<string> {
  await ensureDatabase(pgHandle, name, options.fresh);
  const url = pgHandle.url(name);
  const ds = await migrate(url);
  try {
    if (options.seed) {
      await seedDemoData(ds);
      await seedLibrary(ds);
    }
  } finally {
    await ds.destroy();
  }
  return url;
}
