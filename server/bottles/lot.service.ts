import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { type BottleLot, departureSchema, type lotListQuerySchema } from '../../shared/schemas/bottles';
import { requireRole, type Actor } from '../core/actor';
import { casesOfLots, loadLot, lotDto, lotsWithBatch, records } from './lot-queries';

type LotListQuery = z.output<typeof lotListQuerySchema>;
type Departure = z.infer<typeof departureSchema>;

/** A lot with its departures, newest first, for the lot page. */
export type BottleLotDetail = BottleLot & { departures: Departure[] };

/** Shown for departures whose author's account has since been deleted. */
const FORMER_MEMBER = { id: '00000000-0000-0000-0000-000000000000', name: 'A former member' };

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/**
 * The cellar's bottle lots, newest bottling first, paged in SQL; `q` matches the batch name,
 * `inStock` keeps lots with (or, when false, without) bottles left.
 */
export async function listLots(
  actor: Actor,
  tx: EntityManager,
  query: LotListQuery,
): Promise<{ items: BottleLot[]; total: number; page: number; pageSize: number }> {
  requireRole(actor, 'guest');
  const filtered = lotsWithBatch(tx, actor.cellarId);
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
  const cases = await casesOfLots(
    tx,
    actor.cellarId,
    page.map((r) => r.lot.id),
  );
  return {
    items: page.map((r) => lotDto(r, cases.get(r.lot.id) ?? [])),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** One lot with its cases and every bottle that left it, newest first. */
export async function getLot(actor: Actor, tx: EntityManager, lotId: string): Promise<BottleLotDetail> {
  requireRole(actor, 'guest');
  requireRole(actor, 'guest');
  const lot = await loadLot(tx, actor.cellarId, lotId);
  const rows: {
    id: string;
    case_id: string;
    count: number;
    reason: Departure['reason'];
    note: string;
    occurred_at: Date;
    author_id: string | null;
    author_name: string | null;
  }[] = await tx.query(
    `SELECT d.id, d.case_id, d.count, d.reason, d.note, d.occurred_at, u.id AS author_id, u.display_name AS author_name
         FROM bottle_departures d
         JOIN bottle_cases c ON c.id = d.case_id
         LEFT JOIN users u ON u.id = d.author_id
        WHERE c.lot_id = $1 AND d.cellar_id = $2
        ORDER BY d.occurred_at DESC, d.id`,
    [lotId, actor.cellarId],
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
}
