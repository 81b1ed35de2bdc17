import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { cellarUpdateSchema } from '../../shared/schemas/cellars';
import { describeSessionUser } from '../accounts/session-user';
import { cellarHandler, handle } from '../http/handle';
import { getCellar, updateCellar } from './cellar.service';

/** GET /api/cellars — the caller's cellars. */
export function cellarListRoutes(ds: DataSource): Router {
  const router = Router();
  router.get(
    '/',
    handle({}, async (_input, req) => (await describeSessionUser(ds, req.user!)).cellars),
  );
  return router;
}

/** /api/cellars/:cellarId/settings — readable by members, changed by Keepers. */
export function cellarSettingsRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => getCellar(actor, tx)),
  );
  router.patch(
    '/',
    cellar({ body: cellarUpdateSchema }, ({ body }, actor, tx) => updateCellar(actor, tx, body)),
  );
  return router;
}
