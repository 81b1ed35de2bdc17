import type { EntityManager } from 'typeorm';
import type { Vessel as VesselDto, VesselState } from '../../shared/schemas/vessels';
import { placesOf } from '../places/placement';
import { toVesselDto, type VesselRow } from './vessel-dto';

/** Positional parameters for one hand-written query. */
class Params {
  readonly values: unknown[] = [];
  /** Adds a value and returns its placeholder ($1, $2…). */
  add(value: unknown): string {
    this.values.push(value);
    return `$${this.values.length}`;
  }
}

/**
 * SQL for "this vessel is in `state` at `now`": the same rule as shared/domain/vessel-state.ts,
 * so lists filter and count in the database. Sanitising lapses after the cellar's days, judged
 * from sanitised_at — no job rewrites rows. Days are 24 hours, as in vesselState().
 * Expects the vessel as `v` and its cellar as `c`.
 * @param now - gives the SQL for the moment to judge at; called only when the state needs it
 */
export function stateCondition(state: VesselState, now: () => string): string {
  const empty = 'v.retired_at IS NULL AND v.batch_id IS NULL';
  const fresh = () => `v.sanitised_at + c.sanitised_valid_days * interval '24 hours' >= ${now()}`;
  switch (state) {
    case 'retired':
      return 'v.retired_at IS NOT NULL';
    case 'holding':
      return 'v.retired_at IS NULL AND v.batch_id IS NOT NULL';
    case 'dirty':
      return `${empty} AND v.cleaning_state = 'dirty'`;
    case 'clean':
      return `${empty} AND (v.cleaning_state = 'clean' OR (v.cleaning_state = 'sanitised' AND (v.sanitised_at IS NULL OR NOT (${fresh()}))))`;
    case 'sanitised':
      return `${empty} AND v.cleaning_state = 'sanitised' AND v.sanitised_at IS NOT NULL AND ${fresh()}`;
  }
}

const SELECT_VESSELS = `
  SELECT v.id, v.code, v.name, v.kind, v.material, v.capacity_l::float8 AS "capacityL",
         v.cleaning_state AS "cleaningState", v.sanitised_at AS "sanitisedAt", v.retired_at AS "retiredAt",
         v.batch_id AS "batchId", v.volume_l::float8 AS "volumeL", v.filled_at AS "filledAt", v.notes, v.version,
         b.name AS "batchName", b.kind AS "batchKind", b.stage AS "batchStage", b.started_on::text AS "batchStartedOn", b.og::float8 AS "batchOg",
         c.sanitised_valid_days AS "sanitisedValidDays"
    FROM vessels v
    JOIN cellars c ON c.id = v.cellar_id
    LEFT JOIN batches b ON b.id = v.batch_id`;

/** Name order that ignores case; id breaks ties so pages never overlap. */
const ORDER = 'ORDER BY lower(v.name), v.name, v.id';

export interface VesselFilter {
  q?: string;
  state?: VesselState;
  freeAndSanitised?: boolean;
  minCapacityL?: number;
  capacityL?: number;
  rackId?: string;
  ids?: string[];
  excludeIds?: string[];
}

function whereClause(p: Params, cellarId: string, filter: VesselFilter, now: Date): string {
  // Added only when used: PostgreSQL refuses a parameter that no expression types.
  let at: string | undefined;
  const moment = () => (at ??= `${p.add(now)}::timestamptz`);
  const conditions = [`v.cellar_id = ${p.add(cellarId)}`];
  if (filter.q) {
    const pattern = p.add(`%${filter.q.replace(/[\\%_]/g, (ch) => `\\${ch}`)}%`);
    conditions.push(`(v.name ILIKE ${pattern} OR v.code ILIKE ${pattern})`);
  }
  if (filter.state) conditions.push(stateCondition(filter.state, moment));
  if (filter.freeAndSanitised) conditions.push(stateCondition('sanitised', moment));
  if (filter.minCapacityL !== undefined) conditions.push(`v.capacity_l >= ${p.add(filter.minCapacityL)}`);
  if (filter.capacityL !== undefined) conditions.push(`v.capacity_l = ${p.add(filter.capacityL)}`);
  if (filter.rackId) {
    conditions.push(
      `EXISTS (SELECT 1 FROM placements p JOIN shelves s ON s.id = p.shelf_id WHERE p.vessel_id = v.id AND s.rack_id = ${p.add(filter.rackId)})`,
    );
  }
  if (filter.ids) conditions.push(`v.id = ANY(${p.add(filter.ids)}::uuid[])`);
  if (filter.excludeIds?.length) conditions.push(`NOT (v.id = ANY(${p.add(filter.excludeIds)}::uuid[]))`);
  return `WHERE ${conditions.join(' AND ')}`;
}

/** Vessel rows matching a filter, sorted by name, optionally one page of them. */
export async function findVesselRows(
  tx: EntityManager,
  cellarId: string,
  filter: VesselFilter,
  now: Date,
  page?: { limit: number; offset: number },
): Promise<VesselRow[]> {
  const p = new Params();
  const where = whereClause(p, cellarId, filter, now);
  const paging = page ? ` LIMIT ${p.add(page.limit)} OFFSET ${p.add(page.offset)}` : '';
  return tx.query(`${SELECT_VESSELS} ${where} ${ORDER}${paging}`, p.values);
}

/** How many vessels match a filter (in SQL, nothing loaded). */
export async function countVessels(tx: EntityManager, cellarId: string, filter: VesselFilter, now: Date): Promise<number> {
  const p = new Params();
  const where = whereClause(p, cellarId, filter, now);
  const [row] = await tx.query(`SELECT count(*)::int AS total FROM vessels v JOIN cellars c ON c.id = v.cellar_id ${where}`, p.values);
  return row.total;
}

/** Rows to DTOs, with every place found in one query. */
export async function toVesselDtos(tx: EntityManager, rows: VesselRow[], now: Date): Promise<VesselDto[]> {
  const places = await placesOf(
    tx,
    'vessel',
    rows.map((r) => r.id),
  );
  return rows.map((r) => toVesselDto(r, places.get(r.id) ?? null, now));
}

/**
 * One page of a cellar's vessels: count, page and places in three queries whatever the size.
 */
export async function findVesselPage(
  tx: EntityManager,
  cellarId: string,
  query: VesselFilter & { page: number; pageSize: number },
  now = new Date(),
): Promise<{ items: VesselDto[]; total: number; page: number; pageSize: number }> {
  const { page, pageSize, ...filter } = query;
  const total = await countVessels(tx, cellarId, filter, now);
  const offset = (page - 1) * pageSize;
  const rows = offset < total ? await findVesselRows(tx, cellarId, filter, now, { limit: pageSize, offset }) : [];
  return { items: await toVesselDtos(tx, rows, now), total, page, pageSize };
}

/** One vessel row of this cellar, or undefined. */
export async function findVesselRow(tx: EntityManager, cellarId: string, vesselId: string, now: Date): Promise<VesselRow | undefined> {
  const [row] = await findVesselRows(tx, cellarId, { ids: [vesselId] }, now);
  return row;
}

/**
 * Candidates for a racking: free, not retired and sanitised (not lapsed) at `now`, by name.
 * Only id and capacity: the chosen one is loaded in full afterwards.
 */
export async function rackingCandidates(
  tx: EntityManager,
  cellarId: string,
  excludeIds: string[],
  now: Date,
): Promise<{ id: string; capacityL: number }[]> {
  const p = new Params();
  const where = whereClause(p, cellarId, { state: 'sanitised', excludeIds }, now);
  return tx.query(`SELECT v.id, v.capacity_l::float8 AS "capacityL" FROM vessels v JOIN cellars c ON c.id = v.cellar_id ${where} ${ORDER}`, p.values);
}
