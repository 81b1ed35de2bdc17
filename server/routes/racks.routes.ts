import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { rackCreateSchema, rackUpdateSchema } from '../../shared/schemas/places';
import { handle } from '../middleware/handle';
import { createRack, deleteRack, findRacks, updateRack } from '../services/rack.service';
import { cellarContext } from './cellar-context';

const rackParams = z.object({ rackId: uuidSchema });


/** /api/cellars/:cellarId/racks — the cellar map: racks, shelves and what sits in each slot. */
export function rackRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellarId = (req: Parameters<typeof cellarContext>[0]) => cellarContext(req).cellarId;

  router.get('/', handle({}, (_input, req) => findRacks(ds.manager, cellarId(req))));
  router.post(
    '/',
    handle({ body: rackCreateSchema }, async ({ body }, req, res) => {
      const rack = await createRack(ds, cellarId(req), body);
      res.status(201);
      return rack;
    }),
  );
  router.patch(
    '/:rackId',
    handle({ params: rackParams, body: rackUpdateSchema }, ({ params, body }, req) => updateRack(ds, cellarId(req), params.rackId, body)),
  );
  router.delete(
    '/:rackId',
    handle({ params: rackParams }, async ({ params }, req, res) => {
      await deleteRack(ds, cellarId(req), params.rackId);
      res.status(204).end();
    }),
  );
  return router;
}
