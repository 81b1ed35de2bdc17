import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { drawDownRequestSchema } from '../../shared/schemas/bottles';
import { uuidSchema } from '../../shared/schemas/common';
import { moveSchema } from '../../shared/schemas/places';
import { cellarHandler } from '../http/handle';
import { idempotent } from '../http/idempotency';
import { drawDown, getCase, moveCase } from './case.service';

const caseParams = z.object({ caseId: uuidSchema });

/** /api/cellars/:cellarId/cases — a case, bottles leaving it, and where it sits. */
export function caseRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/:caseId',
    cellar({ params: caseParams }, ({ params }, actor, tx) => getCase(actor, tx, params.caseId)),
  );
  router.post(
    '/:caseId/departures',
    cellar(
      { params: caseParams, body: drawDownRequestSchema },
      idempotent(async ({ params, body }, actor, tx, req, res) => {
        const updated = await drawDown(actor, tx, params.caseId, body);
        res.status(201);
        return updated;
      }),
    ),
  );
  router.put(
    '/:caseId/place',
    cellar(
      { params: caseParams, body: moveSchema },
      idempotent(({ params, body }, actor, tx) => moveCase(actor, tx, params.caseId, body)),
    ),
  );
  return router;
}
