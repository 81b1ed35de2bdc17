import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { deviceCreateSchema, deviceMoveSchema, deviceParamsSchema } from '../../shared/schemas/devices';
import { cellarHandler } from '../http/handle';
import { createDevice, listDevices, moveDevice, revokeDevice } from './devices.service';

/** /api/cellars/:cellarId/devices — the cellar's digital hydrometers (Keepers). */
export function deviceRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, (_input, actor, tx) => listDevices(actor, tx)),
  );
  router.post(
    '/',
    cellar({ body: deviceCreateSchema }, async ({ body }, actor, tx, _req, res) => {
      res.status(201);
      return createDevice(actor, tx, body);
    }),
  );
  router.post(
    '/:deviceId/move',
    cellar({ params: deviceParamsSchema, body: deviceMoveSchema }, ({ params, body }, actor, tx) => moveDevice(actor, tx, params.deviceId, body)),
  );
  router.post(
    '/:deviceId/revoke',
    cellar({ params: deviceParamsSchema }, ({ params }, actor, tx) => revokeDevice(actor, tx, params.deviceId)),
  );
  return router;
}
