import type { EntityManager } from 'typeorm';
import { amendedPayloads, readingsView } from '../../shared/domain/journal';
import type { BatchDetail, OperationResult } from '../../shared/schemas/batch-detail';
import type { JournalEntry, JournalPayload } from '../../shared/schemas/journal';
import { loadCellar } from '../cellars/load-cellar';
import type { Actor } from '../core/actor';
import { localDate } from '../core/local-date';
import { Batch } from '../entities/batch.entity';
import { NotFoundError } from '../http/errors';
import { batchJournal, type JournalRow } from '../journal/journal-queries';
import { placesOf } from '../places/placement';
import { vesselsHolding } from './batch-lookup';
import { findSummary } from './batch-summaries';
import { inheritedReadings, ownSince } from './split-lineage';

/** Shown as the author of entries whose account was deleted. */
const FORMER_MEMBER = { id: '00000000-0000-0000-0000-000000000000', name: 'Former member' };

type Payload<K extends JournalPayload['kind']> = Extract<JournalPayload, { kind: K }>;

/** The journal as the Batch page lists it: newest first, each entry knowing who amended it. */
function journalOf(oldestFirst: JournalRow[]): JournalEntry[] {
  const amendedBy = new Map<string, string[]>();
  for (const e of oldestFirst) {
    if (e.amendsEntryId) amendedBy.set(e.amendsEntryId, [...(amendedBy.get(e.amendsEntryId) ?? []), e.id]);
  }
  return [...oldestFirst].reverse().map((e) => ({
    id: e.id,
    batchId: e.batchId,
    occurredAt: e.occurredAt.toISOString(),
    recordedAt: e.recordedAt.toISOString(),
    author: e.authorId ? { id: e.authorId, name: e.authorName ?? '' } : FORMER_MEMBER,
    amendsEntryId: e.amendsEntryId,
    amendedBy: amendedBy.get(e.id) ?? [],
    payload: e.payload,
  }));
}

/** Oak and anything else with a take-out date that is still in, as last corrected. */
function additionsInOf(oldestFirst: JournalRow[], amended: Map<string, JournalPayload>): BatchDetail['additionsIn'] {
  const removed = new Set(oldestFirst.flatMap((e) => (e.payload.kind === 'removed' ? [e.payload.additionEntryId] : [])));
  return oldestFirst.flatMap((e) => {
    if (e.kind !== 'addition' || removed.has(e.id)) return [];
    const p = amended.get(e.id) as Payload<'addition'>;
    if (p.removeOn === null && p.category !== 'oak') return [];
    return [{ entryId: e.id, name: p.name, category: p.category, removeOn: p.removeOn }];
  });
}

async function vesselsOf(tx: EntityManager, batchId: string): Promise<BatchDetail['vessels']> {
  const vessels = await vesselsHolding(tx, batchId);
  const places = await placesOf(
    tx,
    'vessel',
    vessels.map((v) => v.id),
  );
  return vessels.map((v) => ({
    id: v.id,
    code: v.code,
    name: v.name,
    capacityL: v.capacityL,
    volumeL: v.volumeL ?? 0,
    filledAt: (v.filledAt ?? new Date(0)).toISOString(),
    place: places.get(v.id) ?? null,
    version: v.version,
  }));
}

async function familyOf(tx: EntityManager, batchId: string): Promise<Pick<BatchDetail, 'parents' | 'children' | 'lots'>> {
  const parents: { id: string; name: string; volume_l: number }[] = await tx.query(
    `SELECT b.id, b.name, bp.volume_l::float8 AS volume_l FROM batch_parents bp JOIN batches b ON b.id = bp.parent_id
      WHERE bp.child_id = $1 ORDER BY b.name, b.id`,
    [batchId],
  );
  const children: { id: string; name: string }[] = await tx.query(
    `SELECT b.id, b.name FROM batch_parents bp JOIN batches b ON b.id = bp.child_id
      WHERE bp.parent_id = $1 ORDER BY b.created_at, b.id`,
    [batchId],
  );
  const lots: { id: string; code: string; bottled_on: string; bottle_ml: number; bottle_count: number; bottles_left: number }[] = await tx.query(
    `SELECT l.id, l.code, l.bottled_on::text AS bottled_on, l.bottle_ml, l.bottle_count, COALESCE(SUM(c.bottles_left), 0)::int AS bottles_left
       FROM bottle_lots l LEFT JOIN bottle_cases c ON c.lot_id = l.id
      WHERE l.batch_id = $1 GROUP BY l.id ORDER BY l.bottled_on, l.created_at`,
    [batchId],
  );
  return {
    parents: parents.map((p) => ({ id: p.id, name: p.name, volumeL: p.volume_l })),
    children,
    lots: lots.map((l) => ({
      id: l.id,
      code: l.code,
      bottledOn: l.bottled_on,
      bottleMl: l.bottle_ml,
      bottleCount: l.bottle_count,
      bottlesLeft: l.bottles_left,
    })),
  };
}

/**
 * Everything the Batch page shows (`batchDetailSchema`), read with the caller's transaction.
 * @throws NotFoundError when the batch is not in this cellar
 */
export async function batchDetail(tx: EntityManager, cellarId: string, batchId: string, now = new Date()): Promise<BatchDetail> {
  const cellar = await loadCellar(tx, cellarId);
  const summary = await findSummary(tx, cellarId, batchId, localDate(now, cellar.timeZone), now);
  if (!summary) throw new NotFoundError('No such batch in this cellar.');
  const batch = await tx.getRepository(Batch).findOneByOrFail({ id: batchId });
  const oldestFirst = await batchJournal(tx, batchId);
  const amended = amendedPayloads(oldestFirst);
  return {
    ...summary,
    ingredients: batch.ingredients,
    yeastName: batch.yeastName,
    plannedVolumeL: batch.plannedVolumeL,
    targetSweetness: batch.targetSweetness as BatchDetail['targetSweetness'],
    notes: batch.notes,
    vessels: await vesselsOf(tx, batchId),
    // A split's figures follow the must it came from: its parent's readings up to the split first.
    readings: [...(await inheritedReadings(tx, batchId)), ...readingsView(oldestFirst)],
    journal: journalOf(oldestFirst),
    ...(await familyOf(tx, batchId)),
    additionsIn: additionsInOf(oldestFirst, amended),
    ownSince: (await ownSince(tx, batchId))?.toISOString() ?? null,
  };
}

/** What every batch operation answers: the batch as it is now, the new entry and warnings. */
export async function operationResult(
  tx: EntityManager,
  actor: Actor,
  batchId: string,
  entryId: string | null,
  warnings: string[],
): Promise<OperationResult> {
  return { batch: await batchDetail(tx, actor.cellarId, batchId), entryId, warnings: [...new Set(warnings)] };
}
