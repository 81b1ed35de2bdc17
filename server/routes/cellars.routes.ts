import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { cellarUpdateSchema } from '../../shared/schemas/cellars';
import { handle } from '../middleware/handle';
import { describeSessionUser } from '../services/account.service';
import { getCellar, updateCellar } from '../services/cellar.service';
import { cellarContext } from './cellar-context';

/** GET /api/cellars — the caller's cellars. */
export function cellarListRoutes(ds: DataSource): Router {
  const router = Router();
  router.get('/', handle({}, async (_input, req) => (await describeSessionUser(ds, req.user!)).cellars));
  return router;
}

/** /api/cellars/:cellarId/settings — readable by members, changed by Keepers. */
export function cellarSettingsRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/', handle({}, (_input, req) => getCellar(ds, cellarContext(req))));
  router.patch('/', handle({ body: cellarUpdateSchema }, ({ body }, req) => updateCellar(ds, cellarContext(req), body)));
  return router;
}
