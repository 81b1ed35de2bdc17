import { QueryFailedError, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BottleCase, drawDownRequestSchema } from '../../shared/schemas/bottles';
import type { MoveRequest } from '../../shared/schemas/places';
import { requireRole, type Actor } from '../core/actor';
import { Batch } from '../entities/batch.entity';
import { BottleCaseRow } from '../entities/bottle-case.entity';
import { BottleDeparture } from '../entities/bottle-departure.entity';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../http/errors';
import { refreshStageAfterDeparture } from '../journal/journal';
import { placesOf, placeThing } from '../places/placement';
import { caseDto } from './lot-queries';

type DrawDownRequest = z.output<typeof drawDownRequestSchema>;

/** A case with the lot it came from, for the page a case label opens. */
export type BottleCaseDetail = BottleCase & {
  lot: {
    id: string;
    code: string;
    batchId: string;
    batchName: string;
    bottledOn: string;
    bottleMl: number;
    sulfiteAdded: boolean;
    abvEstimate: number | null;
  };
};

const bottles = (n: number) => `${n} bottle${n === 1 ? '' : 's'}`;

/** Reads a case of this cellar, locked for the rest of the transaction when asked. */
async function findCase(tx: EntityManager, cellarId: string, caseId: string, lock: boolean): Promise<BottleCaseRow> {
  const query = tx.getRepository(BottleCaseRow).createQueryBuilder('c').where({ id: caseId, cellarId });
  if (lock) query.setLock('pessimistic_write');
  const row = await query.getOne();
  if (!row) throw new NotFoundError('No such case in this cellar.');
  return row;
}

function checkVersion(row: BottleCaseRow, expectedVersion: number | undefined): void {
  if (expectedVersion !== undefined && expectedVersion !== row.version) {
    throw new ConflictError(`Case ${row.number} changed while you were working: it now has ${bottles(row.bottlesLeft)} left. Reload and try again.`, {
      caseId: row.id,
      currentVersion: row.version,
    });
  }
}

async function toDto(tx: EntityManager, row: BottleCaseRow): Promise<BottleCase> {
  const places = await placesOf(tx, 'case', [row.id]);
  return caseDto(row, places.get(row.id) ?? null);
}

/** One case with its place and a summary of its lot. */
export async function getCase(actor: Actor, tx: EntityManager, caseId: string): Promise<BottleCaseDetail> {
  requireRole(actor, 'guest');
  const row = await findCase(tx, actor.cellarId, caseId, false);
  const lot = await tx.getRepository(BottleLotRow).findOneByOrFail({ id: row.lotId });
  const batch = await tx.getRepository(Batch).findOneByOrFail({ id: lot.batchId });
  return {
    ...(await toDto(tx, row)),
    lot: {
      id: lot.id,
      code: lot.code,
      batchId: lot.batchId,
      batchName: batch.name,
      bottledOn: lot.bottledOn,
      bottleMl: lot.bottleMl,
      sulfiteAdded: lot.sulfiteAdded,
      abvEstimate: lot.abvEstimate,
    },
  };
}

/** A few minutes' grace for a phone whose clock runs a little ahead. */
const CLOCK_GRACE_MS = 5 * 60 * 1000;

/**
 * When bottles left: the moment the request gives (checked: not in the future, not before
 * the lot was bottled), or now.
 */
function departureMoment(at: string | undefined, bottledOn: string): Date {
  if (at === undefined) return new Date();
  const moment = new Date(at);
  if (moment.getTime() > Date.now() + CLOCK_GRACE_MS) {
    throw new BadRequestError('body.at: that is in the future; record bottles when they have left.', {
      issues: [{ path: 'body.at', message: 'cannot be in the future' }],
    });
  }
  if (moment.toISOString().slice(0, 10) < bottledOn) {
    throw new BadRequestError(`body.at: that is before the lot was bottled (${bottledOn}).`, {
      issues: [{ path: 'body.at', message: `not before the bottling day (${bottledOn})` }],
    });
  }
  return moment;
}

/**
 * Takes bottles out of a case (drunk, given, sold, sent to a competition, broken). The case row
 * is locked, so two people drawing from the same case at once are served one after the other
 * and the second sees what the first took. When the last bottle of the batch leaves, the
 * batch becomes finished.
 */
export async function drawDown(actor: Actor, tx: EntityManager, caseId: string, request: DrawDownRequest): Promise<BottleCase> {
  requireRole(actor, 'hand');
  const row = await findCase(tx, actor.cellarId, caseId, true);
  checkVersion(row, request.expectedVersion);
  const tooMany = () =>
    new ConflictError(row.bottlesLeft === 0 ? `Case ${row.number} is empty.` : `Case ${row.number} has only ${bottles(row.bottlesLeft)} left.`, {
      caseId: row.id,
      bottlesLeft: row.bottlesLeft,
      currentVersion: row.version,
    });
  if (request.count > row.bottlesLeft) throw tooMany();
  const lot = await tx.getRepository(BottleLotRow).findOneByOrFail({ id: row.lotId });
  const occurredAt = departureMoment(request.at, lot.bottledOn);

  const departures = tx.getRepository(BottleDeparture);
  await departures.save(
    departures.create({
      cellarId: actor.cellarId,
      caseId: row.id,
      count: request.count,
      reason: request.reason,
      note: request.note,
      authorId: actor.userId,
      occurredAt,
    }),
  );
  try {
    await tx.query(`UPDATE bottle_cases SET bottles_left = bottles_left - $1, version = version + 1 WHERE id = $2`, [request.count, row.id]);
  } catch (error) {
    // The CHECK (bottles_left >= 0) is the last line of defence behind the check above.
    if (error instanceof QueryFailedError && (error.driverError as { code?: string }).code === '23514') throw tooMany();
    throw error;
  }
  await refreshStageAfterDeparture(tx, lot.batchId);
  return toDto(tx, await findCase(tx, actor.cellarId, caseId, false));
}

/** Puts a case into a slot, or takes it off its shelf when `to` is null. */
export async function moveCase(actor: Actor, tx: EntityManager, caseId: string, move: MoveRequest): Promise<BottleCase> {
  requireRole(actor, 'hand');
  const row = await findCase(tx, actor.cellarId, caseId, true);
  checkVersion(row, move.expectedVersion);
  await placeThing(tx, actor.cellarId, { caseId: row.id }, move.to);
  // A move is a change of the case: a stale mover elsewhere must reload.
  await tx.query(`UPDATE bottle_cases SET version = version + 1 WHERE id = $1`, [row.id]);
  return toDto(tx, await findCase(tx, actor.cellarId, caseId, false));
}
