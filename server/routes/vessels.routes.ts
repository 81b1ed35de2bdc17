import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { moveSchema } from '../../shared/schemas/places';
import { uuidSchema } from '../../shared/schemas/common';
import {
  rackTargetQuerySchema,
  vesselCleaningSchema,
  vesselCreateSchema,
  vesselListQuerySchema,
  vesselRetireSchema,
  vesselUpdateSchema,
} from '../../shared/schemas/vessels';
import { handle } from '../middleware/handle';
import {
  createVessel,
  deleteVessel,
  getVesselDetail,
  listVessels,
  moveVessel,
  setCleaning,
  setRetired,
  suggestRackTarget,
  updateVessel,
} from '../services/vessel.service';
import { cellarContext } from './cellar-context';

const vesselParams = z.object({ vesselId: uuidSchema });

/** `exclude=id,id` as a checked list of ids (an issue names the bad one: query.exclude.1). */
const rackTargetQuery = rackTargetQuerySchema.extend({
  exclude: rackTargetQuerySchema.shape.exclude
    .transform((list) => (list ?? '').split(',').map((id) => id.trim()).filter(Boolean))
    .pipe(z.array(uuidSchema).max(200, 'at most 200 ids')),
});

/** DELETE has no body: the version the caller saw may come as a query parameter. */
const deleteQuery = z.object({ expectedVersion: z.coerce.number().int().optional() });

/** /api/cellars/:cellarId/vessels — everyone reads; Hands and Keepers change; Keepers delete. */
export function vesselRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellarId = (req: Parameters<typeof cellarContext>[0]) => cellarContext(req).cellarId;

  router.get('/', handle({ query: vesselListQuerySchema }, ({ query }, req) => listVessels(ds.manager, cellarId(req), query)));
  router.post(
    '/',
    handle({ body: vesselCreateSchema }, async ({ body }, req, res) => {
      const vessel = await createVessel(ds, cellarId(req), body);
      res.status(201);
      return vessel;
    }),
  );
  // Before /:vesselId, which would otherwise take "rack-target" for an id.
  router.get('/rack-target', handle({ query: rackTargetQuery }, ({ query }, req) => suggestRackTarget(ds, cellarId(req), query)));
  router.get('/:vesselId', handle({ params: vesselParams }, ({ params }, req) => getVesselDetail(ds, cellarId(req), params.vesselId)));
  router.patch(
    '/:vesselId',
    handle({ params: vesselParams, body: vesselUpdateSchema }, ({ params, body }, req) => updateVessel(ds, cellarId(req), params.vesselId, body)),
  );
  router.post(
    '/:vesselId/cleaning',
    handle({ params: vesselParams, body: vesselCleaningSchema }, ({ params, body }, req) => setCleaning(ds, cellarId(req), params.vesselId, body)),
  );
  router.post(
    '/:vesselId/retirement',
    handle({ params: vesselParams, body: vesselRetireSchema }, ({ params, body }, req) => setRetired(ds, cellarId(req), params.vesselId, body)),
  );
  router.put(
    '/:vesselId/place',
    handle({ params: vesselParams, body: moveSchema }, ({ params, body }, req) => moveVessel(ds, cellarId(req), params.vesselId, body)),
  );
  router.delete(
    '/:vesselId',
    handle({ params: vesselParams, query: deleteQuery }, async ({ params, query }, req, res) => {
      await deleteVessel(ds, cellarId(req), params.vesselId, query.expectedVersion);
      res.status(204).end();
    }),
  );
  return router;
}
