import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { lotListQuerySchema } from '../../shared/schemas/bottles';
import { uuidSchema } from '../../shared/schemas/common';
import { cellarHandler } from '../http/handle';
import { getLot, listLots } from './lot.service';

const lotParams = z.object({ lotId: uuidSchema });

/** /api/cellars/:cellarId/lots — bottle lots with their cases; one lot with its departures. */
export function lotRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({ query: lotListQuerySchema }, ({ query }, actor, tx) => listLots(actor, tx, query)),
  );
  router.get(
    '/:lotId',
    cellar({ params: lotParams }, ({ params }, actor, tx) => getLot(actor, tx, params.lotId)),
  );
  return router;
}
