import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { bottleRequestSchema } from '../../shared/schemas/journal';
import { cellarHandler } from '../http/handle';
import { bottleBatch } from './bottling.service';

const batchParams = z.object({ batchId: uuidSchema });

/** /api/cellars/:cellarId/batches/:batchId/bottlings — bottle a batch into a lot of cases. */
export function bottlingRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.post(
    '/',
    cellar({ params: batchParams, body: bottleRequestSchema }, async ({ params, body }, actor, tx, req, res) => {
      const result = await bottleBatch(actor, tx, params.batchId, body);
      res.status(201);
      return result;
    }),
  );
  return router;
}
