import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { lotListQuerySchema } from '../../shared/schemas/bottles';
import { uuidSchema } from '../../shared/schemas/common';
import { handle } from '../middleware/handle';
import { getLot, listLots } from '../services/lot.service';
import { cellarContext } from './cellar-context';

const lotParams = z.object({ lotId: uuidSchema });

/** /api/cellars/:cellarId/lots — bottle lots with their cases; one lot with its departures. */
export function lotRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  router.get('/', handle({ query: lotListQuerySchema }, ({ query }, req) => listLots(ds, cellarContext(req), query)));
  router.get('/:lotId', handle({ params: lotParams }, ({ params }, req) => getLot(ds, cellarContext(req), params.lotId)));
  return router;
}
