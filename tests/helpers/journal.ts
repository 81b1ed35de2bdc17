import type { DataSource } from 'typeorm';
import type { JournalPayload } from '../../shared/schemas/journal';
import { appendEntry } from '../../server/journal/journal';
import { contextOf, type CellarCrew } from './crew';

/**
 * Journal entries for a test's batch: through the journal writer (`addReadings`,
 * `amendEntry`: the batch's caches follow) or as bare rows (`addJournalEntry`: nothing else
 * changes, for states the writer would not leave).
 */

const DAY_MS = 86_400_000;

/** Appends gravity readings (already temperature-corrected) dated `daysAgo` days before now, as the Hand. */
export async function addReadings(ds: DataSource, crew: CellarCrew, batchId: string, readings: { daysAgo: number; sg: number }[]): Promise<string[]> {
  const ids: string[] = [];
  for (const r of readings) {
    const payload: JournalPayload = { kind: 'reading', sg: r.sg, temperatureC: null, calibrationC: 20, correctedSg: r.sg, ph: null, vesselId: null };
    const entry = await ds.transaction((tx) =>
      appendEntry(tx, contextOf(crew), batchId, payload, { occurredAt: new Date(Date.now() - r.daysAgo * DAY_MS) }),
    );
    ids.push(entry.id);
  }
  return ids;
}

/** Records an amendment that corrects fields of an earlier entry, as the Hand. */
export async function amendEntry(
  ds: DataSource,
  crew: CellarCrew,
  batchId: string,
  entryId: string,
  changes: Record<string, unknown>,
): Promise<void> {
  await ds.transaction((tx) =>
    appendEntry(tx, contextOf(crew), batchId, { kind: 'amendment', reason: 'misread the hydrometer', changes }, { amendsEntryId: entryId }),
  );
}

/** One journal entry, written as the journal writer would store it (the batch's caches are not touched). */
export async function addJournalEntry(
  ds: DataSource,
  cellarId: string,
  batchId: string,
  payload: Record<string, unknown> & { kind: string },
  options: { occurredAt?: Date; recordedAt?: Date; amendsEntryId?: string } = {},
): Promise<string> {
  const [{ id }] = await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, recorded_at, amends_entry_id)
     VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
    [
      cellarId,
      batchId,
      payload.kind,
      JSON.stringify(payload),
      options.occurredAt ?? new Date(),
      options.recordedAt ?? new Date(),
      options.amendsEntryId ?? null,
    ],
  );
  return id;
}

/** A reading payload with the fields the journal keeps. */
export function reading(sg: number, vesselId: string | null, correctedSg = sg) {
  return { kind: 'reading', sg, temperatureC: null, calibrationC: 20, correctedSg, ph: null, vesselId };
}
