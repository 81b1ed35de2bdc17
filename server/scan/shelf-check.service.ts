import type { EntityManager } from 'typeorm';
import type { ShelfCheck, ShelfContents, ShelfDirectory } from '../../shared/schemas/labels';
import { requireRole, type Actor } from '../core/actor';
import { NotFoundError } from '../http/errors';

/** The cellar's racks with their shelves and how many slots are taken, for pickers. */
export async function shelfDirectory(actor: Actor, tx: EntityManager): Promise<ShelfDirectory> {
  requireRole(actor, 'guest');
  return tx.query(
    `SELECT r.id, r.name,
            COALESCE(json_agg(json_build_object('id', s.id, 'number', s.number, 'slotCount', s.slot_count,
                       'used', (SELECT count(*)::int FROM placements p WHERE p.shelf_id = s.id)) ORDER BY s.number)
                     FILTER (WHERE s.id IS NOT NULL), '[]') AS shelves
       FROM racks r LEFT JOIN shelves s ON s.rack_id = r.id
      WHERE r.cellar_id = $1
      GROUP BY r.id, r.name ORDER BY lower(r.name), r.id`,
    [actor.cellarId],
  );
}

interface ThingRow {
  kind: 'vessel' | 'case';
  id: string;
  code: string;
  label: string;
  version: number;
  shelfId: string | null;
  slot: number | null;
  rackName: string | null;
  shelfNumber: number | null;
}

const PLACE_JOINS = `LEFT JOIN shelves s ON s.id = p.shelf_id LEFT JOIN racks r ON r.id = s.rack_id`;
const PLACE_COLUMNS = `p.shelf_id AS "shelfId", p.slot, r.name AS "rackName", s.number AS "shelfNumber"`;

/**
 * This cellar's vessels and cases that sit on a shelf or carry one of the codes, one query. A case is
 * worded "Quince Cyser · case 1" with a no-break space before the dot, as every screen joins facts.
 */
async function thingsOnShelfOrCoded(tx: EntityManager, cellarId: string, shelfId: string, codes: string[]): Promise<ThingRow[]> {
  return tx.query(
    `SELECT 'vessel' AS kind, v.id, v.code, v.name AS label, v.version, ${PLACE_COLUMNS}
       FROM vessels v LEFT JOIN placements p ON p.vessel_id = v.id ${PLACE_JOINS}
      WHERE v.cellar_id = $1 AND (p.shelf_id = $2 OR v.code = ANY($3::text[]))
     UNION ALL
     SELECT 'case', c.id, c.code, b.name || chr(160) || '· case ' || c.number, c.version, ${PLACE_COLUMNS}
       FROM bottle_cases c JOIN bottle_lots l ON l.id = c.lot_id JOIN batches b ON b.id = l.batch_id
       LEFT JOIN placements p ON p.case_id = c.id ${PLACE_JOINS}
      WHERE c.cellar_id = $1 AND (p.shelf_id = $2 OR c.code = ANY($3::text[]))`,
    [cellarId, shelfId, codes],
  );
}

async function shelfInfo(tx: EntityManager, cellarId: string, shelfId: string): Promise<ShelfContents['shelf']> {
  const [shelf] = await tx.query(
    `SELECT s.id, s.number, s.slot_count AS "slotCount", r.id AS "rackId", r.name AS "rackName"
       FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE s.id = $2 AND r.cellar_id = $1`,
    [cellarId, shelfId],
  );
  if (!shelf) throw new NotFoundError('No such shelf in this cellar.');
  return shelf;
}

const thing = (r: ThingRow) => ({ kind: r.kind, id: r.id, code: r.code, label: r.label });
const bySlot = (a: { slot: number }, b: { slot: number }) => a.slot - b.slot;

/** What the record says is on a shelf, slot by slot, with the code on each label. */
export async function shelfContents(actor: Actor, tx: EntityManager, shelfId: string): Promise<ShelfContents> {
  requireRole(actor, 'guest');
  const shelf = await shelfInfo(tx, actor.cellarId, shelfId);
  const rows = await thingsOnShelfOrCoded(tx, actor.cellarId, shelfId, []);
  return { shelf, items: rows.map((r) => ({ ...thing(r), slot: r.slot! })).sort(bySlot) };
}

/**
 * Compares the codes scanned on a shelf with the record: present, missing, found here but
 * recorded elsewhere (or nowhere), and codes that are not a vessel or case of this cellar.
 */
export async function checkShelf(actor: Actor, tx: EntityManager, shelfId: string, codes: string[]): Promise<ShelfCheck> {
  requireRole(actor, 'guest');
  const shelf = await shelfInfo(tx, actor.cellarId, shelfId);
  const scanned = [...new Set(codes)];
  const rows = await thingsOnShelfOrCoded(tx, actor.cellarId, shelfId, scanned);
  const byCode = new Map(rows.map((r) => [r.code, r]));
  const expected = rows
    .filter((r) => r.shelfId === shelfId)
    .map((r) => ({ ...thing(r), slot: r.slot! }))
    .sort(bySlot);
  const seen = new Set(scanned);
  const taken = new Set(expected.map((e) => e.slot));
  return {
    shelf,
    present: expected.filter((e) => seen.has(e.code)),
    missing: expected.filter((e) => !seen.has(e.code)),
    misplaced: scanned
      .map((c) => byCode.get(c))
      .filter((r): r is ThingRow => r !== undefined && r.shelfId !== shelfId)
      .map((r) => ({
        ...thing(r),
        version: r.version,
        recordedAt: r.shelfId ? { rackName: r.rackName!, shelfNumber: r.shelfNumber!, slot: r.slot! } : null,
      })),
    unknown: scanned.filter((c) => !byCode.has(c)),
    freeSlots: Array.from({ length: shelf.slotCount }, (_, i) => i + 1).filter((s) => !taken.has(s)),
  };
}
