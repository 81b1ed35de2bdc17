import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { moveSchema } from '../../shared/schemas/places';
import {
  rackTargetQuerySchema,
  vesselCleaningSchema,
  vesselCreateSchema,
  vesselListQuerySchema,
  vesselRetireSchema,
  vesselUpdateSchema,
} from '../../shared/schemas/vessels';
import { emptyVesselRequestSchema } from '../../shared/schemas/vessel-emptying';
import { cellarHandler } from '../http/handle';
import { idempotent } from '../http/idempotency';
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
} from './vessel.service';
import { emptyVessel } from './emptying.service';

const vesselParams = z.object({ vesselId: uuidSchema });

/** `exclude=id,id` as a checked list of ids (an issue names the bad one: query.exclude.1). */
const rackTargetQuery = rackTargetQuerySchema.extend({
  exclude: rackTargetQuerySchema.shape.exclude
    .transform((list) =>
      (list ?? '')
        .split(',')
        .map((id) => id.trim())
        .filter(Boolean),
    )
    .pipe(z.array(uuidSchema).max(200, 'at most 200 ids')),
});

/** DELETE has no body: the version the caller saw may come as a query parameter. */
const deleteQuery = z.object({ expectedVersion: z.coerce.number().int().optional() });

/** /api/cellars/:cellarId/vessels — everyone reads; Hands and Keepers change; Keepers delete. */
export function vesselRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);

  router.get(
    '/',
    cellar({ query: vesselListQuerySchema }, ({ query }, actor, tx) => listVessels(actor, tx, query)),
  );
  router.post(
    '/',
    cellar({ body: vesselCreateSchema }, async ({ body }, actor, tx, req, res) => {
      const vessel = await createVessel(actor, tx, body);
      res.status(201);
      return vessel;
    }),
  );
  // Before /:vesselId, which would otherwise take "rack-target" for an id.
  router.get(
    '/rack-target',
    cellar({ query: rackTargetQuery }, ({ query }, actor, tx) => suggestRackTarget(actor, tx, query)),
  );
  router.get(
    '/:vesselId',
    cellar({ params: vesselParams }, ({ params }, actor, tx) => getVesselDetail(actor, tx, params.vesselId)),
  );
  router.patch(
    '/:vesselId',
    cellar({ params: vesselParams, body: vesselUpdateSchema }, ({ params, body }, actor, tx) => updateVessel(actor, tx, params.vesselId, body)),
  );
  router.post(
    '/:vesselId/cleaning',
    cellar(
      { params: vesselParams, body: vesselCleaningSchema },
      idempotent(({ params, body }, actor, tx) => setCleaning(actor, tx, params.vesselId, body)),
    ),
  );
  router.post(
    '/:vesselId/emptying',
    cellar(
      { params: vesselParams, body: emptyVesselRequestSchema },
      idempotent(async ({ params, body }, actor, tx, _req, res) => {
        const result = await emptyVessel(actor, tx, params.vesselId, body);
        res.status(201);
        return result;
      }),
    ),
  );
  router.post(
    '/:vesselId/retirement',
    cellar({ params: vesselParams, body: vesselRetireSchema }, ({ params, body }, actor, tx) => setRetired(actor, tx, params.vesselId, body)),
  );
  router.put(
    '/:vesselId/place',
    cellar(
      { params: vesselParams, body: moveSchema },
      idempotent(({ params, body }, actor, tx) => moveVessel(actor, tx, params.vesselId, body)),
    ),
  );
  router.delete(
    '/:vesselId',
    cellar({ params: vesselParams, query: deleteQuery }, ({ params, query }, actor, tx) =>
      deleteVessel(actor, tx, params.vesselId, query.expectedVersion),
    ),
  );
  return router;
}
