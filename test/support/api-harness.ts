/**
 * Builds the real Express app on the test database for supertest (real HTTP on an ephemeral port).
 */
import { inject } from 'vitest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { createApp } from '../../api/app';
import { createDataSource } from '../../api/data-source';
import { createLogger } from '../../api/logger';

export interface ApiHarness {
  app: Express;
  dataSource: DataSource;
  close(): Promise<void>;
}

export async function startApi(): Promise<ApiHarness> {
  const databaseUrl = inject('databaseUrl');
  const dataSource = createDataSource(databaseUrl);
  await dataSource.initialize();
  const { app, close } = createApp({ dataSource, databaseUrl, logger: createLogger('silent'), sessionSecret: 'test-secret' });
  return {
    app,
    dataSource,
    async close() {
      await close();
      await dataSource.destroy();
    },
  };
}
