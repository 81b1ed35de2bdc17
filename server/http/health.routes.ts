import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { Health } from '../../shared/schemas/common';

/** GET /api/health — 200 when the database answers, 503 when it does not. */
export function healthRoutes(ds: DataSource): Router {
  const router = Router();
  router.get('/', async (_req, res) => {
    let database: Health['database'] = 'down';
    try {
      await ds.query('SELECT 1');
      database = 'up';
    } catch {
      // reported below
    }
    const body: Health = { status: database === 'up' ? 'ok' : 'degraded', database };
    res.status(database === 'up' ? 200 : 503).json(body);
  });
  return router;
}
