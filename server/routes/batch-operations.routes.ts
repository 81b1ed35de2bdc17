import { Router, type Request, type Response } from 'express';
import type { DataSource } from 'typeorm';
import { z, type ZodType } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import { uuidSchema } from '../../shared/schemas/common';
import {
  additionRequestSchema,
  amendRequestSchema,
  degasRequestSchema,
  noteRequestSchema,
  rackRequestSchema,
  readingRequestSchema,
  removalRequestSchema,
  splitRequestSchema,
  tasteRequestSchema,
  topUpRequestSchema,
} from '../../shared/schemas/journal';
import { handle } from '../middleware/handle';
import { addAddition, removeAddition } from '../services/batch-additions.service';
import { addNote, degas, taste, topUp } from '../services/batch-notes.service';
import { addReading } from '../services/batch-readings.service';
import { splitBatch } from '../services/batch-split.service';
import { amendEntry } from '../services/amendment.service';
import { rackBatch } from '../services/racking.service';
import type { CellarContext } from '../services/cellar.service';
import { cellarContext } from './cellar-context';

const batchParams = z.object({ batchId: uuidSchema });
const entryParams = batchParams.extend({ entryId: uuidSchema });

type Operation<B extends ZodType> = (ds: DataSource, ctx: CellarContext, batchId: string, body: z.output<B>) => Promise<OperationResult>;

/**
 * /api/cellars/:cellarId/batches/:batchId/… — each POST validates its body, runs one service
 * call and answers 201 with the batch as it is now (`operationResultSchema`).
 */
export function batchOperationRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const created = async (res: Response, result: Promise<OperationResult>) => {
    const value = await result;
    res.status(201);
    return value;
  };
  const post = <B extends ZodType>(path: string, body: B, operation: Operation<B>) =>
    router.post(
      path,
      handle({ params: batchParams, body }, ({ params, body: input }, req: Request, res) =>
        created(res, operation(ds, cellarContext(req), params.batchId, input as z.output<B>)),
      ),
    );

  post('/readings', readingRequestSchema, addReading);
  post('/rackings', rackRequestSchema, rackBatch);
  post('/splits', splitRequestSchema, splitBatch);
  post('/additions', additionRequestSchema, addAddition);
  post('/removals', removalRequestSchema, removeAddition);
  post('/top-ups', topUpRequestSchema, topUp);
  post('/degassings', degasRequestSchema, degas);
  post('/tastings', tasteRequestSchema, taste);
  post('/notes', noteRequestSchema, addNote);
  router.post(
    '/journal/:entryId/amendments',
    handle({ params: entryParams, body: amendRequestSchema }, ({ params, body }, req, res) =>
      created(res, amendEntry(ds, cellarContext(req), params.batchId, params.entryId, body)),
    ),
  );
  return router;
}
