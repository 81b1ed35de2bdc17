import type { EntityManager } from 'typeorm';
import { requireRole, type Actor } from '../core/actor';
import { volumeText } from '../core/litres';
import { Batch } from '../entities/batch.entity';
import { ConflictError } from '../http/errors';
import { findBatch, lockBatch, vesselsHolding } from './batch-lookup';

/**
 * Deletes a batch and its journal (a mistake, a test entry). Refused while a vessel holds it,
 * while it has bottle lots, or while a split or blend descends from it: its history is part
 * of theirs.
 */
export async function deleteBatch(actor: Actor, tx: EntityManager, batchId: string): Promise<void> {
  requireRole(actor, 'keeper');
  await findBatch(tx, actor.cellarId, batchId);
  const batch = await lockBatch(tx, actor.cellarId, batchId);
  const vessels = await vesselsHolding(tx, batch.id);
  if (vessels.length > 0) {
    const list = vessels.map((v) => `${v.name} (${volumeText(v.volumeL ?? 0, actor.units)})`).join(', ');
    throw new ConflictError(`${batch.name} is still in ${list}. Rack, bottle or empty it before deleting the batch.`);
  }
  const [{ lots }]: { lots: number }[] = await tx.query(`SELECT COUNT(*)::int AS lots FROM bottle_lots WHERE batch_id = $1`, [batch.id]);
  if (lots > 0) throw new ConflictError(`${batch.name} has ${lots} bottle lot${lots === 1 ? '' : 's'}; a batch with bottles cannot be deleted.`);
  const children: { name: string }[] = await tx.query(
    `SELECT b.name FROM batch_parents bp JOIN batches b ON b.id = bp.child_id WHERE bp.parent_id = $1 ORDER BY b.name`,
    [batch.id],
  );
  if (children.length > 0) {
    throw new ConflictError(
      `${children.map((c) => c.name).join(', ')} came from ${batch.name}; its history is part of theirs, so it cannot be deleted.`,
    );
  }
  await tx.getRepository(Batch).delete({ id: batch.id });
}
