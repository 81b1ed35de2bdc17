import { vi } from 'vitest';
import type { DataSource } from 'typeorm';
import type { CleaningState, VesselKind } from '../../shared/schemas/vessels';
import { Vessel } from '../../server/entities/vessel.entity';
import { randomLabelCode } from '../../server/services/label-codes';

/**
 * Test data written straight into the database, for states the vessels API alone cannot reach
 * (a vessel holding a batch, a case on a shelf, a journal with readings).
 */

export interface VesselSeed {
  name?: string;
  kind?: VesselKind;
  material?: string;
  capacityL?: number;
  cleaningState?: CleaningState;
  sanitisedAt?: Date | null;
  retiredAt?: Date | null;
}

/** An empty vessel; sanitised ones are sanitised now unless told otherwise. */
export async function makeVessel(ds: DataSource, cellarId: string, seed: VesselSeed = {}): Promise<Vessel> {
  const repo = ds.getRepository(Vessel);
  const cleaningState = seed.cleaningState ?? 'dirty';
  return repo.save(
    repo.create({
      cellarId,
      code: randomLabelCode(),
      name: seed.name ?? `Carboy ${randomLabelCode()}`,
      kind: seed.kind ?? 'carboy',
      material: seed.material ?? 'glass',
      capacityL: seed.capacityL ?? 23,
      cleaningState,
      sanitisedAt: seed.sanitisedAt !== undefined ? seed.sanitisedAt : cleaningState === 'sanitised' ? new Date() : null,
      retiredAt: seed.retiredAt ?? null,
    }),
  );
}

/** Moves a vessel's sanitising back in time, as a direct UPDATE would find it days later. */
export async function sanitisedDaysAgo(ds: DataSource, vesselId: string, days: number): Promise<void> {
  await ds.query(`UPDATE vessels SET sanitised_at = now() - $2 * interval '1 day' WHERE id = $1`, [vesselId, days]);
}

/** A batch, minimal but valid. */
export async function makeBatch(
  ds: DataSource,
  cellarId: string,
  seed: { name?: string; kind?: string; startedOn?: string } = {},
): Promise<{ id: string; name: string; kind: string; startedOn: string }> {
  const name = seed.name ?? `Batch ${randomLabelCode()}`;
  const kind = seed.kind ?? 'melomel';
  const startedOn = seed.startedOn ?? '2026-01-10';
  const [{ id }] = await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on)
     VALUES ($1, $2, $3, 'Test yeast', 14, 20, $4) RETURNING id`,
    [cellarId, name, kind, startedOn],
  );
  return { id, name, kind, startedOn };
}

/** Puts a batch into a vessel, as a start or racking would (bumping its version). */
export async function fillVessel(ds: DataSource, vesselId: string, batchId: string, volumeL: number): Promise<void> {
  await ds.query(
    `UPDATE vessels SET batch_id = $2, volume_l = $3, filled_at = now(), version = version + 1, updated_at = now() WHERE id = $1`,
    [vesselId, batchId, volumeL],
  );
}

/** A rack with shelves of the given slot counts, top shelf first; returns shelf ids by number. */
export async function makeRack(
  ds: DataSource,
  cellarId: string,
  name: string,
  shelves: number[] = [4],
): Promise<{ id: string; name: string; shelfIds: string[] }> {
  const [{ id }] = await ds.query(`INSERT INTO racks (cellar_id, name) VALUES ($1, $2) RETURNING id`, [cellarId, name]);
  const shelfIds: string[] = [];
  for (const [i, slots] of shelves.entries()) {
    const [shelf] = await ds.query(`INSERT INTO shelves (rack_id, number, slot_count) VALUES ($1, $2, $3) RETURNING id`, [id, i + 1, slots]);
    shelfIds.push(shelf.id);
  }
  return { id, name, shelfIds };
}

/** A placement written directly (no checks but the table's own). */
export async function placeDirectly(
  ds: DataSource,
  cellarId: string,
  shelfId: string,
  slot: number,
  thing: { vesselId: string } | { caseId: string },
): Promise<void> {
  await ds.query(`INSERT INTO placements (cellar_id, shelf_id, slot, vessel_id, case_id) VALUES ($1, $2, $3, $4, $5)`, [
    cellarId,
    shelfId,
    slot,
    'vesselId' in thing ? thing.vesselId : null,
    'caseId' in thing ? thing.caseId : null,
  ]);
}

/** A bottle lot of a batch with one case of it. */
export async function makeCase(
  ds: DataSource,
  cellarId: string,
  batchId: string,
  seed: { number?: number; bottlesInitial?: number; bottlesLeft?: number } = {},
): Promise<{ id: string; lotId: string }> {
  const [lot] = await ds.query(
    `INSERT INTO bottle_lots (cellar_id, batch_id, code, bottled_on, bottle_ml, bottle_count, closure, carbonation, sulfite_added)
     VALUES ($1, $2, $3, '2026-03-01', 750, 24, 'cork', 'still', false) RETURNING id`,
    [cellarId, batchId, randomLabelCode()],
  );
  const initial = seed.bottlesInitial ?? 12;
  const [box] = await ds.query(
    `INSERT INTO bottle_cases (cellar_id, lot_id, code, number, bottles_initial, bottles_left) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [cellarId, lot.id, randomLabelCode(), seed.number ?? 1, initial, seed.bottlesLeft ?? initial],
  );
  return { id: box.id, lotId: lot.id };
}

/** One journal entry, written as the journal writer would store it. */
export async function addJournalEntry(
  ds: DataSource,
  cellarId: string,
  batchId: string,
  payload: Record<string, unknown> & { kind: string },
  options: { occurredAt?: Date; amendsEntryId?: string } = {},
): Promise<string> {
  const [{ id }] = await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, amends_entry_id)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [cellarId, batchId, payload.kind, JSON.stringify(payload), options.occurredAt ?? new Date(), options.amendsEntryId ?? null],
  );
  return id;
}

/** A reading payload with the fields the journal keeps. */
export function reading(sg: number, vesselId: string | null, correctedSg = sg) {
  return { kind: 'reading', sg, temperatureC: null, calibrationC: 20, correctedSg, ph: null, vesselId };
}

/**
 * How many SQL statements TypeORM sends while `fn` runs (sessions aside, which use the pool directly).
 * Used to show that a list costs a fixed number of queries, not one more per row.
 */
export async function countQueries(ds: DataSource, fn: () => Promise<unknown>): Promise<number> {
  const spy = vi.spyOn(ds.logger, 'logQuery');
  try {
    await fn();
    return spy.mock.calls.length;
  } finally {
    spy.mockRestore();
  }
}
