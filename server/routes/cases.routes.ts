import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { drawDownRequestSchema } from '../../shared/schemas/bottles';
import { uuidSchema } from '../../shared/schemas/common';
import { moveSchema } from '../../shared/schemas/places';
import { handle } from '../middleware/handle';
import { drawDown, getCase, moveCase } from '../services/case.service';
import { cellarContext } from './cellar-context';

const caseParams = z.object({ caseId: uuidSchema });

/** /api/cellars/:cellarId/cases — a case, bottles leaving it, and where it sits. */
export function caseRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/:caseId', handle({ params: caseParams }, ({ params }, req) => getCase(ds, cellarContext(req), params.caseId)));
  router.post(
    '/:caseId/departures',
    handle({ params: caseParams, body: drawDownRequestSchema }, async ({ params, body }, req, res) => {
      const updated = await drawDown(ds, cellarContext(req), params.caseId, body);
      res.status(201);
      return updated;
    }),
  );
  router.put(
    '/:caseId/place',
    handle({ params: caseParams, body: moveSchema }, ({ params, body }, req) => moveCase(ds, cellarContext(req), params.caseId, body)),
  );
  return router;
}
