import { In, type EntityManager } from 'typeorm';
import { vesselState } from '../../shared/domain/vessel-state';
import type { UnitSystem } from '../../shared/calc';
import { loadCellar } from '../cellars/load-cellar';
import type { Actor } from '../core/actor';
import { volumeText } from '../core/litres';
import { localDateTime } from '../core/local-date';
import { Batch } from '../entities/batch.entity';
import type { Cellar } from '../entities/cellar.entity';
import { Vessel } from '../entities/vessel.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../http/errors';

export interface VesselRef {
  vesselId: string;
  /** The version the caller saw; a different one now means someone else changed it. */
  expectedVersion?: number;
}

/** "now holds Quince cyser (18.5 L)" / "is now empty and dirty", the volume in `units`. */
async function describeVesselNow(tx: EntityManager, vessel: Vessel, cellar: Cellar, units: UnitSystem): Promise<string> {
  if (vessel.retiredAt) return 'is now retired';
  if (vessel.batchId) {
    const batch = await tx.getRepository(Batch).findOneBy({ id: vessel.batchId });
    return `now holds ${batch?.name ?? 'another batch'} (${volumeText(vessel.volumeL ?? 0, units)})`;
  }
  return `is now empty and ${vesselState(vessel, cellar.sanitisedValidDays)}`;
}

/**
 * 409 naming the vessel, what it is now (in the actor's units) and when it changed, by the
 * cellar's clock: the time the people working in it would have seen.
 */
export async function vesselChangedError(
  tx: EntityManager,
  vessel: Vessel,
  units: UnitSystem,
  what = 'changed while you were working',
): Promise<ConflictError> {
  const cellar = await loadCellar(tx, vessel.cellarId);
  const when = `${localDateTime(vessel.updatedAt, cellar.timeZone)} ${cellar.timeZone === 'UTC' ? 'UTC' : `${cellar.timeZone} time`}`;
  const now = await describeVesselNow(tx, vessel, cellar, units);
  return new ConflictError(`${vessel.name} ${what}: it ${now} (changed ${when}). Reload and try again.`, {
    vesselId: vessel.id,
    currentVersion: vessel.version,
  });
}

/**
 * Locks the vessels for the rest of the transaction (SELECT … FOR UPDATE, in id order so two
 * operations never deadlock) and checks each caller's expected version. A second operation on
 * the same vessel waits here for the first to commit, then sees what it did.
 * @returns the vessels by id
 */
export async function lockVessels(tx: EntityManager, actor: Actor, refs: VesselRef[]): Promise<Map<string, Vessel>> {
  const ids = refs.map((r) => r.vesselId);
  if (new Set(ids).size !== ids.length) throw new BadRequestError('The same vessel is listed twice.');
  if (ids.length === 0) return new Map();
  const rows = await tx
    .getRepository(Vessel)
    .createQueryBuilder('v')
    .where({ id: In(ids), cellarId: actor.cellarId })
    .orderBy('v.id')
    .setLock('pessimistic_write')
    .getMany();
  const byId = new Map(rows.map((v) => [v.id, v]));
  for (const ref of refs) {
    const vessel = byId.get(ref.vesselId);
    if (!vessel) throw new NotFoundError('No such vessel in this cellar.');
    if (ref.expectedVersion !== undefined && ref.expectedVersion !== vessel.version) {
      throw await vesselChangedError(tx, vessel, actor.units);
    }
  }
  return byId;
}
