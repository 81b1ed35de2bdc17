import type { EntityManager } from 'typeorm';
import { advanceStage, deriveStage } from '../../shared/domain/stage';
import type { Stage } from '../../shared/schemas/batches';
import type { JournalPayload } from '../../shared/schemas/journal';
import type { Actor } from '../core/actor';
import { latestDeviceReading } from './device-readings';
import { latestReading } from './journal-queries';
import { inheritedHistory } from './lineage';

/** A journal entry as written: what the caller needs back. */
export interface AppendedEntry {
  id: string;
  occurredAt: Date;
  recordedAt: Date;
}

/** The entry, and the batch's stage once it is counted. */
export interface AppendResult extends AppendedEntry {
  stage: Stage;
}

/** The batch's cached figures and where its liquid is, read with the batch row locked. */
interface BatchCaches {
  stage: Stage;
  lastRackedAt: Date | null;
  lastReadingSg: number | null;
  lastReadingAt: Date | null;
  volumeL: number;
  bottles: number;
}

/**
 * Appends one entry to a batch's journal and brings the batch's cached stage and latest
 * figures up to date from the entry alone: the cost does not grow with the journal. Call
 * inside the operation's transaction, after changing vessels or bottles.
 * @param occurredAt - when it happened in the cellar (defaults to now); recordedAt is always now
 */
export async function appendEntry(
  tx: EntityManager,
  actor: Actor,
  batchId: string,
  payload: JournalPayload,
  options: { occurredAt?: Date; amendsEntryId?: string } = {},
): Promise<AppendResult> {
  // Lock first: a second writer on this batch waits here and then sees this one's caches.
  const caches = await lockCaches(tx, batchId);
  const [entry]: AppendedEntry[] = await tx.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id, amends_entry_id)
     VALUES ($1, $2, $3, $4, $5, $6, $7)
     RETURNING id, occurred_at AS "occurredAt", recorded_at AS "recordedAt"`,
    [actor.cellarId, batchId, payload.kind, payload, options.occurredAt ?? new Date(), actor.userId, options.amendsEntryId ?? null],
  );
  const next = await advanceCaches(tx, batchId, caches, payload, entry, options.amendsEntryId ?? null);
  await saveCaches(tx, batchId, next);
  return { ...entry, stage: next.stage };
}

/**
 * Appends many entries to one batch's journal, in the order given (an import): one lock, one
 * INSERT and one update of the batch's caches for them all, the caches moved on entry by entry
 * exactly as `appendEntry` does. Calling `appendEntry` thousands of times in one transaction
 * would update the batch row once per entry, and PostgreSQL cannot prune those row versions
 * before the commit, so each update walks all the earlier ones.
 */
export async function appendEntries(
  tx: EntityManager,
  actor: Actor,
  batchId: string,
  entries: { payload: JournalPayload; occurredAt: Date }[],
): Promise<number> {
  if (!entries.length) return 0;
  let caches = await lockCaches(tx, batchId);
  const [{ recordedAt }]: { recordedAt: Date }[] = await tx.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, $2, e.payload->>'kind', e.payload, e.occurred_at, $3
       FROM jsonb_to_recordset($4::jsonb) AS e(payload jsonb, occurred_at timestamptz)
     RETURNING recorded_at AS "recordedAt"`,
    [actor.cellarId, batchId, actor.userId, JSON.stringify(entries.map((e) => ({ payload: e.payload, occurred_at: e.occurredAt.toISOString() })))],
  );
  for (const { payload, occurredAt } of entries) {
    caches = await advanceCaches(tx, batchId, caches, payload, { id: '', occurredAt, recordedAt }, null);
  }
  await saveCaches(tx, batchId, caches);
  return entries.length;
}

/**
 * Brings the stage up to date after bottles left a batch's cases (no journal entry: the
 * departure is recorded on the case): a bottled batch whose last bottle went is finished.
 */
export async function refreshStageAfterDeparture(tx: EntityManager, batchId: string): Promise<void> {
  const caches = await lockCaches(tx, batchId);
  await saveCaches(tx, batchId, { ...caches, stage: advanceStage(caches.stage, null, contentsOf(caches)) });
}

async function lockCaches(tx: EntityManager, batchId: string): Promise<BatchCaches> {
  const [row]: BatchCaches[] = await tx.query(
    `SELECT b.stage, b.last_racked_at AS "lastRackedAt", b.last_reading_sg::float8 AS "lastReadingSg", b.last_reading_at AS "lastReadingAt",
            (SELECT COALESCE(SUM(v.volume_l), 0)::float8 FROM vessels v WHERE v.batch_id = b.id) AS "volumeL",
            (SELECT COALESCE(SUM(c.bottles_left), 0)::int FROM bottle_cases c JOIN bottle_lots l ON l.id = c.lot_id WHERE l.batch_id = b.id) AS bottles
       FROM batches b WHERE b.id = $1 FOR UPDATE OF b`,
    [batchId],
  );
  return row;
}

function saveCaches(tx: EntityManager, batchId: string, caches: BatchCaches): Promise<unknown> {
  return tx.query(`UPDATE batches SET stage = $2, last_racked_at = $3, last_reading_sg = $4, last_reading_at = $5 WHERE id = $1`, [
    batchId,
    caches.stage,
    caches.lastRackedAt,
    caches.lastReadingSg,
    caches.lastReadingAt,
  ]);
}

const contentsOf = (caches: BatchCaches) => ({ volumeInVesselsL: caches.volumeL, bottlesLeft: caches.bottles });
const later = (a: Date | null, b: Date) => (a && a > b ? a : b);

/** The caches after one more entry. Only a batch's first entry and a corrected reading read more rows. */
async function advanceCaches(
  tx: EntityManager,
  batchId: string,
  before: BatchCaches,
  payload: JournalPayload,
  entry: AppendedEntry,
  amendsEntryId: string | null,
): Promise<BatchCaches> {
  const next = { ...before };
  const event = { kind: payload.kind, category: payload.kind === 'addition' ? payload.category : undefined };
  if (payload.kind === 'started') {
    // A split or blend carries on from where its parents were; a must starts in primary.
    const inherited = await inheritedHistory(tx, batchId);
    next.stage = deriveStage({ events: [event], inherited, ...contentsOf(before) });
    next.lastRackedAt = inherited.lastRackedAt;
    return next;
  }
  next.stage = advanceStage(before.stage, event, contentsOf(before));
  if (payload.kind === 'racked') next.lastRackedAt = later(before.lastRackedAt, entry.occurredAt);
  if (payload.kind === 'reading' && (!before.lastReadingAt || entry.occurredAt >= before.lastReadingAt)) {
    next.lastReadingSg = payload.correctedSg;
    next.lastReadingAt = entry.occurredAt;
  }
  if (payload.kind === 'amendment' && amendsEntryId && 'correctedSg' in payload.changes) {
    // A corrected reading may be the latest one: read the latest (an index look-up) again.
    const latest = await latestReading(tx, batchId);
    next.lastReadingSg = latest?.correctedSg ?? null;
    next.lastReadingAt = latest ? new Date(latest.at) : null;
    // A hydrometer's reading may be later still (device readings are not entries; another index look-up).
    const device = await latestDeviceReading(tx, batchId);
    if (device && (!next.lastReadingAt || device.at >= next.lastReadingAt)) {
      next.lastReadingSg = Math.round(device.sg * 1000) / 1000;
      next.lastReadingAt = device.at;
    }
  }
  return next;
}
