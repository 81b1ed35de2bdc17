import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { bottleRequestSchema } from '../../shared/schemas/journal';
import { handle } from '../middleware/handle';
import { bottleBatch } from '../services/bottling.service';
import { cellarContext } from './cellar-context';

const batchParams = z.object({ batchId: uuidSchema });

/** /api/cellars/:cellarId/batches/:batchId/bottlings — bottle a batch into a lot of cases. */
export function bottlingRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.post(
    '/',
    handle({ params: batchParams, body: bottleRequestSchema }, async ({ params, body }, req, res) => {
      const result = await bottleBatch(ds, cellarContext(req), params.batchId, body);
      res.status(201);
      return result;
    }),
  );
  return router;
}
