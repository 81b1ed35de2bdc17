import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BatchDetail } from '../../shared/schemas/batch-detail';
import { SWEETNESS_LEVELS, type batchUpdateSchema } from '../../shared/schemas/batches';
import { requireRole, type Actor } from '../core/actor';
import { Batch } from '../entities/batch.entity';
import { appendEntry } from '../journal/journal';
import { batchDetail } from './batch-detail';
import { findBatch, lockBatch } from './batch-lookup';

type BatchUpdate = z.output<typeof batchUpdateSchema>;

const sweetnessText = (value: string | null) => (value && (SWEETNESS_LEVELS as readonly string[]).includes(value) ? value : 'none');

/**
 * Changes a batch's name, target sweetness or notes. A new name or target is journalled as a
 * note, so the history says who changed what.
 */
export async function updateBatch(actor: Actor, tx: EntityManager, batchId: string, changes: BatchUpdate): Promise<BatchDetail> {
  requireRole(actor, 'hand');
  await findBatch(tx, actor.cellarId, batchId);
  const batch = await lockBatch(tx, actor.cellarId, batchId);
  const said: string[] = [];
  if (changes.name !== undefined && changes.name !== batch.name) said.push(`Renamed from “${batch.name}” to “${changes.name}”.`);
  if (changes.targetSweetness !== undefined && changes.targetSweetness !== batch.targetSweetness) {
    said.push(`Target sweetness changed from ${sweetnessText(batch.targetSweetness)} to ${sweetnessText(changes.targetSweetness)}.`);
  }
  const set = {
    ...(changes.name !== undefined && { name: changes.name }),
    ...(changes.targetSweetness !== undefined && { targetSweetness: changes.targetSweetness }),
    ...(changes.notes !== undefined && { notes: changes.notes }),
  };
  if (Object.keys(set).length > 0) await tx.getRepository(Batch).update({ id: batch.id }, set);
  if (said.length > 0) await appendEntry(tx, actor, batch.id, { kind: 'note', text: said.join(' ') });
  return batchDetail(tx, actor.cellarId, batch.id);
}
