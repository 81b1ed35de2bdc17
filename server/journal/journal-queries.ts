import type { EntityManager } from 'typeorm';
import {
  amendedPayloads,
  compareEntries,
  mergedChanges,
  readingsView,
  withChanges,
  type JournalRecord,
  type ReadingView,
} from '../../shared/domain/journal';
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

/**
 * Additions still in whose take-out date (as last amended) falls on or before `until`
 * (YYYY-MM-DD), soonest first. A stored date that cannot be read is left out here (the
 * batch's journal shows it as unreadable) rather than failing the whole list.
 */
export async function additionsDueOut(tx: EntityManager, cellarId: string, until: string): Promise<AdditionDueOut[]> {
  return tx.query(
    `SELECT a.batch_id AS "batchId", b.name AS "batchName", a.id AS "entryId", a.name, a.remove_on::text AS "removeOn"
       FROM (SELECT e.batch_id, e.id, e.payload->>'name' AS name,
                    cw_readable_date(CASE WHEN fix.changes ? 'removeOn' THEN fix.changes->>'removeOn' ELSE e.payload->>'removeOn' END) AS remove_on
               FROM journal_entries e
               LEFT JOIN LATERAL (
                 SELECT am.payload->'changes' AS changes FROM journal_entries am
                  WHERE am.amends_entry_id = e.id AND am.kind = 'amendment' AND am.payload->'changes' ? 'removeOn'
                  ORDER BY am.recorded_at DESC, am.id DESC LIMIT 1) fix ON true
              WHERE e.cellar_id = $1 AND e.kind = 'addition'
                AND NOT EXISTS (SELECT 1 FROM journal_entries r WHERE r.batch_id = e.batch_id AND r.kind = 'removed' AND r.payload->>'additionEntryId' = e.id::text)
            ) a JOIN batches b ON b.id = a.batch_id
      WHERE a.remove_on <= $2::date
      ORDER BY a.remove_on, a.id`,
    [cellarId, until],
  );
}

/** A journal entry that anchors or completes a planned task, corrections applied. */
export interface TaskEventRow {
  id: string;
  batchId: string;
  occurredAt: Date;
  /** The local date it happened on, in the time zone asked for (YYYY-MM-DD). */
  localOn: string;
  payload: JournalPayload;
}

/** Kinds of entry the rule engine reads (shared/domain/plans): its anchors and completions. */
const TASK_EVENT_KINDS = ['reading', 'racked', 'addition', 'removed', 'topped-up', 'tasted', 'bottled'];

/** One entry as the task query sends it, inside its batch's JSON array (times in epoch milliseconds). */
type TaskEventTuple = [
  id: string,
  kind: JournalKind,
  payload: JournalPayload,
  amendsEntryId: string | null,
  occurredMs: number,
  recordedMs: number,
  localOn: string,
];

/**
 * The entries of these batches that plans count from or that complete tasks, with their
 * corrections applied, per batch in the journal's order: one statement however many batches.
 */
export async function taskEvents(tx: EntityManager, batchIds: string[], timeZone: string): Promise<Map<string, TaskEventRow[]>> {
  const byBatch = new Map<string, TaskEventRow[]>();
  if (batchIds.length === 0) return byBatch;
  // One JSON array per batch, read with JSON.parse: at thousands of batches a row and a type
  // parser per entry cost more than the query. The local date comes from PostgreSQL's time zone
  // rules. Entries come in the journal's order, so each batch's sort below is one pass.
  const rows: { batchId: string; entries: TaskEventTuple[] }[] = await tx.query(
    `SELECT j.batch_id AS "batchId",
            json_agg(json_build_array(j.id, j.kind, j.payload, j.amends_entry_id,
                                      floor(extract(epoch FROM j.occurred_at) * 1000), floor(extract(epoch FROM j.recorded_at) * 1000),
                                      (j.occurred_at AT TIME ZONE $3)::date)
                     ORDER BY j.occurred_at, j.recorded_at, j.id) AS entries
       FROM journal_entries j
      WHERE j.batch_id = ANY($1) AND (j.kind = ANY($2) OR (j.kind = 'amendment' AND j.amends_entry_id IS NOT NULL))
      GROUP BY j.batch_id`,
    [batchIds, TASK_EVENT_KINDS, timeZone],
  );
  for (const { batchId, entries } of rows) {
    const records = entries.map(([id, kind, payload, amendsEntryId, occurredMs, recordedMs, localOn]) => ({
      id,
      kind,
      payload,
      amendsEntryId,
      occurredAt: new Date(occurredMs),
      recordedAt: new Date(recordedMs),
      localOn,
    }));
    const changes = mergedChanges(records);
    byBatch.set(
      batchId,
      records
        .filter((r) => r.kind !== 'amendment')
        .sort(compareEntries)
        .map((r) => ({ id: r.id, batchId, occurredAt: r.occurredAt, localOn: r.localOn, payload: withChanges(r, changes) })),
    );
  }
  return byBatch;
}
