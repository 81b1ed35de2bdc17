import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import {
  abvBy,
  bottlesFrom,
  CalcInputError,
  CAUTION_BOTTLE_PRESSURE,
  CAUTION_ESTIMATE,
  CAUTION_SULFITES,
  casesFrom,
  fermentationState,
  type FermentationState,
  type GravityReading,
} from '../../shared/calc';
import type { BottleLot } from '../../shared/schemas/bottles';
import type { bottleRequestSchema } from '../../shared/schemas/journal';
import { requireRole, type Actor } from '../core/actor';
import { volumeText } from '../core/litres';
import { Batch } from '../entities/batch.entity';
import { BottleCaseRow } from '../entities/bottle-case.entity';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { Vessel } from '../entities/vessel.entity';
import { AppError, BadRequestError, NotFoundError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { inheritedReadings } from '../batches/split-lineage';
import { batchReadings } from '../journal/journal-queries';
import { newLabelCode } from '../labels/label-codes';
import { lockVessels, vesselChangedError } from '../vessels/vessel-lock';
import { loadLot } from './lot-queries';

type BottleRequest = z.output<typeof bottleRequestSchema>;

/** What a bottling answers: the new lot, things worth a second look, and the safety cautions. */
export interface BottlingResult {
  lot: BottleLot;
  warnings: string[];
  cautions: string[];
}

const DAY_MS = 86_400_000;

/** Litres as people write them: at most 3 decimals, no trailing zeros. */

/** The state the library sees, or null when there is nothing to judge by (no OG, no readings). */
function judgeFermentation(batch: Batch, readings: GravityReading[], now: Date): FermentationState | null {
  if (batch.og === null || readings.length === 0) return null;
  try {
    return fermentationState({ og: batch.og, toleranceAbv: batch.yeastToleranceAbv, readings, now });
  } catch (error) {
    if (error instanceof CalcInputError) return null;
    throw error;
  }
}

function abvEstimate(og: number | null, last: GravityReading | undefined): number | null {
  if (og === null || !last) return null;
  try {
    return Math.round(abvBy(og, last.sg) * 10) / 10;
  } catch (error) {
    if (error instanceof CalcInputError) return null;
    throw error;
  }
}

function confirmationRequired(state: FermentationState | null): AppError {
  const seen = state ? `state: ${state}` : 'no original gravity or readings to judge by';
  return new AppError(
    409,
    'confirmation_required',
    `The fermentation does not look finished (${seen}). Bottling now can burst bottles. Confirm to bottle anyway.`,
    { state, caution: CAUTION_BOTTLE_PRESSURE },
  );
}

/** Today's bottling happened now; an earlier date is recorded at midday UTC of that day. */
function bottlingMoment(bottledOn: string, now: Date): Date {
  return bottledOn === now.toISOString().slice(0, 10) ? now : new Date(`${bottledOn}T12:00:00Z`);
}

function checkDate(batch: Batch, bottledOn: string, now: Date): void {
  // One day of grace: the cellar's local date can be ahead of UTC.
  if (new Date(`${bottledOn}T00:00:00Z`).getTime() > now.getTime() + DAY_MS) {
    throw new BadRequestError(`The bottling date ${bottledOn} is in the future.`);
  }
  if (bottledOn < batch.startedOn) {
    throw new BadRequestError(`The bottling date ${bottledOn} is before ${batch.name} was started (${batch.startedOn}).`);
  }
}

/** Full cases of `perCase`, then one case with the rest. */
function caseSizes(bottleCount: number, perCase: number): number[] {
  const { cases, loose } = casesFrom(bottleCount, perCase);
  return [...Array<number>(cases).fill(perCase), ...(loose > 0 ? [loose] : [])];
}

/**
 * Bottles a batch from the chosen vessels: checks they hold it and hold enough, asks for
 * confirmation when the fermentation does not look finished, then makes the lot and its
 * cases (each with its own label code), empties the vessels (left dirty) and writes the
 * 'bottled' journal entry, all in one transaction.
 */
export async function bottleBatch(actor: Actor, tx: EntityManager, batchId: string, request: BottleRequest): Promise<BottlingResult> {
  requireRole(actor, 'hand');
  const now = new Date();
  const batches = tx.getRepository(Batch);
  if (!(await batches.existsBy({ id: batchId, cellarId: actor.cellarId }))) throw new NotFoundError('No such batch in this cellar.');
  // Vessels before the batch row: the lock order every writer follows, so none deadlock.
  const vessels = await lockVessels(tx, actor, request.from);
  const batch = await batches.createQueryBuilder('b').where({ id: batchId }).setLock('pessimistic_write').getOneOrFail();
  checkDate(batch, request.bottledOn, now);
  for (const vessel of vessels.values()) {
    if (vessel.batchId !== batch.id) throw await vesselChangedError(tx, vessel, actor.units, `does not hold ${batch.name}`);
  }
  const from = request.from.map((ref) => vessels.get(ref.vesselId)!);
  const volumeL = from.reduce((sum, v) => sum + (v.volumeL ?? 0), 0);
  const bottledL = (request.bottleCount * request.bottleMl) / 1000;
  const fits = bottlesFrom({ volumeL, bottleMl: request.bottleMl });
  if (request.bottleCount > fits.bottles) {
    throw new BadRequestError(
      `${request.bottleCount} bottles of ${request.bottleMl} mL need ${volumeText(bottledL, actor.units)} but the vessels hold ${volumeText(volumeL, actor.units)}` +
        ` — enough for ${fits.bottles} bottle${fits.bottles === 1 ? '' : 's'}.`,
      { maxBottles: fits.bottles },
    );
  }

  // A split's state follows the must it came from: its parent's readings up to the split count too.
  const readings = [...(await inheritedReadings(tx, batch.id)), ...(await batchReadings(tx, batch.id))].map((r) => ({
    at: new Date(r.at),
    sg: r.correctedSg,
  }));
  const state = judgeFermentation(batch, readings, now);
  if (state !== 'finished' && !request.confirmNotFinished) throw confirmationRequired(state);

  const lotRepo = tx.getRepository(BottleLotRow);
  const lot = await lotRepo.save(
    lotRepo.create({
      cellarId: actor.cellarId,
      batchId: batch.id,
      code: await newLabelCode(tx),
      bottledOn: request.bottledOn,
      bottleMl: request.bottleMl,
      bottleCount: request.bottleCount,
      closure: request.closure,
      carbonation: request.carbonation,
      sulfiteAdded: request.sulfiteAdded,
      abvEstimate: abvEstimate(batch.og, readings.at(-1)),
      note: request.note,
    }),
  );
  const sizes = caseSizes(request.bottleCount, request.perCase);
  const caseRepo = tx.getRepository(BottleCaseRow);
  for (const [i, size] of sizes.entries()) {
    const code = await newLabelCode(tx);
    await caseRepo.save(caseRepo.create({ cellarId: actor.cellarId, lotId: lot.id, code, number: i + 1, bottlesInitial: size, bottlesLeft: size }));
  }

  for (const vessel of from) {
    await tx
      .getRepository(Vessel)
      .update(
        { id: vessel.id },
        { batchId: null, volumeL: null, filledAt: null, cleaningState: 'dirty', sanitisedAt: null, version: vessel.version + 1 },
      );
  }
  const lossL = Number((volumeL - bottledL).toFixed(3));
  await appendEntry(
    tx,
    actor,
    batch.id,
    {
      kind: 'bottled',
      lotId: lot.id,
      lotCode: lot.code,
      bottleCount: request.bottleCount,
      bottleMl: request.bottleMl,
      caseCount: sizes.length,
      from: from.map((v) => ({ vesselId: v.id, vesselName: v.name, volumeL: v.volumeL ?? 0 })),
      lossL,
      confirmedNotFinished: state !== 'finished',
    },
    { occurredAt: bottlingMoment(request.bottledOn, now) },
  );

  const warnings: string[] = [];
  if (state !== 'finished') {
    warnings.push(`Bottled although the fermentation did not look finished (${state ?? 'not enough readings'}). Check the bottles for pressure.`);
  }
  const leftOver = bottlesFrom({ volumeL, bottleMl: request.bottleMl, lossL: bottledL });
  if (leftOver.bottles > 0) {
    warnings.push(
      `${volumeText(lossL, actor.units)} was not bottled — enough for ${leftOver.bottles} more bottle${leftOver.bottles === 1 ? '' : 's'}. It is recorded as loss.`,
    );
  }
  if (lot.abvEstimate === null) warnings.push('No original gravity or reading is recorded, so the lot has no ABV estimate.');
  // Bottle pressure is a caution only while the fermentation does not read finished.
  const cautions = [
    ...(state !== 'finished' ? [CAUTION_BOTTLE_PRESSURE] : []),
    ...(request.sulfiteAdded ? [CAUTION_SULFITES] : []),
    ...(lot.abvEstimate !== null ? [CAUTION_ESTIMATE] : []),
  ];
  return { lot: await loadLot(tx, actor.cellarId, lot.id), warnings, cautions };
}
