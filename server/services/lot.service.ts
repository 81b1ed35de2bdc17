import type { DataSource, EntityManager, SelectQueryBuilder } from 'typeorm';
import type { z } from 'zod';
import type { BottleLot, lotListQuerySchema } from '../../shared/schemas/bottles';
import { departureSchema } from '../../shared/schemas/bottles';
import { BottleLotRow } from '../entities/bottle-lot.entity';
import { NotFoundError } from '../errors';
import type { CellarContext } from './cellar.service';
import { casesOfLots, lotDto, type LotRecord } from './lot-dto';

type LotListQuery = z.output<typeof lotListQuerySchema>;
type Departure = z.infer<typeof departureSchema>;

/** A lot with its departures, newest first, for the lot page. */
export type BottleLotDetail = BottleLot & { departures: Departure[] };

/** Shown for departures whose author's account has since been deleted. */
const FORMER_MEMBER = { id: '00000000-0000-0000-0000-000000000000', name: 'A former member' };

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

function lotsWithBatch(tx: EntityManager, cellarId: string): SelectQueryBuilder<BottleLotRow> {
  return tx
    .getRepository(BottleLotRow)
    .createQueryBuilder('l')
    .innerJoin('batches', 'b', 'b.id = l.batch_id')
    .addSelect('b.name', 'batch_name')
    .addSelect('b.kind', 'batch_kind')
    .where('l.cellar_id = :cellarId', { cellarId });
}

async function records(query: SelectQueryBuilder<BottleLotRow>): Promise<LotRecord[]> {
  const { entities, raw } = await query.getRawAndEntities<{ l_id: string; batch_name: string; batch_kind: string }>();
  const batchOf = new Map(raw.map((r) => [r.l_id, r]));
  return entities.map((lot) => ({ lot, batchName: batchOf.get(lot.id)!.batch_name, batchKind: batchOf.get(lot.id)!.batch_kind }));
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

/**
 * The cellar's bottle lots, newest bottling first, paged in SQL; `q` matches the batch name,
 * `inStock` keeps lots with (or, when false, without) bottles left.
 */
export async function listLots(
  ds: DataSource,
  ctx: CellarContext,
  query: LotListQuery,
): Promise<{ items: BottleLot[]; total: number; page: number; pageSize: number }> {
  // Repeatable read: the count and the page come from the same snapshot.
  return ds.transaction('REPEATABLE READ', async (tx) => {
    const filtered = lotsWithBatch(tx, ctx.cellarId);
    if (query.q) filtered.andWhere('b.name ILIKE :q', { q: `%${escapeLike(query.q)}%` });
    if (query.inStock !== undefined) {
      const hasBottles = 'EXISTS (SELECT 1 FROM bottle_cases c WHERE c.lot_id = l.id AND c.bottles_left > 0)';
      filtered.andWhere(query.inStock ? hasBottles : `NOT ${hasBottles}`);
    }
    const total = await filtered.clone().getCount();
    const page = await records(
      filtered
        .orderBy('l.bottled_on', 'DESC')
        .addOrderBy('l.created_at', 'DESC')
        .addOrderBy('l.id')
        .offset((query.page - 1) * query.pageSize)
        .limit(query.pageSize),
    );
    const cases = await casesOfLots(tx, ctx.cellarId, page.map((r) => r.lot.id));
    return {
      items: page.map((r) => lotDto(r, cases.get(r.lot.id) ?? [])),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  });
}

/** One lot with its cases and every bottle that left it, newest first. */
export async function getLot(ds: DataSource, ctx: CellarContext, lotId: string): Promise<BottleLotDetail> {
  return ds.transaction('REPEATABLE READ', async (tx) => {
    const lot = await loadLot(tx, ctx.cellarId, lotId);
    const rows: { id: string; case_id: string; count: number; reason: Departure['reason']; note: string; occurred_at: Date; author_id: string | null; author_name: string | null }[] =
      await tx.query(
        `SELECT d.id, d.case_id, d.count, d.reason, d.note, d.occurred_at, u.id AS author_id, u.display_name AS author_name
           FROM bottle_departures d
           JOIN bottle_cases c ON c.id = d.case_id
           LEFT JOIN users u ON u.id = d.author_id
          WHERE c.lot_id = $1 AND d.cellar_id = $2
          ORDER BY d.occurred_at DESC, d.id`,
        [lotId, ctx.cellarId],
      );
    const departures = rows.map((r) => ({
      id: r.id,
      caseId: r.case_id,
      count: r.count,
      reason: r.reason,
      note: r.note,
      occurredAt: new Date(r.occurred_at).toISOString(),
      author: r.author_id && r.author_name !== null ? { id: r.author_id, name: r.author_name } : FORMER_MEMBER,
    }));
    return { ...lot, departures };
  });
}
