import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { cellarHandler } from '../http/handle';
import { getToday } from './today.service';

/** GET /api/cellars/:cellarId/today — the Today screen in one answer. */
export function todayRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => getToday(actor, tx)),
  );
  return router;
}
