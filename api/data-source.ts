/**
 * The one TypeORM DataSource. The TypeORM CLI loads this file, so it exports exactly one
 * DataSource (`default`); the app and tests make their own with `createDataSource(url)`.
 */
import { DataSource } from 'typeorm';
import { configFromEnv } from './config';
import { ENTITIES } from './entities';
import { MIGRATIONS } from './migrations';

/** A DataSource on `url` with our entities and migrations; never `synchronize`. */
export function createDataSource(url: string): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    logging: false,
  });
}

export default createDataSource(configFromEnv().databaseUrl);
