/**
 * The one TypeORM DataSource. The TypeORM CLI loads this file, so it exports exactly one
 * DataSource (`default`); the app and tests make their own with `createDataSource(url)`.
 */
import { DataSource } from 'typeorm';
import { loadConfig } from './config';
import { ENTITIES } from './entities';
import { MIGRATIONS } from './migrations';

export interface PoolOptions {
  /** Called when an idle pooled connection is lost (the database restarted). */
  onPoolError?: (err: Error) => void;
  max?: number;
}

/**
 * A DataSource on `url` with our entities and migrations; never `synchronize`. The pool has a
 * connect timeout and a statement timeout, so an outage or a stuck query fails within seconds.
 */
export function createDataSource(url: string, options: PoolOptions = {}): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    logging: false,
    poolSize: options.max ?? 20,
    connectTimeoutMS: 5000,
    extra: { statement_timeout: 15000, idle_in_transaction_session_timeout: 30000, idleTimeoutMillis: 30000 },
    poolErrorHandler: options.onPoolError ?? (() => undefined),
  });
}

export default createDataSource(process.env.NODEWRIGHT_DATABASE_URL ?? loadConfig().databaseUrl);
