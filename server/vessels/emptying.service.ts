import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { emptyVesselRequestSchema } from '../../shared/schemas/vessel-emptying';
import { operationResult } from '../batches/batch-detail';
import { lockBatch } from '../batches/batch-lookup';
import { markEmptied, vesselVolume } from '../batches/fill-rules';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { emptiedAt } from './emptying-rules';
import { lockVessels } from './vessel-lock';

type EmptyVesselRequest = z.output<typeof emptyVesselRequestSchema>;

/**
 * Pours a vessel out: everything in it leaves its batch (spoiled, spilled, drunk), with the
 * reason journalled on the batch as an 'emptied' entry. The vessel is left empty and dirty,
 * as a racking leaves its source; the batch's volume and stage follow (a batch left in no
 * vessel reads as finished, or bottled while it has bottles left).
 */
export async function emptyVessel(actor: Actor, tx: EntityManager, vesselId: string, request: EmptyVesselRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const now = new Date();
  // The vessel first, then its batch: the order every writer locks in.
  const vessel = (await lockVessels(tx, actor, [{ vesselId, expectedVersion: request.expectedVersion }])).get(vesselId)!;
  if (!vessel.batchId) {
    throw new ConflictError(`${vessel.name} is already empty; there is nothing to pour out.`, { vesselId, currentVersion: vessel.version });
  }
  const batch = await lockBatch(tx, actor.cellarId, vessel.batchId);
  const cellar = await loadCellar(tx, actor.cellarId);
  const at = emptiedAt(request.at, now, batch, vessel, cellar.timeZone);

  const poured = vesselVolume(vessel, vessel.volumeL ?? 0);
  markEmptied(vessel);
  await tx.getRepository(Vessel).save(vessel);
  const entry = await appendEntry(
    tx,
    actor,
    batch.id,
    { kind: 'emptied', ...poured, reason: request.reason, note: request.note },
    { occurredAt: at },
  );
  return operationResult(tx, actor, batch.id, entry.id, []);
}
