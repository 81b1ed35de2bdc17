import type { EntityManager } from 'typeorm';
import { deriveStage } from '../../shared/domain/stage';
import type { JournalPayload } from '../../shared/schemas/journal';
import { Batch } from '../entities/batch.entity';
import { JournalEntryRow } from '../entities/journal-entry.entity';
import { inheritedHistory } from './batch-lineage';
import type { CellarContext } from './cellar.service';

/**
 * Appends one entry to a batch's journal and refreshes the batch's cached stage and
 * latest figures. Call inside the operation's transaction, after changing vessels/bottles.
 * @param occurredAt - when it happened in the cellar (defaults to now); recordedAt is always now
 */
export async function appendEntry(
  tx: EntityManager,
  ctx: CellarContext,
  batchId: string,
  payload: JournalPayload,
  options: { occurredAt?: Date; amendsEntryId?: string } = {},
): Promise<JournalEntryRow> {
  const repo = tx.getRepository(JournalEntryRow);
  const row = await repo.save(
    repo.create({
      cellarId: ctx.cellarId,
      batchId,
      kind: payload.kind,
      payload,
      occurredAt: options.occurredAt ?? new Date(),
      authorId: ctx.userId,
      amendsEntryId: options.amendsEntryId ?? null,
    }),
  );
  await refreshBatchCaches(tx, batchId);
  return row;
}

/**
 * Recomputes stage, last racking and last reading (amendments applied) from the journal,
 * counting what a split or blended batch inherited from its parents.
 */
export async function refreshBatchCaches(tx: EntityManager, batchId: string): Promise<void> {
  // Lock first: a second writer then waits here and reads the first one's entries once it commits.
  await tx.query(`SELECT id FROM batches WHERE id = $1 FOR UPDATE`, [batchId]);
  const entries: { id: string; kind: JournalPayload['kind']; payload: JournalPayload; occurred_at: Date; amends_entry_id: string | null }[] =
    await tx.query(
      `SELECT id, kind, payload, occurred_at, amends_entry_id FROM journal_entries
        WHERE batch_id = $1 ORDER BY occurred_at, recorded_at`,
      [batchId],
    );
  const [{ volume }] = await tx.query(`SELECT COALESCE(SUM(volume_l), 0)::float AS volume FROM vessels WHERE batch_id = $1`, [batchId]);
  const [{ bottles }] = await tx.query(
    `SELECT COALESCE(SUM(c.bottles_left), 0)::int AS bottles
       FROM bottle_cases c JOIN bottle_lots l ON l.id = c.lot_id WHERE l.batch_id = $1`,
    [batchId],
  );

  const amendments = new Map<string, Record<string, unknown>>();
  for (const e of entries) {
    if (e.payload.kind === 'amendment' && e.amends_entry_id) {
      amendments.set(e.amends_entry_id, { ...(amendments.get(e.amends_entry_id) ?? {}), ...e.payload.changes });
    }
  }
  const readings = entries
    .filter((e) => e.kind === 'reading')
    .map((e) => {
      const p = { ...e.payload, ...(amendments.get(e.id) ?? {}) } as Extract<JournalPayload, { kind: 'reading' }> & { at?: string };
      return { sg: p.correctedSg, at: p.at ? new Date(p.at) : e.occurred_at };
    })
    .sort((a, b) => a.at.getTime() - b.at.getTime());
  const lastReading = readings.at(-1);
  const rackings = entries.filter((e) => e.kind === 'racked');
  const inherited = await inheritedHistory(tx, batchId);
  const ownLastRacking = rackings.at(-1)?.occurred_at ?? null;

  const stage = deriveStage({
    kinds: entries.map((e) => e.kind),
    hasStabiliser: inherited.stabilised || entries.some((e) => e.payload.kind === 'addition' && e.payload.category === 'stabiliser'),
    volumeInVesselsL: Number(volume),
    bottlesLeft: Number(bottles),
    inheritedRackings: inherited.rackings,
  });
  await tx.getRepository(Batch).update(
    { id: batchId },
    {
      stage,
      lastRackedAt: ownLastRacking ?? inherited.lastRackedAt,
      lastReadingSg: lastReading?.sg ?? null,
      lastReadingAt: lastReading?.at ?? null,
    },
  );
}
