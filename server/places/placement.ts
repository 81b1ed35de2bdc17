import { QueryFailedError, type EntityManager } from 'typeorm';
import type { SlotRef } from '../../shared/schemas/vessels';
import { Placement } from '../entities/placement.entity';
import { Shelf } from '../entities/shelf.entity';
import { BadRequestError, ConflictError, NotFoundError } from '../http/errors';

export type Thing = { vesselId: string } | { caseId: string };

/**
 * Puts a vessel or a case into a slot (or takes it off its shelf when `to` is null).
 * The slot must exist in this cellar and be free; the table's unique constraints back this
 * check up if two people race for the same slot.
 */
export async function placeThing(tx: EntityManager, cellarId: string, thing: Thing, to: { shelfId: string; slot: number } | null): Promise<void> {
  const repo = tx.getRepository(Placement);
  const where = 'vesselId' in thing ? { vesselId: thing.vesselId } : { caseId: thing.caseId };
  await repo.delete(where);
  if (!to) return;
  const shelf = await tx
    .getRepository(Shelf)
    .createQueryBuilder('s')
    .innerJoinAndSelect('s.rack', 'r')
    .where('s.id = :id AND r.cellar_id = :cellarId', { id: to.shelfId, cellarId })
    .getOne();
  if (!shelf) throw new NotFoundError('No such shelf in this cellar.');
  if (to.slot > shelf.slotCount) {
    throw new BadRequestError(`Shelf ${shelf.number} of ${shelf.rack.name} has ${shelf.slotCount} slots; there is no slot ${to.slot}.`);
  }
  const slotTaken = () => new ConflictError(`Slot ${to.slot} on shelf ${shelf.number} of ${shelf.rack.name} is already taken.`);
  if (await repo.existsBy({ shelfId: to.shelfId, slot: to.slot })) throw slotTaken();
  try {
    await repo.insert({ cellarId, shelfId: to.shelfId, slot: to.slot, vesselId: null, caseId: null, ...thing });
  } catch (err) {
    // Someone else took the slot (or moved the thing) between the check and the insert.
    const constraint = err instanceof QueryFailedError ? (err.driverError as { constraint?: string }).constraint : undefined;
    if (constraint === 'uq_placements_slot') throw slotTaken();
    if (constraint === 'uq_placements_vessel' || constraint === 'uq_placements_case') {
      throw new ConflictError('It was just moved by someone else. Reload and try again.');
    }
    throw err;
  }
}

/** Where things are, for many vessels or cases at once (one query). */
export async function placesOf(tx: EntityManager, kind: 'vessel' | 'case', ids: string[]): Promise<Map<string, SlotRef>> {
  if (ids.length === 0) return new Map();
  const column = kind === 'vessel' ? 'vessel_id' : 'case_id';
  const rows: { thing_id: string; rack_id: string; rack_name: string; shelf_id: string; shelf_number: number; slot: number }[] = await tx.query(
    `SELECT p.${column} AS thing_id, r.id AS rack_id, r.name AS rack_name, s.id AS shelf_id, s.number AS shelf_number, p.slot
       FROM placements p JOIN shelves s ON s.id = p.shelf_id JOIN racks r ON r.id = s.rack_id
      WHERE p.${column} = ANY($1)`,
    [ids],
  );
  return new Map(
    rows.map((r) => [r.thing_id, { rackId: r.rack_id, rackName: r.rack_name, shelfId: r.shelf_id, shelfNumber: r.shelf_number, slot: r.slot }]),
  );
}
