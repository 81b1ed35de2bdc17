import type { EntityManager, SelectQueryBuilder } from 'typeorm';
import type { BottleCase, BottleLot } from '../../shared/schemas/bottles';
import type { SlotRef } from '../../shared/schemas/vessels';
import type { BottleCaseRow } from '../entities/bottle-case.entity';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { NotFoundError } from '../http/errors';

/** A lot row as the lot queries select it: the lot, its batch's name and kind. */
export interface LotRecord {
  lot: BottleLotRow;
  batchName: string;
  batchKind: string;
}

/** A case as the API shows it. */
export function caseDto(row: BottleCaseRow, place: SlotRef | null): BottleCase {
  return {
    id: row.id,
    code: row.code,
    lotId: row.lotId,
    number: row.number,
    bottlesInitial: row.bottlesInitial,
    bottlesLeft: row.bottlesLeft,
    place,
    version: row.version,
  };
}

/** A lot as the API shows it; bottles left is the sum over its cases. */
export function lotDto(record: LotRecord, cases: BottleCase[]): BottleLot {
  const { lot } = record;
  return {
    id: lot.id,
    code: lot.code,
    batchId: lot.batchId,
    batchName: record.batchName,
    batchKind: record.batchKind,
    bottledOn: lot.bottledOn,
    bottleMl: lot.bottleMl,
    bottleCount: lot.bottleCount,
    bottlesLeft: cases.reduce((sum, c) => sum + c.bottlesLeft, 0),
    closure: lot.closure as BottleLot['closure'],
    carbonation: lot.carbonation,
    sulfiteAdded: lot.sulfiteAdded,
    abvEstimate: lot.abvEstimate,
    note: lot.note,
    cases,
  };
}

type CaseWithPlaceRow = {
  id: string;
  lot_id: string;
  code: string;
  number: number;
  bottles_initial: number;
  bottles_left: number;
  version: number;
  rack_id: string | null;
  rack_name: string | null;
  shelf_id: string | null;
  shelf_number: number | null;
  slot: number | null;
};

/**
 * The cases of many lots with where each one sits, in one query.
 * @returns cases by lot id, numbered in order
 */
export async function casesOfLots(tx: EntityManager, cellarId: string, lotIds: string[]): Promise<Map<string, BottleCase[]>> {
  const byLot = new Map<string, BottleCase[]>(lotIds.map((id) => [id, []]));
  if (lotIds.length === 0) return byLot;
  const rows: CaseWithPlaceRow[] = await tx.query(
    `SELECT c.id, c.lot_id, c.code, c.number, c.bottles_initial, c.bottles_left, c.version,
            r.id AS rack_id, r.name AS rack_name, s.id AS shelf_id, s.number AS shelf_number, p.slot
       FROM bottle_cases c
       LEFT JOIN placements p ON p.case_id = c.id
       LEFT JOIN shelves s ON s.id = p.shelf_id
       LEFT JOIN racks r ON r.id = s.rack_id
      WHERE c.cellar_id = $1 AND c.lot_id = ANY($2)
      ORDER BY c.lot_id, c.number`,
    [cellarId, lotIds],
  );
  for (const r of rows) {
    const place: SlotRef | null =
      r.rack_id && r.rack_name !== null && r.shelf_id && r.shelf_number !== null && r.slot !== null
        ? { rackId: r.rack_id, rackName: r.rack_name, shelfId: r.shelf_id, shelfNumber: r.shelf_number, slot: r.slot }
        : null;
    byLot.get(r.lot_id)?.push({
      id: r.id,
      code: r.code,
      lotId: r.lot_id,
      number: r.number,
      bottlesInitial: r.bottles_initial,
      bottlesLeft: r.bottles_left,
      place,
      version: r.version,
    });
  }
  return byLot;
}

/**
 * Reads one lot of the cellar with its cases (and where they sit).
 * @throws NotFoundError when the lot is not in this cellar
 */
export async function loadLot(tx: EntityManager, cellarId: string, lotId: string): Promise<BottleLot> {
  const [record] = await records(lotsWithBatch(tx, cellarId).andWhere('l.id = :lotId', { lotId }));
  if (!record) throw new NotFoundError('No such bottle lot in this cellar.');
  const cases = await casesOfLots(tx, cellarId, [lotId]);
  return lotDto(record, cases.get(lotId) ?? []);
}

/** Lots of the cellar joined with their batch's name and kind. */
export function lotsWithBatch(tx: EntityManager, cellarId: string): SelectQueryBuilder<BottleLotRow> {
  return tx
    .getRepository(BottleLotRow)
    .createQueryBuilder('l')
    .innerJoin('batches', 'b', 'b.id = l.batch_id')
    .addSelect('b.name', 'batch_name')
    .addSelect('b.kind', 'batch_kind')
    .where('l.cellar_id = :cellarId', { cellarId });
}

/** The lots a query finds, each with its batch's name and kind. */
export async function records(query: SelectQueryBuilder<BottleLotRow>): Promise<LotRecord[]> {
  const { entities, raw } = await query.getRawAndEntities<{ l_id: string; batch_name: string; batch_kind: string }>();
  const batchOf = new Map(raw.map((r) => [r.l_id, r]));
  return entities.map((lot) => ({ lot, batchName: batchOf.get(lot.id)!.batch_name, batchKind: batchOf.get(lot.id)!.batch_kind }));
}
