import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import { SWEETNESS_LEVELS, type batchUpdateSchema } from '../../shared/schemas/batches';
import type { BatchDetail } from '../../shared/schemas/batch-detail';
import { Batch } from '../entities/batch.entity';
import { findBatch, lockBatch } from './batch-context';
import { batchDetail } from './batch-detail';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';

type BatchUpdate = z.output<typeof batchUpdateSchema>;

const sweetnessText = (value: string | null) => (value && (SWEETNESS_LEVELS as readonly string[]).includes(value) ? value : 'none');

/**
 * Changes a batch's name, target sweetness or notes. A new name or target is journalled as a
 * note, so the history says who changed what.
 */
export async function updateBatch(ds: DataSource, ctx: CellarContext, batchId: string, changes: BatchUpdate): Promise<BatchDetail> {
  return ds.transaction(async (tx) => {
    await findBatch(tx, ctx.cellarId, batchId);
    const batch = await lockBatch(tx, ctx.cellarId, batchId);
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
    if (said.length > 0) await appendEntry(tx, ctx, batch.id, { kind: 'note', text: said.join(' ') });
    return batchDetail(tx, ctx.cellarId, batch.id);
  });
}
