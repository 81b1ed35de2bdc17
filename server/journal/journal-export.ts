import type { EntityManager } from 'typeorm';
import type { JournalKind, JournalPayload } from '../../shared/schemas/journal';

/** One journal entry as an export writes it: the entry, its batch's name and its author's. */
export interface ExportedEntry {
  id: string;
  batchId: string;
  batchName: string;
  kind: JournalKind;
  payload: JournalPayload;
  occurredAt: Date;
  recordedAt: Date;
  amendsEntryId: string | null;
  /** Null for the cellar's own jobs (an import, a clock). */
  authorId: string | null;
  authorName: string | null;
  /** occurred_at to the microsecond, as PostgreSQL writes it: a Date would drop the microseconds. */
  occurredAtExact: string;
}

/** Where the previous page ended, in the order pages are read. */
export interface EntryCursor {
  occurredAtExact: string;
  id: string;
}

/**
 * One page of a cellar's journal (or one batch's), oldest first, after `cursor`: a key-set
 * page, so the 1,000th page costs what the first does. Amendments are rows of their own.
 */
export function journalExportPage(
  tx: EntityManager,
  cellarId: string,
  options: { batchId?: string; after: EntryCursor | null; limit: number },
): Promise<ExportedEntry[]> {
  const params: unknown[] = [cellarId, options.limit];
  const where = ['j.cellar_id = $1'];
  if (options.batchId) {
    params.push(options.batchId);
    where.push(`j.batch_id = $${params.length}`);
  }
  if (options.after) {
    params.push(options.after.occurredAtExact, options.after.id);
    where.push(`(j.occurred_at, j.id) > ($${params.length - 1}::timestamptz, $${params.length}::uuid)`);
  }
  return tx.query(
    `SELECT j.id, j.batch_id AS "batchId", b.name AS "batchName", j.kind, j.payload, j.occurred_at AS "occurredAt",
            j.recorded_at AS "recordedAt", j.amends_entry_id AS "amendsEntryId", j.author_id AS "authorId", u.display_name AS "authorName",
            j.occurred_at::text AS "occurredAtExact"
       FROM journal_entries j JOIN batches b ON b.id = j.batch_id LEFT JOIN users u ON u.id = j.author_id
      WHERE ${where.join(' AND ')}
      ORDER BY j.occurred_at, j.id
      LIMIT $2`,
    params,
  );
}
