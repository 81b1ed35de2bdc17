import type { EntityManager } from 'typeorm';
import { CAUTION_GLASS, headspace, type UnitSystem } from '../../shared/calc';
import { headspaceIsRisk } from '../../shared/domain/headspace-rule';
import { vesselState } from '../../shared/domain/vessel-state';
import { volumeText } from '../core/litres';
import { Batch } from '../entities/batch.entity';
import type { Cellar } from '../entities/cellar.entity';
import type { Vessel } from '../entities/vessel.entity';
import { BadRequestError, ConflictError } from '../http/errors';
import { vesselChangedError } from '../vessels/vessel-lock';

/** A vessel as the journal remembers it. */
export const vesselVolume = (vessel: Vessel, volumeL: number) => ({ vesselId: vessel.id, vesselName: vessel.name, volumeL });

const day = (d: Date) => d.toISOString().slice(0, 10);

/** 409 naming the vessel unless it holds the batch now (someone else may have emptied it). */
export async function requireHolds(tx: EntityManager, vessel: Vessel, batch: Batch, units: UnitSystem): Promise<void> {
  if (vessel.batchId !== batch.id) throw await vesselChangedError(tx, vessel, units);
}

function notSanitisedMessage(vessel: Vessel, cellar: Cellar): string {
  const orReason = 'or give a reason to use it anyway';
  if (vessel.cleaningState === 'dirty') return `${vessel.name} is dirty, not sanitised. Clean and sanitise it first, ${orReason}.`;
  if (vessel.cleaningState === 'sanitised' && vessel.sanitisedAt) {
    return (
      `${vessel.name} was sanitised on ${day(vessel.sanitisedAt)}, more than ${cellar.sanitisedValidDays} days ago. ` +
      `Sanitise it again, ${orReason}.`
    );
  }
  return `${vessel.name} is clean but not sanitised. Sanitise it first, ${orReason}.`;
}

/**
 * Checks that a vessel can take liquid: in use, empty, big enough, and sanitised within the
 * cellar's days (or, failing that, that the caller gave an override reason).
 * @param units - the units its refusals are worded in (the actor's)
 * @returns true when the override reason was needed for this vessel
 */
export async function checkFillTarget(
  tx: EntityManager,
  vessel: Vessel,
  volumeL: number,
  cellar: Cellar,
  overrideReason: string | null,
  now: Date,
  units: UnitSystem,
): Promise<boolean> {
  if (vessel.retiredAt) throw new ConflictError(`${vessel.name} is retired; choose a vessel in use.`, { vesselId: vessel.id });
  if (vessel.batchId) {
    const holding = await tx.getRepository(Batch).findOneBy({ id: vessel.batchId });
    throw new ConflictError(
      `${vessel.name} already holds ${holding?.name ?? 'another batch'} (${volumeText(vessel.volumeL ?? 0, units)}); choose an empty vessel.`,
      { vesselId: vessel.id, currentVersion: vessel.version },
    );
  }
  if (volumeL > vessel.capacityL) {
    throw new BadRequestError(`${vessel.name} holds ${volumeText(vessel.capacityL, units)}; ${volumeText(volumeL, units)} will not fit.`, {
      vesselId: vessel.id,
    });
  }
  if (vesselState(vessel, cellar.sanitisedValidDays, now) === 'sanitised') return false;
  if (overrideReason) return true;
  throw new ConflictError(notSanitisedMessage(vessel, cellar), { vesselId: vessel.id, overrideAllowed: true });
}

/** Leaves a vessel empty and dirty, as racking or blending out of it does. */
export function markEmptied(vessel: Vessel): void {
  vessel.batchId = null;
  vessel.volumeL = null;
  vessel.filledAt = null;
  vessel.cleaningState = 'dirty';
  vessel.sanitisedAt = null;
}

/** Puts a batch into an empty vessel. */
export function markFilled(vessel: Vessel, batchId: string, volumeL: number, at: Date): void {
  vessel.batchId = batchId;
  vessel.volumeL = volumeL;
  vessel.filledAt = at;
}

function percentText(percent: number, limit: number): string {
  const whole = Math.round(percent);
  return whole > limit ? String(whole) : percent.toFixed(1);
}

/**
 * "Fermenter 2 has 12 % headspace — …" for each filled vessel above the cellar's limit; nothing
 * while the batch is in primary, where room is needed and the ferment's gas protects it.
 * @param filled - vessels with their new volume
 * @param stage - the batch's stage after the operation (unknown: warned about)
 */
export function headspaceWarnings(filled: { vessel: Vessel; volumeL: number }[], cellar: Cellar, stage?: string): string[] {
  const warnings: string[] = [];
  if (!headspaceIsRisk(stage)) return warnings;
  for (const { vessel, volumeL } of filled) {
    const space = headspace({ capacityL: vessel.capacityL, volumeL });
    if (space.percent > cellar.headspaceWarnPercent) {
      warnings.push(
        `${vessel.name} has ${percentText(space.percent, cellar.headspaceWarnPercent)} % headspace — top up or use a smaller vessel to limit oxidation.`,
      );
    }
  }
  return warnings;
}

/** The glass caution when any vessel carried or filled is glass. */
export function glassCautions(vessels: Vessel[]): string[] {
  return vessels.some((v) => v.material === 'glass') ? [CAUTION_GLASS] : [];
}

/** Refuses a vessel named as both source and target before anything is locked. */
export function refuseSourceAsTarget(from: { vesselId: string }[], to: { vesselId: string }[]): void {
  const sources = new Set(from.map((f) => f.vesselId));
  if (to.some((t) => sources.has(t.vesselId))) {
    throw new BadRequestError('A vessel cannot be both a source and a target; rack into a different vessel.');
  }
}

/** 400 when the targets are to receive more than the sources hold. */
export function refuseMoreThanSources(fromL: number, toL: number, verb: string, units: UnitSystem): void {
  if (toL > fromL + 1e-9) {
    throw new BadRequestError(
      `You cannot ${verb} more than the source holds: the sources hold ${volumeText(fromL, units)}, the targets would get ${volumeText(toL, units)}.`,
    );
  }
}
