import type { EntityManager } from 'typeorm';
import { amendedPayloads, compareEntries, readingsView, type JournalRecord, type ReadingView } from '../../shared/domain/journal';
import type { JournalKind, JournalPayload } from '../../shared/schemas/journal';

/**
 * Every read of `journal_entries` outside the writer. Rows come back in the shape of
 * shared/domain/journal's `JournalRecord`, so the merge of amendments and the order of
 * entries are the shared ones, never re-implemented in SQL or in a service.
 */

/** A journal row with its author's name, as the Batch page shows it. */
export interface JournalRow extends JournalRecord {
  batchId: string;
  kind: JournalKind;
  occurredAt: Date;
  recordedAt: Date;
  authorId: string | null;
  authorName: string | null;
}

const ROW_COLUMNS = `j.id, j.batch_id AS "batchId", j.kind, j.payload, j.occurred_at AS "occurredAt", j.recorded_at AS "recordedAt",
  j.amends_entry_id AS "amendsEntryId", j.author_id AS "authorId"`;

/** A batch's whole journal with authors, in the journal's order (oldest first). */
export async function batchJournal(tx: EntityManager, batchId: string): Promise<JournalRow[]> {
  const rows: JournalRow[] = await tx.query(
    `SELECT ${ROW_COLUMNS}, u.display_name AS "authorName"
       FROM journal_entries j LEFT JOIN users u ON u.id = j.author_id
      WHERE j.batch_id = $1`,
    [batchId],
  );
  return rows.sort(compareEntries);
}

/** Readings of the batch and the amendments of those readings, nothing else. */
async function readingRecords(tx: EntityManager, batchId: string, onlyLatest: boolean): Promise<JournalRecord[]> {
  return tx.query(
    `WITH readings AS (
       SELECT ${ROW_COLUMNS} FROM journal_entries j WHERE j.batch_id = $1 AND j.kind = 'reading'
        ORDER BY j.occurred_at DESC, j.recorded_at DESC, j.id DESC ${onlyLatest ? 'LIMIT 1' : ''})
     SELECT * FROM readings
     UNION ALL
     SELECT ${ROW_COLUMNS} FROM journal_entries j JOIN readings r ON r.id = j.amends_entry_id WHERE j.kind = 'amendment'`,
    [batchId],
  );
}

/** The batch's readings with corrections applied, oldest first. */
export async function batchReadings(tx: EntityManager, batchId: string): Promise<ReadingView[]> {
  return readingsView(await readingRecords(tx, batchId, false));
}

/** The batch's latest reading with its corrections (an index look-up, whatever the journal's length). */
export async function latestReading(tx: EntityManager, batchId: string): Promise<ReadingView | null> {
  return readingsView(await readingRecords(tx, batchId, true)).at(-1) ?? null;
}

/**
 * The latest reading taken in one vessel (or for the whole batch) while the batch is in it,
 * corrections applied.
 */
export async function lastVesselReading(tx: EntityManager, batchId: string, vesselId: string): Promise<ReadingView | null> {
  const records: JournalRecord[] = await tx.query(
    `WITH readings AS (
       SELECT ${ROW_COLUMNS} FROM journal_entries j
        WHERE j.batch_id = $1 AND j.kind = 'reading' AND (j.payload->>'vesselId' IS NULL OR j.payload->>'vesselId' = $2))
     SELECT * FROM readings
     UNION ALL
     SELECT ${ROW_COLUMNS} FROM journal_entries j JOIN readings r ON r.id = j.amends_entry_id WHERE j.kind = 'amendment'`,
    [batchId, vesselId],
  );
  return readingsView(records).at(-1) ?? null;
}

/**
 * The newest `perBatch` readings of each batch, corrections applied, oldest first: the
 * fermentation state is judged on recent readings, so older ones need not be read.
 */
export async function recentReadings(tx: EntityManager, batchIds: string[], perBatch: number): Promise<Map<string, ReadingView[]>> {
  const records: (JournalRecord & { batchId: string })[] = await tx.query(
    `WITH recent AS (
       SELECT ${ROW_COLUMNS}, row_number() OVER (PARTITION BY j.batch_id ORDER BY j.occurred_at DESC, j.recorded_at DESC, j.id DESC) AS n
         FROM journal_entries j WHERE j.batch_id = ANY($1) AND j.kind = 'reading')
     SELECT id, "batchId", kind, payload, "occurredAt", "recordedAt", "amendsEntryId", "authorId" FROM recent WHERE n <= $2
     UNION ALL
     SELECT ${ROW_COLUMNS} FROM journal_entries j JOIN recent r ON r.id = j.amends_entry_id AND r.n <= $2 WHERE j.kind = 'amendment'`,
    [batchIds, perBatch],
  );
  const byBatch = new Map<string, JournalRecord[]>();
  for (const r of records) byBatch.set(r.batchId, [...(byBatch.get(r.batchId) ?? []), r]);
  return new Map([...byBatch].map(([id, rows]) => [id, readingsView(rows)]));
}

/** One entry of the batch with its corrections applied; null when the batch has no such entry. */
export async function correctedEntry(
  tx: EntityManager,
  batchId: string,
  entryId: string,
): Promise<{ id: string; kind: JournalKind; occurredAt: Date; original: JournalPayload; payload: JournalPayload } | null> {
  const records: (JournalRecord & { kind: JournalKind; occurredAt: Date })[] = await tx.query(
    `SELECT ${ROW_COLUMNS} FROM journal_entries j WHERE j.batch_id = $1 AND (j.id = $2 OR (j.amends_entry_id = $2 AND j.kind = 'amendment'))`,
    [batchId, entryId],
  );
  const entry = records.find((r) => r.id === entryId);
  if (!entry) return null;
  return { id: entry.id, kind: entry.kind, occurredAt: entry.occurredAt, original: entry.payload, payload: amendedPayloads(records).get(entry.id)! };
}

/** When an addition was recorded as taken out; null while it is still in. */
export async function removalOf(tx: EntityManager, batchId: string, additionEntryId: string): Promise<Date | null> {
  const [row]: { occurredAt: Date }[] = await tx.query(
    `SELECT occurred_at AS "occurredAt" FROM journal_entries WHERE batch_id = $1 AND kind = 'removed' AND payload->>'additionEntryId' = $2`,
    [batchId, additionEntryId],
  );
  return row?.occurredAt ?? null;
}

/** Whether any stabiliser (sulfite, sorbate…) was ever added to the batch. */
export async function hasStabiliser(tx: EntityManager, batchId: string): Promise<boolean> {
  const [row]: { stabilised: boolean }[] = await tx.query(
    `SELECT EXISTS (SELECT 1 FROM journal_entries WHERE batch_id = $1 AND kind = 'addition' AND payload->>'category' = 'stabiliser') AS stabilised`,
    [batchId],
  );
  return row.stabilised;
}

/** An addition (oak, a spice bag…) with a take-out date that is not out yet, for Today. */
export interface AdditionDueOut {
  batchId: string;
  batchName: string;
  entryId: string;
  name: string;
  removeOn: string;
}

/** Additions still in whose take-out date falls on or before `until` (YYYY-MM-DD), soonest first. */
export async function additionsDueOut(tx: EntityManager, cellarId: string, until: string): Promise<AdditionDueOut[]> {
  return tx.query(
    `SELECT e.batch_id AS "batchId", b.name AS "batchName", e.id AS "entryId", e.payload->>'name' AS name, e.payload->>'removeOn' AS "removeOn"
       FROM journal_entries e JOIN batches b ON b.id = e.batch_id
      WHERE e.cellar_id = $1 AND e.kind = 'addition' AND e.payload->>'removeOn' IS NOT NULL
        AND (e.payload->>'removeOn')::date <= $2::date
        AND NOT EXISTS (SELECT 1 FROM journal_entries r WHERE r.batch_id = e.batch_id AND r.kind = 'removed' AND r.payload->>'additionEntryId' = e.id::text)
      ORDER BY (e.payload->>'removeOn')::date`,
    [cellarId, until],
  );
}
