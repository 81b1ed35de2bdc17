import crypto from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import type { CleaningState, VesselKind } from '../../shared/schemas/vessels';
import { Vessel } from '../../server/entities/vessel.entity';
import { randomLabelCode } from '../../server/labels/label-codes';

/**
 * Vessels written straight into the database, for states the vessels API alone cannot reach
 * (a vessel holding a batch, sanitised days ago, retired). Invented data only.
 */

export interface VesselSeed {
  name?: string;
  /** The label code; a random one unless given. */
  code?: string;
  kind?: VesselKind;
  material?: string;
  capacityL?: number;
  cleaningState?: CleaningState;
  sanitisedAt?: Date | null;
  retiredAt?: Date | null;
  /** The batch it holds (empty unless given). */
  batch?: { id: string } | null;
  /** Litres of `batch` in it: 90 % of the capacity unless given. */
  volumeL?: number;
  /** When `batch` went in: now unless given. */
  filledAt?: Date;
}

/**
 * `name`, or `name` with a random tag when the cellar already has a vessel called that
 * (letter case aside): vessel names are unique in a cellar, and factories called twice for
 * one cellar must not clash.
 */
export async function unusedVesselName(db: DataSource | EntityManager, cellarId: string, name: string): Promise<string> {
  const [taken] = await db.query(`SELECT 1 FROM vessels WHERE cellar_id = $1 AND lower(name) = lower($2)`, [cellarId, name]);
  return taken ? `${name} ${randomLabelCode()}` : name;
}

/**
 * A vessel, empty unless it holds `seed.batch`; dirty unless told otherwise, and a sanitised
 * one sanitised now unless told when. A name the cellar already uses gets a random tag.
 * @param db - the data source, or the transaction that also writes the batch
 */
export async function makeVessel(db: DataSource | EntityManager, cellarId: string, seed: VesselSeed = {}): Promise<Vessel> {
  const repo = db.getRepository(Vessel);
  const cleaningState = seed.cleaningState ?? 'dirty';
  const capacityL = seed.capacityL ?? 23;
  const holding = seed.batch ?? null;
  return repo.save(
    repo.create({
      cellarId,
      code: seed.code ?? randomLabelCode(),
      name: await unusedVesselName(db, cellarId, seed.name ?? `Carboy ${randomLabelCode()}`),
      kind: seed.kind ?? 'carboy',
      material: seed.material ?? 'glass',
      capacityL,
      cleaningState,
      sanitisedAt: seed.sanitisedAt !== undefined ? seed.sanitisedAt : cleaningState === 'sanitised' ? new Date() : null,
      retiredAt: seed.retiredAt ?? null,
      batchId: holding?.id ?? null,
      volumeL: holding ? (seed.volumeL ?? capacityL * 0.9) : null,
      filledAt: holding ? (seed.filledAt ?? new Date()) : null,
    }),
  );
}

/** An empty sanitised vessel (override with seed), named uniquely. */
export function sanitisedVessel(ds: DataSource, cellarId: string, seed: VesselSeed = {}): Promise<Vessel> {
  return makeVessel(ds, cellarId, { cleaningState: 'sanitised', name: `Vessel ${crypto.randomBytes(3).toString('hex')}`, ...seed });
}

/** Moves a vessel's sanitising back in time, as a direct UPDATE would find it days later. */
export async function sanitisedDaysAgo(ds: DataSource, vesselId: string, days: number): Promise<void> {
  await ds.query(`UPDATE vessels SET sanitised_at = now() - $2 * interval '1 day' WHERE id = $1`, [vesselId, days]);
}

/** Puts a batch into a vessel, as a start or racking would (bumping its version). */
export async function fillVessel(ds: DataSource, vesselId: string, batchId: string, volumeL: number): Promise<void> {
  await ds.query(`UPDATE vessels SET batch_id = $2, volume_l = $3, filled_at = now(), version = version + 1, updated_at = now() WHERE id = $1`, [
    vesselId,
    batchId,
    volumeL,
  ]);
}

/** Reads a vessel row as the database has it now. */
export async function vesselRow(ds: DataSource, vesselId: string) {
  const [row] = await ds.query(
    `SELECT batch_id, volume_l::float8 AS volume_l, filled_at, cleaning_state, sanitised_at, version FROM vessels WHERE id = $1`,
    [vesselId],
  );
  return row as {
    batch_id: string | null;
    volume_l: number | null;
    filled_at: Date | null;
    cleaning_state: string;
    sanitised_at: Date | null;
    version: number;
  };
}
