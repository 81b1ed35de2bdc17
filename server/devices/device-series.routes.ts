import { Router } from 'express';
import { z } from 'zod';
import type { DataSource } from 'typeorm';
import { cellarHandler } from '../http/handle';
import { getDeviceSeries } from './device-series.service';

const paramsSchema = z.object({ batchId: z.uuid({ message: 'must be an id (UUID)' }) });

/** GET /api/cellars/:cellarId/batches/:batchId/device-readings — the chart's device series and the journal's day lines. */
export function deviceSeriesRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({ params: paramsSchema }, ({ params }, actor, tx) => getDeviceSeries(actor, tx, params.batchId)),
  );
  return router;
}
