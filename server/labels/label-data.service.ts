import type { EntityManager } from 'typeorm';
import type { LabelChoices, LabelSelection } from '../../shared/schemas/labels';
import { requireRole, type Actor } from '../core/actor';
import { localDate } from '../core/local-date';
import { BadRequestError, NotFoundError } from '../http/errors';
import { caseLabel, currentAbv, lotLabel, vesselLabel, type BottleLabelRow, type VesselLabelRow } from './content';
import type { LabelItem } from './types';

const VESSEL_ROWS = `
  SELECT v.id, v.code, v.name, v.kind AS "vesselKind", v.capacity_l::float8 AS "capacityL",
         b.name AS "batchName", b.kind AS "batchKind", b.started_on::text AS "startedOn",
         b.og::float8 AS og, b.last_reading_sg::float8 AS "lastSg", c.unit_system AS "unitSystem", c.time_zone AS "timeZone"
    FROM vessels v JOIN cellars c ON c.id = v.cellar_id LEFT JOIN batches b ON b.id = v.batch_id
   WHERE v.cellar_id = $1`;

const LOT_COLUMNS = `
  b.name AS "batchName", b.kind AS "batchKind", l.bottled_on::text AS "bottledOn", l.bottle_ml AS "bottleMl",
  l.bottle_count AS "bottleCount", l.carbonation, l.sulfite_added AS "sulfiteAdded",
  l.abv_estimate::float8 AS "lotAbv", b.og::float8 AS og, b.last_reading_sg::float8 AS "lastSg"`;

type BottleQueryRow = Omit<BottleLabelRow, 'abv'> & { lotAbv: number | null; og: number | null; lastSg: number | null };

/** The lot's own estimate when it has one, else one from the batch's gravities. */
const withAbv = <R extends BottleQueryRow>(r: R) => ({ ...r, abv: r.lotAbv ?? currentAbv(r.og, r.lastSg) });

async function vesselItems(tx: EntityManager, cellarId: string, ids: string[]): Promise<Map<string, LabelItem>> {
  if (!ids.length) return new Map();
  const rows: (VesselLabelRow & { timeZone: string })[] = await tx.query(`${VESSEL_ROWS} AND v.id = ANY($2::uuid[])`, [cellarId, ids]);
  const now = new Date();
  return new Map(rows.map((r) => [r.id, vesselLabel({ ...r, printedOn: localDate(now, r.timeZone) })]));
}

async function caseItems(tx: EntityManager, cellarId: string, ids: string[]): Promise<Map<string, LabelItem>> {
  if (!ids.length) return new Map();
  const rows: (BottleQueryRow & { number: number; bottlesInitial: number })[] = await tx.query(
    `SELECT bc.id, bc.code, bc.number, bc.bottles_initial AS "bottlesInitial", ${LOT_COLUMNS}
       FROM bottle_cases bc JOIN bottle_lots l ON l.id = bc.lot_id JOIN batches b ON b.id = l.batch_id
      WHERE bc.cellar_id = $1 AND bc.id = ANY($2::uuid[])`,
    [cellarId, ids],
  );
  return new Map(rows.map((r) => [r.id, caseLabel(withAbv(r))]));
}

async function lotItems(tx: EntityManager, cellarId: string, ids: string[]): Promise<Map<string, LabelItem>> {
  if (!ids.length) return new Map();
  const rows: (BottleQueryRow & { bottleCount: number })[] = await tx.query(
    `SELECT l.id, l.code, ${LOT_COLUMNS}
       FROM bottle_lots l JOIN batches b ON b.id = l.batch_id
      WHERE l.cellar_id = $1 AND l.id = ANY($2::uuid[])`,
    [cellarId, ids],
  );
  return new Map(rows.map((r) => [r.id, lotLabel(withAbv(r))]));
}

/** What sits on one shelf of this cellar, by slot (nothing when the shelf is not the cellar's). */
async function shelfOccupants(
  tx: EntityManager,
  cellarId: string,
  shelfId: string,
): Promise<{ slot: number; vesselId: string | null; caseId: string | null }[]> {
  return tx.query(
    `SELECT p.slot, p.vessel_id AS "vesselId", p.case_id AS "caseId"
       FROM placements p JOIN shelves s ON s.id = p.shelf_id JOIN racks r ON r.id = s.rack_id
      WHERE p.shelf_id = $2 AND r.cellar_id = $1
      ORDER BY p.slot`,
    [cellarId, shelfId],
  );
}

const isEmpty = (s: LabelSelection) => !s.vessels?.length && !s.cases?.length && !s.lots?.length && !s.shelf && !s.lotCases && !s.batch;

/**
 * The labels for a selection, in print order: vessels picked, a batch's vessels, lots,
 * cases picked, a lot's cases, then a shelf slot by slot. Ids of other cellars are
 * silently left out; each thing is printed once.
 * @throws BadRequestError when nothing was asked for; NotFoundError when nothing is left
 */
export async function labelItemsFor(actor: Actor, tx: EntityManager, selection: LabelSelection): Promise<LabelItem[]> {
  requireRole(actor, 'guest');
  if (isEmpty(selection)) {
    throw new BadRequestError("Choose what to print: vessels, cases, lots, a shelf, a lot's cases or a batch's vessels.");
  }
  const order: { kind: 'vessel' | 'case' | 'lot'; id: string }[] = [];
  const add = (kind: 'vessel' | 'case' | 'lot', ids: string[]) => ids.forEach((id) => order.push({ kind, id }));
  add('vessel', selection.vessels ?? []);
  if (selection.batch) {
    const rows: { id: string }[] = await tx.query(`SELECT id FROM vessels WHERE cellar_id = $1 AND batch_id = $2 ORDER BY lower(name), id`, [
      actor.cellarId,
      selection.batch,
    ]);
    add(
      'vessel',
      rows.map((r) => r.id),
    );
  }
  add('lot', selection.lots ?? []);
  add('case', selection.cases ?? []);
  if (selection.lotCases) {
    const rows: { id: string }[] = await tx.query(`SELECT id FROM bottle_cases WHERE cellar_id = $1 AND lot_id = $2 ORDER BY number`, [
      actor.cellarId,
      selection.lotCases,
    ]);
    add(
      'case',
      rows.map((r) => r.id),
    );
  }
  if (selection.shelf) {
    for (const o of await shelfOccupants(tx, actor.cellarId, selection.shelf)) {
      order.push(o.vesselId ? { kind: 'vessel', id: o.vesselId } : { kind: 'case', id: o.caseId! });
    }
  }
  const idsOf = (kind: string) => [...new Set(order.filter((o) => o.kind === kind).map((o) => o.id))];
  const found = {
    vessel: await vesselItems(tx, actor.cellarId, idsOf('vessel')),
    case: await caseItems(tx, actor.cellarId, idsOf('case')),
    lot: await lotItems(tx, actor.cellarId, idsOf('lot')),
  };
  const seen = new Set<string>();
  const items: LabelItem[] = [];
  for (const o of order) {
    const item = found[o.kind].get(o.id);
    if (!item || seen.has(`${o.kind}:${o.id}`)) continue;
    seen.add(`${o.kind}:${o.id}`);
    items.push(item);
  }
  if (!items.length) throw new NotFoundError('Nothing to print: none of those are in this cellar.');
  return items;
}

const like = (q: string) => `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * What the Labels page offers: vessels (by name, code or batch), bottle lots with their
 * cases, and batches with the vessels holding them — at most 100 of each.
 */
export async function labelChoices(actor: Actor, tx: EntityManager, q?: string): Promise<LabelChoices> {
  requireRole(actor, 'guest');
  const pattern = q ? like(q) : '%';
  const vessels = await tx.query(
    `SELECT v.id, v.code, v.name, b.name AS "batchName",
            CASE WHEN r.id IS NULL THEN NULL ELSE json_build_object('rackName', r.name, 'shelfNumber', s.number, 'slot', p.slot) END AS place
       FROM vessels v LEFT JOIN batches b ON b.id = v.batch_id
       LEFT JOIN placements p ON p.vessel_id = v.id LEFT JOIN shelves s ON s.id = p.shelf_id LEFT JOIN racks r ON r.id = s.rack_id
      WHERE v.cellar_id = $1 AND v.retired_at IS NULL AND (v.name ILIKE $2 OR v.code ILIKE $2 OR b.name ILIKE $2)
      ORDER BY lower(v.name), v.id LIMIT 100`,
    [actor.cellarId, pattern],
  );
  const lots: LabelChoices['lots'] = await tx.query(
    `SELECT l.id, l.code, b.name AS "batchName", l.bottled_on::text AS "bottledOn", l.bottle_ml AS "bottleMl",
            COALESCE((SELECT json_agg(json_build_object('id', c.id, 'code', c.code, 'number', c.number, 'bottlesLeft', c.bottles_left)
                                ORDER BY c.number)
                        FROM bottle_cases c WHERE c.lot_id = l.id), '[]') AS cases
       FROM bottle_lots l JOIN batches b ON b.id = l.batch_id
      WHERE l.cellar_id = $1 AND (b.name ILIKE $2 OR l.code ILIKE $2)
      ORDER BY l.bottled_on DESC, l.id LIMIT 100`,
    [actor.cellarId, pattern],
  );
  const batches = await tx.query(
    `SELECT b.id, b.name, json_agg(v.id ORDER BY lower(v.name), v.id) AS "vesselIds"
       FROM batches b JOIN vessels v ON v.batch_id = b.id
      WHERE b.cellar_id = $1 AND b.name ILIKE $2
      GROUP BY b.id, b.name ORDER BY lower(b.name), b.id LIMIT 100`,
    [actor.cellarId, pattern],
  );
  return { vessels, lots, batches };
}
