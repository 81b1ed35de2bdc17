import type { DataSource } from 'typeorm';
import { Rack } from '../../server/entities/rack.entity';
import { Shelf } from '../../server/entities/shelf.entity';
import { randomLabelCode } from '../../server/labels/label-codes';

/** Racks, shelves and what sits in their slots, written straight into the database. Invented data only. */

export interface RackWithShelves {
  id: string;
  name: string;
  /** Top shelf first (number 1). */
  shelves: Shelf[];
  /** The shelves' ids, top shelf first. */
  shelfIds: string[];
}

/**
 * A rack with shelves of the given slot counts, top shelf first.
 * @param slots - slots per shelf (one shelf of 4 unless given)
 */
export async function makeRack(ds: DataSource, cellarId: string, name: string, slots: number[] = [4]): Promise<RackWithShelves> {
  const rack = await ds.getRepository(Rack).save(ds.getRepository(Rack).create({ cellarId, name, description: '' }));
  const shelfRepo = ds.getRepository(Shelf);
  const shelves = await shelfRepo.save(slots.map((slotCount, i) => shelfRepo.create({ rackId: rack.id, number: i + 1, slotCount })));
  return { id: rack.id, name: rack.name, shelves, shelfIds: shelves.map((s) => s.id) };
}

/** The one shelf, of `slots` slots, of a new rack. */
export async function makeShelf(ds: DataSource, cellarId: string, slots = 4, rackName = `Test rack ${randomLabelCode()}`): Promise<Shelf> {
  const { shelves } = await makeRack(ds, cellarId, rackName, [slots]);
  return shelves[0]!;
}

/** Records a vessel or case in a slot, directly (no checks but the table's own). */
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
