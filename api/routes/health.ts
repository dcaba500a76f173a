import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { databaseHealth } from '../services/health';

/** `GET /api/health`: liveness plus a database round trip. */
export function healthRouter(dataSource: DataSource): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const health = await databaseHealth(dataSource);
    res.status(health.database === 'ok' ? 200 : 503).json({ status: health.database === 'ok' ? 'ok' : 'degraded', ...health });
  });
  return router;
}
