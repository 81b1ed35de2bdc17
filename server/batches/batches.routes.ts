import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { batchListQuerySchema, batchStartSchema, batchUpdateSchema } from '../../shared/schemas/batches';
import { uuidSchema } from '../../shared/schemas/common';
import { blendRequestSchema } from '../../shared/schemas/journal';
import { cellarHandler } from '../http/handle';
import { batchOperationRoutes } from './batch-operations.routes';
import { getBatch, listBatches } from './batch-reads.service';
import { blendBatches } from './blend.service';
import { deleteBatch } from './delete.service';
import { batchFamily } from './family.service';
import { startBatch } from './start.service';
import { updateBatch } from './update.service';

const batchParams = z.object({ batchId: uuidSchema });

/**
 * /api/cellars/:cellarId/batches — list, start, blend, read, edit, delete; the journal
 * operations on one batch live in batch-operations.routes.ts.
 */
export function batchRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({ query: batchListQuerySchema }, ({ query }, actor, tx) => listBatches(actor, tx, query)),
  );
  router.post(
    '/',
    cellar({ body: batchStartSchema }, async ({ body }, actor, tx, req, res) => {
      const result = await startBatch(actor, tx, body);
      res.status(201);
      return result;
    }),
  );
  // Before the /:batchId routes, so "blends" is never read as a batch id.
  router.post(
    '/blends',
    cellar({ body: blendRequestSchema }, async ({ body }, actor, tx, req, res) => {
      const result = await blendBatches(actor, tx, body);
      res.status(201);
      return result;
    }),
  );
  router.get(
    '/:batchId',
    cellar({ params: batchParams }, ({ params }, actor, tx) => getBatch(actor, tx, params.batchId)),
  );
  router.get(
    '/:batchId/family',
    cellar({ params: batchParams }, ({ params }, actor, tx) => batchFamily(actor, tx, params.batchId)),
  );
  router.patch(
    '/:batchId',
    cellar({ params: batchParams, body: batchUpdateSchema }, ({ params, body }, actor, tx) => updateBatch(actor, tx, params.batchId, body)),
  );
  router.delete(
    '/:batchId',
    cellar({ params: batchParams }, ({ params }, actor, tx) => deleteBatch(actor, tx, params.batchId)),
  );
  router.use('/:batchId', batchOperationRoutes(ds));
  return router;
}
