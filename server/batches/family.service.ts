import type { EntityManager } from 'typeorm';
import { FAMILY_MEMBERS_MAX, type BatchFamily } from '../../shared/schemas/family';
import { requireRole, type Actor } from '../core/actor';
import { batchDetail } from './batch-detail';
import { findBatch } from './batch-lookup';
import { familyMemberIds } from './family-queries';

/**
 * A batch's family for the Compare view: the batch, its parents, splits and blends (and theirs),
 * each read as the Batch page reads it — a split's readings include its parent's up to the split
 * (server/batches/split-lineage.ts) — oldest start first.
 * @throws NotFoundError when the batch is not in this cellar
 */
export async function batchFamily(actor: Actor, tx: EntityManager, batchId: string): Promise<BatchFamily> {
  requireRole(actor, 'guest');
  await findBatch(tx, actor.cellarId, batchId);
  const { ids, truncated } = await familyMemberIds(tx, actor.cellarId, batchId, FAMILY_MEMBERS_MAX);
  const now = new Date();
  const members = [];
  for (const id of ids) members.push(await batchDetail(tx, actor.cellarId, id, now));
  members.sort(
    (a, b) => a.startedOn.localeCompare(b.startedOn) || (a.ownSince ?? '').localeCompare(b.ownSince ?? '') || a.name.localeCompare(b.name),
  );
  return { batchId, members, truncated };
}
