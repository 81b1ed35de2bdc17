import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { readingRequestSchema } from '../../shared/schemas/journal';
import { requireRole, type Actor } from '../core/actor';
import { appendEntry } from '../journal/journal';
import { correctedGravity } from './corrected-gravity';
import { onBatch } from './on-batch';

type ReadingRequest = z.output<typeof readingRequestSchema>;

/** Logs a gravity reading (with pH and temperature if taken) for a batch still in vessels. */
export function addReading(actor: Actor, tx: EntityManager, batchId: string, request: ReadingRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(actor, tx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(
      tx,
      actor,
      batch.id,
      {
        kind: 'reading',
        sg: request.sg,
        temperatureC: request.temperatureC,
        calibrationC: request.calibrationC,
        correctedSg: correctedGravity(request.sg, request.temperatureC, request.calibrationC),
        ph: request.ph,
        vesselId: request.vesselId,
      },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id };
  });
}
