import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { ReadingResult, readingRequestSchema } from '../../shared/schemas/journal';
import { recordedGravity } from '../../shared/calc';
import { requireRole, type Actor } from '../core/actor';
import { Vessel } from '../entities/vessel.entity';
import { NotFoundError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { vesselChangedError } from '../vessels/vessel-lock';
import { lockBatchForEntry, notInVesselsError, occurredAt } from './batch-lookup';

type ReadingRequest = z.output<typeof readingRequestSchema>;

/**
 * Logs a gravity reading (with pH and temperature if taken) for a batch still in vessels,
 * optionally naming the vessel it was drawn from. The most frequent write of all, so it takes
 * its own short path — the batch locked, one statement of checks, the entry — and answers
 * the reading and the stage, not the whole batch (shared/schemas/journal.ts).
 */
export async function addReading(actor: Actor, tx: EntityManager, batchId: string, request: ReadingRequest): Promise<ReadingResult> {
  requireRole(actor, 'hand');
  const now = new Date();
  const { batch, timeZone, inVessels, namedVessel } = await lockBatchForEntry(tx, actor.cellarId, batchId, request.vesselId);
  if (request.vesselId && !namedVessel) throw new NotFoundError('No such vessel in this cellar.');
  if (!inVessels) throw notInVesselsError(batch);
  if (namedVessel && namedVessel.batchId !== batch.id) {
    throw await vesselChangedError(tx, await tx.getRepository(Vessel).findOneByOrFail({ id: namedVessel.id }), actor.units);
  }
  const at = occurredAt(request.at, now, batch, timeZone);
  const correctedSg = recordedGravity(request.sg, request.temperatureC, request.calibrationC);
  const entry = await appendEntry(
    tx,
    actor,
    batch.id,
    {
      kind: 'reading',
      sg: request.sg,
      temperatureC: request.temperatureC,
      calibrationC: request.calibrationC,
      correctedSg,
      ph: request.ph,
      vesselId: request.vesselId,
    },
    { occurredAt: at },
  );
  return {
    entryId: entry.id,
    reading: {
      entryId: entry.id,
      at: entry.occurredAt.toISOString(),
      sg: request.sg,
      correctedSg,
      temperatureC: request.temperatureC,
      ph: request.ph,
    },
    stage: entry.stage,
    warnings: [],
  };
}
