import type { EntityManager } from 'typeorm';
import { batchReadings } from '../journal/journal-queries';
import { journalExportPage, type EntryCursor, type ExportedEntry } from '../journal/journal-export';
import type { DepartureRow, ReadingRow } from './export-columns';

/**
 * Where the exports that have no list page of their own read from, a page at a time. Each
 * source is an async generator, so the CSV writer pulls the next page only when the last one
 * is written.
 */

const PAGE = 500;

/** The cellar's journal (or one batch's), oldest first, in key-set pages. */
export async function* journalPages(tx: EntityManager, cellarId: string, batchId?: string): AsyncIterable<ExportedEntry[]> {
  let after: EntryCursor | null = null;
  for (;;) {
    const rows = await journalExportPage(tx, cellarId, { batchId, after, limit: PAGE });
    if (rows.length) yield rows;
    if (rows.length < PAGE) return;
    const last = rows[rows.length - 1];
    after = { occurredAtExact: last.occurredAtExact, id: last.id };
  }
}

/** Readings with corrections applied, one batch at a time (the batches oldest first). */
export async function* readingPages(tx: EntityManager, cellarId: string, batchId?: string): AsyncIterable<ReadingRow[]> {
  const batches: { id: string; name: string }[] = await tx.query(
    `SELECT id, name FROM batches WHERE cellar_id = $1 AND ($2::uuid IS NULL OR id = $2::uuid) ORDER BY started_on, created_at, id`,
    [cellarId, batchId ?? null],
  );
  for (const batch of batches) {
    const readings = await batchReadings(tx, batch.id);
    if (readings.length) yield readings.map((r) => ({ ...r, batchId: batch.id, batchName: batch.name }));
  }
}

/** Bottles that left the cellar's cases, oldest first, in key-set pages. */
export async function* departurePages(tx: EntityManager, cellarId: string): AsyncIterable<DepartureRow[]> {
  let after: { occurredAtExact: string; id: string } | null = null;
  for (;;) {
    const rows: (DepartureRow & { occurredAtExact: string })[] = await tx.query(
      `SELECT d.id, c.code AS "caseCode", l.code AS "lotCode", b.name AS "batchName", d.count, d.reason, d.note,
              d.occurred_at AS "occurredAt", d.occurred_at::text AS "occurredAtExact", u.display_name AS "authorName"
         FROM bottle_departures d
         JOIN bottle_cases c ON c.id = d.case_id
         JOIN bottle_lots l ON l.id = c.lot_id
         JOIN batches b ON b.id = l.batch_id
         LEFT JOIN users u ON u.id = d.author_id
        WHERE d.cellar_id = $1 AND ($2::timestamptz IS NULL OR (d.occurred_at, d.id) > ($2::timestamptz, $3::uuid))
        ORDER BY d.occurred_at, d.id
        LIMIT ${PAGE}`,
      [cellarId, after?.occurredAtExact ?? null, after?.id ?? null],
    );
    if (rows.length) yield rows;
    if (rows.length < PAGE) return;
    after = rows[rows.length - 1];
  }
}
