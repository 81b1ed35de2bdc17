import type { EntityManager } from 'typeorm';
import { localDate } from '../core/local-date';
import { Batch } from '../entities/batch.entity';
import { Vessel } from '../entities/vessel.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../http/errors';

const NO_SUCH_BATCH = 'No such batch in this cellar.';

/** The batch, or 404 when it is not in this cellar. Takes no lock. */
export async function findBatch(tx: EntityManager, cellarId: string, batchId: string): Promise<Batch> {
  const batch = await tx.getRepository(Batch).findOneBy({ id: batchId, cellarId });
  if (!batch) throw new NotFoundError(NO_SUCH_BATCH);
  return batch;
}

/**
 * Locks the batch row for the rest of the transaction, so two operations on one batch write
 * their journal lines and caches one after the other. Lock vessels first, then batches
 * (the order every writer follows), so two operations never wait on each other in a circle.
 */
export async function lockBatch(tx: EntityManager, cellarId: string, batchId: string): Promise<Batch> {
  const batch = await tx.getRepository(Batch).findOne({ where: { id: batchId, cellarId }, lock: { mode: 'pessimistic_write' } });
  if (!batch) throw new NotFoundError(NO_SUCH_BATCH);
  return batch;
}

/** What an entry's checks need of its batch: the name for messages, the start for dates. */
export type BatchNamed = Pick<Batch, 'id' | 'name' | 'startedOn'>;

/** A batch locked for one more journal entry about its liquid, with what that entry's checks need. */
export interface BatchForEntry {
  batch: BatchNamed;
  timeZone: string;
  /** Whether any vessel holds the batch now. */
  inVessels: boolean;
  /** The vessel the entry names, as it is now: null when it is not in this cellar. */
  namedVessel: { id: string; batchId: string | null } | null;
}

/**
 * Locks the batch row (as `lockBatch`, reading only its name and start), then reads the cellar's
 * time zone, whether the batch is in any vessel and the named vessel's contents in one
 * statement — after the lock, so a racking that committed while this waited is seen. Two
 * statements where the general path takes five.
 */
export async function lockBatchForEntry(tx: EntityManager, cellarId: string, batchId: string, vesselId: string | null): Promise<BatchForEntry> {
  const [batch]: BatchNamed[] = await tx.query(
    `SELECT id, name, started_on::text AS "startedOn" FROM batches WHERE id = $1 AND cellar_id = $2 FOR UPDATE`,
    [batchId, cellarId],
  );
  if (!batch) throw new NotFoundError(NO_SUCH_BATCH);
  const [facts]: { timeZone: string; inVessels: boolean; namedId: string | null; namedBatchId: string | null }[] = await tx.query(
    `SELECT c.time_zone AS "timeZone",
            EXISTS (SELECT 1 FROM vessels v WHERE v.batch_id = $2) AS "inVessels",
            n.id AS "namedId", n.batch_id AS "namedBatchId"
       FROM cellars c
       LEFT JOIN vessels n ON n.id = $3 AND n.cellar_id = c.id
      WHERE c.id = $1`,
    [cellarId, batchId, vesselId],
  );
  return {
    batch,
    timeZone: facts.timeZone,
    inVessels: facts.inVessels,
    namedVessel: facts.namedId ? { id: facts.namedId, batchId: facts.namedBatchId } : null,
  };
}

/** The vessels holding the batch now, by name. */
export function vesselsHolding(tx: EntityManager, batchId: string): Promise<Vessel[]> {
  return tx.getRepository(Vessel).find({ where: { batchId }, order: { name: 'ASC', id: 'ASC' } });
}

/** 409 for work that needs the liquid when the batch is in no vessel any more. */
export async function requireInVessels(tx: EntityManager, batch: Batch): Promise<Vessel[]> {
  const vessels = await vesselsHolding(tx, batch.id);
  if (vessels.length === 0) throw notInVesselsError(batch);
  return vessels;
}

export const notInVesselsError = (batch: Pick<Batch, 'name'>): ConflictError =>
  new ConflictError(`${batch.name} is not in any vessel any more (it was bottled, blended or moved on), so this cannot be done to it.`);

/** Clocks on phones drift; a few minutes ahead is not "the future". */
const CLOCK_SLACK_MS = 5 * 60 * 1000;

/**
 * When an operation happened: the given moment, or now. Refuses moments in the future and
 * (for an existing batch) before the batch was started.
 * @param at - ISO date-time from the request, if any
 */
export function occurredAt(at: string | undefined, now: Date, batch?: Pick<Batch, 'name' | 'startedOn'>, timeZone = 'UTC'): Date {
  if (!at) return now;
  const moment = new Date(at);
  if (moment.getTime() > now.getTime() + CLOCK_SLACK_MS) throw new BadRequestError('body.at: that moment is in the future.');
  if (batch && localDate(moment, timeZone) < batch.startedOn) {
    throw new BadRequestError(`body.at: that is before ${batch.name} was started (${batch.startedOn}).`);
  }
  return moment;
}
