import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { BatchKind } from '../../shared/schemas/batches';
import type { splitRequestSchema } from '../../shared/schemas/journal';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { roundLitres } from '../core/litres';
import { BatchParent } from '../entities/batch-parent.entity';
import { Batch } from '../entities/batch.entity';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { lockVessels } from '../vessels/vessel-lock';
import { operationResult } from './batch-detail';
import { findBatch, lockBatch, occurredAt, requireInVessels } from './batch-lookup';
import { readingCachesForSplit } from './split-lineage';
import { requireHolds, vesselVolume } from './fill-rules';

export type SplitRequest = Omit<z.output<typeof splitRequestSchema>, 'kind'> & { kind: BatchKind };

/**
 * Splits some of a batch's vessels off into a new batch (say, half a melomel gets oak): the
 * vessels keep their contents but now hold the child, which copies the recipe, OG, start
 * date and latest reading (a split's age and figures follow the must it came from) and records
 * its parent. A 'split' entry goes on the parent, 'started' on the child.
 * @returns the child batch
 */
export async function splitBatch(actor: Actor, tx: EntityManager, batchId: string, request: SplitRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  await findBatch(tx, actor.cellarId, batchId);
  const locked = await lockVessels(tx, actor, request.vessels);
  const parent = await lockBatch(tx, actor.cellarId, batchId);
  const holding = await requireInVessels(tx, parent);
  const cellar = await loadCellar(tx, actor.cellarId);
  const at = occurredAt(request.at, new Date(), parent, cellar.timeZone);
  const moving = request.vessels.map((ref) => locked.get(ref.vesselId)!);
  for (const vessel of moving) await requireHolds(tx, vessel, parent, actor.units);
  if (moving.length >= holding.length) {
    throw new ConflictError(`A split must leave at least one vessel with ${parent.name}. To rename the whole batch, edit it instead.`);
  }

  const volumeL = roundLitres(moving.reduce((sum, v) => sum + (v.volumeL ?? 0), 0));
  const batches = tx.getRepository(Batch);
  const child = await batches.save(
    batches.create({
      cellarId: actor.cellarId,
      name: request.name,
      kind: request.kind,
      ingredients: parent.ingredients,
      yeastName: parent.yeastName,
      yeastToleranceAbv: parent.yeastToleranceAbv,
      plannedVolumeL: volumeL,
      startedOn: parent.startedOn,
      og: parent.og,
      targetSweetness: parent.targetSweetness,
      notes: '',
      createdBy: actor.userId,
      // The same must: its age and figures follow the parent's (server/batches/split-lineage.ts).
      ...(await readingCachesForSplit(tx, parent.id, at)),
    }),
  );
  await tx.getRepository(BatchParent).insert({ childId: child.id, parentId: parent.id, volumeL });
  for (const vessel of moving) {
    vessel.batchId = child.id;
    await tx.getRepository(Vessel).save(vessel);
  }
  const vessels = moving.map((v) => vesselVolume(v, v.volumeL ?? 0));
  await appendEntry(tx, actor, parent.id, { kind: 'split', childBatchId: child.id, childName: child.name, vessels }, { occurredAt: at });
  const entry = await appendEntry(
    tx,
    actor,
    child.id,
    { kind: 'started', volumeL, og: child.og, vessels, parents: [{ batchId: parent.id, name: parent.name, volumeL }], override: null },
    { occurredAt: at },
  );
  return operationResult(tx, actor, child.id, entry.id, []);
}
