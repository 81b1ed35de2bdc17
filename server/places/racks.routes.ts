import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { rackCreateSchema, rackUpdateSchema } from '../../shared/schemas/places';
import { cellarHandler } from '../http/handle';
import { createRack, deleteRack, listRacks, updateRack } from './rack.service';

const rackParams = z.object({ rackId: uuidSchema });

/** /api/cellars/:cellarId/racks — the cellar map: racks, shelves and what sits in each slot. */
export function rackRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);

  router.get(
    '/',
    cellar({}, (_input, actor, tx) => listRacks(actor, tx)),
  );
  router.post(
    '/',
    cellar({ body: rackCreateSchema }, async ({ body }, actor, tx, req, res) => {
      const rack = await createRack(actor, tx, body);
      res.status(201);
      return rack;
    }),
  );
  router.patch(
    '/:rackId',
    cellar({ params: rackParams, body: rackUpdateSchema }, ({ params, body }, actor, tx) => updateRack(actor, tx, params.rackId, body)),
  );
  router.delete(
    '/:rackId',
    cellar({ params: rackParams }, ({ params }, actor, tx) => deleteRack(actor, tx, params.rackId)),
  );
  return router;
}
