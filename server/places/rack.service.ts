import { QueryFailedError, type EntityManager } from 'typeorm';
import { vesselState } from '../../shared/domain/vessel-state';
import type { Rack as RackDto, Shelf as ShelfDto } from '../../shared/schemas/places';
import type { CleaningState } from '../../shared/schemas/vessels';
import { requireRole, type Actor } from '../core/actor';
import { ConflictError, NotFoundError } from '../http/errors';

const NO_SUCH_RACK = 'No such rack in this cellar.';

interface ShelfRow {
  rackId: string;
  rackName: string;
  description: string;
  shelfId: string | null;
  number: number | null;
  slotCount: number | null;
}

interface OccupantRow {
  shelfId: string;
  slot: number;
  vesselId: string | null;
  caseId: string | null;
  vesselName: string | null;
  batchId: string | null;
  retiredAt: Date | null;
  cleaningState: CleaningState | null;
  sanitisedAt: Date | null;
  sanitisedValidDays: number;
  caseNumber: number | null;
  bottlesLeft: number | null;
  caseBatchName: string | null;
}

function occupantOf(row: OccupantRow, now: Date): ShelfDto['occupants'][number] {
  if (row.vesselId) {
    const state = vesselState(
      { batchId: row.batchId, retiredAt: row.retiredAt, cleaningState: row.cleaningState!, sanitisedAt: row.sanitisedAt },
      row.sanitisedValidDays,
      now,
    );
    return { slot: row.slot, vesselId: row.vesselId, caseId: null, label: row.vesselName!, state, caseNumber: null, batchName: null };
  }
  const bottles = row.bottlesLeft ?? 0;
  return {
    slot: row.slot,
    vesselId: null,
    caseId: row.caseId,
    label: `Case ${row.caseNumber} of ${row.caseBatchName}`,
    state: `${bottles} ${bottles === 1 ? 'bottle' : 'bottles'}`,
    caseNumber: row.caseNumber,
    batchName: row.caseBatchName,
  };
}

/**
 * A cellar's racks (or one of them) with their shelves top first and what sits in each slot:
 * two queries however many racks, shelves and things there are.
 */
async function findRacks(tx: EntityManager, cellarId: string, rackId?: string): Promise<RackDto[]> {
  const params: unknown[] = rackId ? [cellarId, rackId] : [cellarId];
  const onlyRack = rackId ? 'AND r.id = $2' : '';
  const shelves: ShelfRow[] = await tx.query(
    `SELECT r.id AS "rackId", r.name AS "rackName", r.description, s.id AS "shelfId", s.number, s.slot_count AS "slotCount"
       FROM racks r LEFT JOIN shelves s ON s.rack_id = r.id
      WHERE r.cellar_id = $1 ${onlyRack}
      ORDER BY lower(r.name), r.name, r.id, s.number`,
    params,
  );
  const occupants: OccupantRow[] = await tx.query(
    `SELECT p.shelf_id AS "shelfId", p.slot, p.vessel_id AS "vesselId", p.case_id AS "caseId",
            v.name AS "vesselName", v.batch_id AS "batchId", v.retired_at AS "retiredAt",
            v.cleaning_state AS "cleaningState", v.sanitised_at AS "sanitisedAt", c.sanitised_valid_days AS "sanitisedValidDays",
            bc.number AS "caseNumber", bc.bottles_left AS "bottlesLeft", b.name AS "caseBatchName"
       FROM placements p
       JOIN shelves s ON s.id = p.shelf_id
       JOIN racks r ON r.id = s.rack_id
       JOIN cellars c ON c.id = r.cellar_id
       LEFT JOIN vessels v ON v.id = p.vessel_id
       LEFT JOIN bottle_cases bc ON bc.id = p.case_id
       LEFT JOIN bottle_lots l ON l.id = bc.lot_id
       LEFT JOIN batches b ON b.id = l.batch_id
      WHERE r.cellar_id = $1 ${onlyRack}
      ORDER BY p.slot`,
    params,
  );
  const now = new Date();
  const byShelf = new Map<string, ShelfDto['occupants']>();
  for (const row of occupants) {
    const list = byShelf.get(row.shelfId) ?? [];
    list.push(occupantOf(row, now));
    byShelf.set(row.shelfId, list);
  }
  const racks = new Map<string, RackDto>();
  for (const row of shelves) {
    let rack = racks.get(row.rackId);
    if (!rack) {
      rack = { id: row.rackId, name: row.rackName, description: row.description, shelves: [] };
      racks.set(row.rackId, rack);
    }
    if (row.shelfId) {
      rack.shelves.push({ id: row.shelfId, number: row.number!, slotCount: row.slotCount!, occupants: byShelf.get(row.shelfId) ?? [] });
    }
  }
  return [...racks.values()];
}

/** Every rack of the cellar with its shelves and what sits in each slot (the cellar map). */
export async function listRacks(actor: Actor, tx: EntityManager): Promise<RackDto[]> {
  requireRole(actor, 'guest');
  return findRacks(tx, actor.cellarId);
}

async function oneRack(tx: EntityManager, cellarId: string, rackId: string): Promise<RackDto> {
  const [rack] = await findRacks(tx, cellarId, rackId);
  if (!rack) throw new NotFoundError(NO_SUCH_RACK);
  return rack;
}

/** The unique constraint on (cellar, name) is the guard; this gives its 409 a plain message. */
function duplicateName(err: unknown, name: string | undefined): unknown {
  if (err instanceof QueryFailedError && (err.driverError as { constraint?: string }).constraint === 'uq_racks_cellar_name') {
    return new ConflictError(`This cellar already has a rack called "${name}". Choose another name.`);
  }
  return err;
}

/**
 * A new rack with its shelves numbered from the top (1) down.
 * @param input.shelves - slots on each shelf, top shelf first
 */
export async function createRack(actor: Actor, tx: EntityManager, input: { name: string; description: string; shelves: number[] }): Promise<RackDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  let rackId: string;
  try {
    [{ id: rackId }] = await tx.query(`INSERT INTO racks (cellar_id, name, description) VALUES ($1, $2, $3) RETURNING id`, [
      cellarId,
      input.name,
      input.description,
    ]);
  } catch (err) {
    throw duplicateName(err, input.name);
  }
  await tx.query(
    `INSERT INTO shelves (rack_id, number, slot_count)
     SELECT $1, n, slots FROM unnest($2::int[]) WITH ORDINALITY AS t(slots, n)`,
    [rackId, input.shelves],
  );
  return oneRack(tx, cellarId, rackId);
}

/** Renames or re-describes a rack. */
export async function updateRack(actor: Actor, tx: EntityManager, rackId: string, input: { name?: string; description?: string }): Promise<RackDto> {
  requireRole(actor, 'hand');
  const { cellarId } = actor;
  let updated: unknown[];
  try {
    [updated] = await tx.query(
      `UPDATE racks SET name = COALESCE($3, name), description = COALESCE($4, description)
        WHERE id = $1 AND cellar_id = $2 RETURNING id`,
      [rackId, cellarId, input.name ?? null, input.description ?? null],
    );
  } catch (err) {
    throw duplicateName(err, input.name);
  }
  if (updated.length === 0) throw new NotFoundError(NO_SUCH_RACK);
  return oneRack(tx, cellarId, rackId);
}

/**
 * Deletes an empty rack with its shelves. Its shelves are locked first, so nothing can be put
 * on them between the check and the delete (a placement's foreign key waits for that lock).
 */
export async function deleteRack(actor: Actor, tx: EntityManager, rackId: string): Promise<void> {
  requireRole(actor, 'keeper');
  const { cellarId } = actor;
  const [rack]: { name: string }[] = await tx.query(`SELECT name FROM racks WHERE id = $1 AND cellar_id = $2 FOR UPDATE`, [rackId, cellarId]);
  if (!rack) throw new NotFoundError(NO_SUCH_RACK);
  await tx.query(`SELECT id FROM shelves WHERE rack_id = $1 FOR UPDATE`, [rackId]);
  const [{ count }]: { count: number }[] = await tx.query(
    `SELECT count(*)::int AS count FROM placements p JOIN shelves s ON s.id = p.shelf_id WHERE s.rack_id = $1`,
    [rackId],
  );
  if (count > 0) {
    throw new ConflictError(`${rack.name} still holds ${count} ${count === 1 ? 'thing' : 'things'}. Move them off it first.`);
  }
  await tx.query(`DELETE FROM racks WHERE id = $1`, [rackId]);
}
