import type { DataSource } from 'typeorm';

export interface Health {
  database: 'ok' | 'down';
  /** Applied migrations count, so a stale schema shows. */
  migrations: number;
  version: string;
}

/** Asks PostgreSQL for the applied migrations; any failure reads as `down`. */
export async function databaseHealth(dataSource: DataSource): Promise<Health> {
  const version = process.env.npm_package_version ?? '0.1.0';
  try {
    const rows: { n: string }[] = await dataSource.query('SELECT count(*)::text AS n FROM migrations');
    return { database: 'ok', migrations: Number(rows[0].n), version };
  } catch {
    return { database: 'down', migrations: 0, version };
  }
}
