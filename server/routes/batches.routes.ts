import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { batchListQuerySchema, batchStartSchema, batchUpdateSchema } from '../../shared/schemas/batches';
import { blendRequestSchema } from '../../shared/schemas/journal';
import { uuidSchema } from '../../shared/schemas/common';
import { handle } from '../middleware/handle';
import { blendBatches } from '../services/batch-blend.service';
import { deleteBatch } from '../services/batch-delete.service';
import { getBatch, listBatches } from '../services/batch-queries';
import { startBatch } from '../services/batch-start.service';
import { updateBatch } from '../services/batch-update.service';
import { batchOperationRoutes } from './batch-operations.routes';
import { cellarContext } from './cellar-context';

const batchParams = z.object({ batchId: uuidSchema });

/**
 * /api/cellars/:cellarId/batches — list, start, blend, read, edit, delete; the journal
 * operations on one batch live in batch-operations.routes.ts.
 */
export function batchRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/', handle({ query: batchListQuerySchema }, ({ query }, req) => listBatches(ds, cellarContext(req), query)));
  router.post(
    '/',
    handle({ body: batchStartSchema }, async ({ body }, req, res) => {
      const result = await startBatch(ds, cellarContext(req), body);
      res.status(201);
      return result;
    }),
  );
  // Before the /:batchId routes, so "blends" is never read as a batch id.
  router.post(
    '/blends',
    handle({ body: blendRequestSchema }, async ({ body }, req, res) => {
      const result = await blendBatches(ds, cellarContext(req), body);
      res.status(201);
      return result;
    }),
  );
  router.get('/:batchId', handle({ params: batchParams }, ({ params }, req) => getBatch(ds, cellarContext(req), params.batchId)));
  router.patch(
    '/:batchId',
    handle({ params: batchParams, body: batchUpdateSchema }, ({ params, body }, req) => updateBatch(ds, cellarContext(req), params.batchId, body)),
  );
  router.delete(
    '/:batchId',
    handle({ params: batchParams }, async ({ params }, req, res) => {
      await deleteBatch(ds, cellarContext(req), params.batchId);
      res.status(204).end();
    }),
  );
  router.use('/:batchId', batchOperationRoutes(ds));
  return router;
}
