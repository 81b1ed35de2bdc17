import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { mailSettingsSchema } from '../../shared/schemas/mail-settings';
import { cellarHandler } from '../http/handle';
import { getMyMailSettings, setMyMailSettings } from './mail-settings.service';

/** /api/cellars/:cellarId/mail-settings — each member's own e-mail reminders (Guests included). */
export function mailSettingsRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => getMyMailSettings(actor, tx)),
  );
  router.put(
    '/',
    cellar({ body: mailSettingsSchema }, ({ body }, actor, tx) => setMyMailSettings(actor, tx, body)),
  );
  return router;
}
