import type { EntityManager } from 'typeorm';
import type { BatchReading } from '../../shared/schemas/batches';
import type { BatchDetail, OperationResult } from '../../shared/schemas/batch-detail';
import type { JournalEntry, JournalPayload } from '../../shared/schemas/journal';
import { Batch } from '../entities/batch.entity';
import { NotFoundError } from '../errors';
import { localDate, loadCellar, vesselsHolding } from './batch-context';
import { findSummary } from './batch-summaries';
import type { CellarContext } from './cellar.service';
import { placesOf } from './placement.service';

/** Shown as the author of entries whose account was deleted. */
const FORMER_MEMBER = { id: '00000000-0000-0000-0000-000000000000', name: 'Former member' };

interface EntryRow {
  id: string;
  batch_id: string;
  kind: JournalPayload['kind'];
  payload: JournalPayload;
  occurred_at: Date;
  recorded_at: Date;
  author_id: string | null;
  author_name: string | null;
  amends_entry_id: string | null;
}

type Payload<K extends JournalPayload['kind']> = Extract<JournalPayload, { kind: K }>;

/** Each entry's payload with its amendments' changes applied, oldest amendment first. */
function amendedPayloads(entries: EntryRow[]): Map<string, JournalPayload> {
  const changes = new Map<string, Record<string, unknown>>();
  const oldestFirst = [...entries].sort((a, b) => a.recorded_at.getTime() - b.recorded_at.getTime());
  for (const e of oldestFirst) {
    if (e.payload.kind === 'amendment' && e.amends_entry_id) {
      changes.set(e.amends_entry_id, { ...(changes.get(e.amends_entry_id) ?? {}), ...e.payload.changes });
    }
  }
  return new Map(entries.map((e) => [e.id, { ...e.payload, ...(changes.get(e.id) ?? {}) } as JournalPayload]));
}

function journalOf(entries: EntryRow[]): JournalEntry[] {
  const amendedBy = new Map<string, string[]>();
  for (const e of [...entries].reverse()) {
    if (e.amends_entry_id) amendedBy.set(e.amends_entry_id, [...(amendedBy.get(e.amends_entry_id) ?? []), e.id]);
  }
  return entries.map((e) => ({
    id: e.id,
    batchId: e.batch_id,
    occurredAt: e.occurred_at.toISOString(),
    recordedAt: e.recorded_at.toISOString(),
    author: e.author_id ? { id: e.author_id, name: e.author_name ?? '' } : FORMER_MEMBER,
    amendsEntryId: e.amends_entry_id,
    amendedBy: amendedBy.get(e.id) ?? [],
    payload: e.payload,
  }));
}

function readingsOf(oldestFirst: EntryRow[], amended: Map<string, JournalPayload>): BatchReading[] {
  return oldestFirst
    .filter((e) => e.kind === 'reading')
    .map((e) => {
      const p = amended.get(e.id) as Payload<'reading'>;
      return { entryId: e.id, at: e.occurred_at.toISOString(), sg: p.sg, correctedSg: p.correctedSg, temperatureC: p.temperatureC, ph: p.ph };
    });
}

function additionsInOf(oldestFirst: EntryRow[], amended: Map<string, JournalPayload>): BatchDetail['additionsIn'] {
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
  const places = await placesOf(tx, 'vessel', vessels.map((v) => v.id));
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
    lots: lots.map((l) => ({ id: l.id, code: l.code, bottledOn: l.bottled_on, bottleMl: l.bottle_ml, bottleCount: l.bottle_count, bottlesLeft: l.bottles_left })),
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
  const newestFirst: EntryRow[] = await tx.query(
    `SELECT j.id, j.batch_id, j.kind, j.payload, j.occurred_at, j.recorded_at, j.author_id, u.display_name AS author_name, j.amends_entry_id
       FROM journal_entries j LEFT JOIN users u ON u.id = j.author_id
      WHERE j.batch_id = $1 ORDER BY j.occurred_at DESC, j.recorded_at DESC, j.id DESC`,
    [batchId],
  );
  const oldestFirst = [...newestFirst].reverse();
  const amended = amendedPayloads(newestFirst);
  return {
    ...summary,
    ingredients: batch.ingredients,
    yeastName: batch.yeastName,
    plannedVolumeL: batch.plannedVolumeL,
    targetSweetness: batch.targetSweetness as BatchDetail['targetSweetness'],
    notes: batch.notes,
    vessels: await vesselsOf(tx, batchId),
    readings: readingsOf(oldestFirst, amended),
    journal: journalOf(newestFirst),
    ...(await familyOf(tx, batchId)),
    additionsIn: additionsInOf(oldestFirst, amended),
  };
}

/** What every batch operation answers: the batch as it is now, the new entry and warnings. */
export async function operationResult(
  tx: EntityManager,
  ctx: CellarContext,
  batchId: string,
  entryId: string | null,
  warnings: string[],
): Promise<OperationResult> {
  return { batch: await batchDetail(tx, ctx.cellarId, batchId), entryId, warnings: [...new Set(warnings)] };
}
