import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { handle } from '../middleware/handle';
import { getToday } from '../services/today.service';
import { cellarContext } from './cellar-context';

/** GET /api/cellars/:cellarId/today — the Today screen in one answer. */
export function todayRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/', handle({}, (_input, req) => getToday(ds, cellarContext(req))));
  return router;
}
