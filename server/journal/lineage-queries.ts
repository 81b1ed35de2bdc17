import type { EntityManager } from 'typeorm';

/** When a batch's 'started' entry says it began (for a split or blend: when it became its own batch). */
export async function startedAt(tx: EntityManager, batchId: string): Promise<Date | null> {
  const [row]: { at: Date | null }[] = await tx.query(`SELECT MIN(occurred_at) AS at FROM journal_entries WHERE batch_id = $1 AND kind = 'started'`, [
    batchId,
  ]);
  return row?.at ?? null;
}
