import type { DataSource, EntityManager } from 'typeorm';
import type { ShelfCheck, ShelfContents, ShelfDirectory } from '../../shared/schemas/labels';
import type { BottleCard, ScanResult } from '../../shared/schemas/scan';
import { labelCodeSchema } from '../../shared/schemas/vessels';
import { NotFoundError } from '../errors';
import { currentAbv } from '../labels/content';
import type { CellarContext } from './cellar.service';

/** Where unknown codes and other cellars' codes lead: the same page for both. */
export const NO_SUCH_LABEL = '/no-such-label';

interface CodeTarget {
  kind: 'vessel' | 'case' | 'lot';
  id: string;
  cellarId: string;
  lotId: string | null;
  publicCards: boolean;
}

/** The vessel, case or lot a (normalised) code belongs to, whatever the cellar; null if none. */
async function findCode(ds: DataSource, code: string): Promise<CodeTarget | null> {
  const [row] = await ds.query(
    `SELECT t.kind, t.id, t.cellar_id AS "cellarId", t.lot_id AS "lotId", c.public_bottle_cards AS "publicCards"
       FROM (SELECT 'vessel' AS kind, id, cellar_id, NULL::uuid AS lot_id FROM vessels WHERE code = $1
             UNION ALL SELECT 'lot', id, cellar_id, id FROM bottle_lots WHERE code = $1
             UNION ALL SELECT 'case', id, cellar_id, lot_id FROM bottle_cases WHERE code = $1) t
       JOIN cellars c ON c.id = t.cellar_id
      LIMIT 1`,
    [code],
  );
  return row ?? null;
}

async function isMember(ds: DataSource, userId: string, cellarId: string): Promise<boolean> {
  const [row] = await ds.query(`SELECT 1 FROM memberships WHERE user_id = $1 AND cellar_id = $2`, [userId, cellarId]);
  return Boolean(row);
}

/** The client route that shows a thing: a vessel's page, or the Bottles page on its lot. */
function clientPath(t: CodeTarget): string {
  return t.kind === 'vessel' ? `/c/${t.cellarId}/vessels/${t.id}` : `/c/${t.cellarId}/bottles?lot=${t.lotId}`;
}

/**
 * Where a printed label URL (/s/:code) sends this visitor. Members go to the record; a
 * signed-out visitor signs in first; anyone else learns only that there is no such label
 * here — unless the cellar shows public bottle cards and the code is a case or lot.
 * @param userId - the signed-in user, undefined when signed out
 */
export async function scanDestination(ds: DataSource, userId: string | undefined, rawCode: string): Promise<string> {
  const parsed = labelCodeSchema.safeParse(rawCode);
  if (!parsed.success) return userId ? NO_SUCH_LABEL : `/sign-in?next=/s/${encodeURIComponent(rawCode.slice(0, 16))}`;
  const code = parsed.data;
  const target = await findCode(ds, code);
  const card = target !== null && target.kind !== 'vessel' && target.publicCards;
  if (!userId) return card ? `/card/${code}` : `/sign-in?next=/s/${code}`;
  if (target && (await isMember(ds, userId, target.cellarId))) return clientPath(target);
  return card ? `/card/${code}` : NO_SUCH_LABEL;
}

/**
 * A code as the Scan page resolves it, for a signed-in member of its cellar.
 * @throws NotFoundError for unknown codes and codes of other cellars alike
 */
export async function resolveCode(ds: DataSource, userId: string, code: string): Promise<ScanResult> {
  const target = await findCode(ds, code);
  if (!target || !(await isMember(ds, userId, target.cellarId))) throw new NotFoundError('No such label here.');
  return { kind: target.kind, id: target.id, cellarId: target.cellarId, url: clientPath(target) };
}

/**
 * The public bottle card of a case or lot code, only while its cellar shows public cards.
 * Exactly the card's fields, nothing else of the cellar.
 * @throws NotFoundError otherwise (vessel codes, unknown codes, cards off)
 */
export async function bottleCard(ds: DataSource, code: string): Promise<BottleCard> {
  const [row] = await ds.query(
    `SELECT b.name AS "batchName", b.kind, l.bottled_on::text AS "bottledOn", l.abv_estimate::float8 AS "lotAbv",
            b.og::float8 AS og, b.last_reading_sg::float8 AS "lastSg", l.sulfite_added AS "sulfiteAdded", l.note
       FROM bottle_lots l JOIN batches b ON b.id = l.batch_id JOIN cellars c ON c.id = l.cellar_id
      WHERE c.public_bottle_cards
        AND (l.code = $1 OR l.id = (SELECT lot_id FROM bottle_cases WHERE code = $1))`,
    [code],
  );
  if (!row) throw new NotFoundError('No such bottle card.');
  return {
    batchName: row.batchName,
    kind: row.kind,
    bottledOn: row.bottledOn,
    abvEstimate: row.lotAbv ?? currentAbv(row.og, row.lastSg),
    sulfiteAdded: row.sulfiteAdded,
    note: row.note,
  };
}

/** The cellar's racks with their shelves and how many slots are taken, for pickers. */
export async function shelfDirectory(ds: DataSource, ctx: CellarContext): Promise<ShelfDirectory> {
  return ds.query(
    `SELECT r.id, r.name,
            COALESCE(json_agg(json_build_object('id', s.id, 'number', s.number, 'slotCount', s.slot_count,
                       'used', (SELECT count(*)::int FROM placements p WHERE p.shelf_id = s.id)) ORDER BY s.number)
                     FILTER (WHERE s.id IS NOT NULL), '[]') AS shelves
       FROM racks r LEFT JOIN shelves s ON s.rack_id = r.id
      WHERE r.cellar_id = $1
      GROUP BY r.id, r.name ORDER BY lower(r.name), r.id`,
    [ctx.cellarId],
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

/** This cellar's vessels and cases that sit on a shelf or carry one of the codes, one query. */
async function thingsOnShelfOrCoded(tx: EntityManager, cellarId: string, shelfId: string, codes: string[]): Promise<ThingRow[]> {
  return tx.query(
    `SELECT 'vessel' AS kind, v.id, v.code, v.name AS label, v.version, ${PLACE_COLUMNS}
       FROM vessels v LEFT JOIN placements p ON p.vessel_id = v.id ${PLACE_JOINS}
      WHERE v.cellar_id = $1 AND (p.shelf_id = $2 OR v.code = ANY($3::text[]))
     UNION ALL
     SELECT 'case', c.id, c.code, b.name || ' · case ' || c.number, c.version, ${PLACE_COLUMNS}
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
export async function shelfContents(ds: DataSource, ctx: CellarContext, shelfId: string): Promise<ShelfContents> {
  return ds.transaction('REPEATABLE READ', async (tx) => {
    const shelf = await shelfInfo(tx, ctx.cellarId, shelfId);
    const rows = await thingsOnShelfOrCoded(tx, ctx.cellarId, shelfId, []);
    return { shelf, items: rows.map((r) => ({ ...thing(r), slot: r.slot! })).sort(bySlot) };
  });
}

/**
 * Compares the codes scanned on a shelf with the record: present, missing, found here but
 * recorded elsewhere (or nowhere), and codes that are not a vessel or case of this cellar.
 */
export async function checkShelf(ds: DataSource, ctx: CellarContext, shelfId: string, codes: string[]): Promise<ShelfCheck> {
  return ds.transaction('REPEATABLE READ', async (tx) => {
    const shelf = await shelfInfo(tx, ctx.cellarId, shelfId);
    const scanned = [...new Set(codes)];
    const rows = await thingsOnShelfOrCoded(tx, ctx.cellarId, shelfId, scanned);
    const byCode = new Map(rows.map((r) => [r.code, r]));
    const expected = rows.filter((r) => r.shelfId === shelfId).map((r) => ({ ...thing(r), slot: r.slot! })).sort(bySlot);
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
          recordedAt: r.shelfId ? `${r.rackName} · shelf ${r.shelfNumber} · slot ${r.slot}` : null,
        })),
      unknown: scanned.filter((c) => !byCode.has(c)),
      freeSlots: Array.from({ length: shelf.slotCount }, (_, i) => i + 1).filter((s) => !taken.has(s)),
    };
  });
}
