import { Router, type Response } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
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
  type ReadingResult,
} from '../../shared/schemas/journal';
import type { Actor } from '../core/actor';
import { cellarHandler } from '../http/handle';
import { idempotent } from '../http/idempotency';
import { addAddition, removeAddition } from './additions.service';
import { amendEntry } from './amendment.service';
import { addNote, degas, taste } from './notes.service';
import { rackBatch } from './racking.service';
import { addReading } from './readings.service';
import { splitBatch } from './split.service';
import { topUp } from './top-up.service';

const batchParams = z.object({ batchId: uuidSchema });
const entryParams = batchParams.extend({ entryId: uuidSchema });

type Operation<B extends ZodType> = (actor: Actor, tx: EntityManager, batchId: string, body: z.output<B>) => Promise<OperationResult | ReadingResult>;

/**
 * /api/cellars/:cellarId/batches/:batchId/… — each POST validates its body, runs one service
 * call and answers 201 with the batch as it is now (`operationResultSchema`); a reading, the
 * most frequent, answers only the reading and the stage (`readingResultSchema`).
 */
export function batchOperationRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  const created = async <T>(res: Response, result: Promise<T>) => {
    const value = await result;
    res.status(201);
    return value;
  };
  const post = <B extends ZodType>(path: string, body: B, operation: Operation<B>) =>
    router.post(
      path,
      cellar(
        { params: batchParams, body },
        // A phone may resend an operation it queued offline: the same key records it once.
        idempotent(({ params, body: input }, actor, tx, _req, res) => created(res, operation(actor, tx, params.batchId, input as z.output<B>))),
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
    cellar({ params: entryParams, body: amendRequestSchema }, ({ params, body }, actor, tx, _req, res) =>
      created(res, amendEntry(actor, tx, params.batchId, params.entryId, body)),
    ),
  );
  return router;
}
