import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BatchDetail } from '../../shared/schemas/batch-detail';
import type { batchListQuerySchema, batchPageSchema } from '../../shared/schemas/batches';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { localDate } from '../core/local-date';
import { batchDetail } from './batch-detail';
import { needsRackingSql, SqlParams, summaryColumns, summaryFrom, toSummary, type SummaryRow } from './batch-summaries';
import { whereaboutsOf } from './whereabouts';

type ListQuery = z.output<typeof batchListQuerySchema>;
type BatchPage = z.output<typeof batchPageSchema>;

const ORDER_BY: Record<ListQuery['sort'], string> = {
  'started-desc': 'b.started_on DESC, b.created_at DESC, b.id',
  'started-asc': 'b.started_on ASC, b.created_at ASC, b.id',
  name: 'lower(b.name), b.id',
};

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, '\\$&')}%`;

/**
 * One page of the cellar's batches, filtered and counted in SQL from the cached columns and
 * one aggregate of the vessels (journals are not read for a list).
 */
export async function listBatches(actor: Actor, tx: EntityManager, query: ListQuery): Promise<BatchPage> {
  requireRole(actor, 'guest');
  const now = new Date();
  const today = localDate(now, (await loadCellar(tx, actor.cellarId)).timeZone);
  const params = new SqlParams();
  const from = summaryFrom(params, actor.cellarId);
  const needs = needsRackingSql(params, today, now);
  const where = [`b.cellar_id = ${params.add(actor.cellarId)}`];
  if (query.q) where.push(`b.name ILIKE ${params.add(likePattern(query.q))}`);
  if (query.stage) where.push(`b.stage = ${params.add(query.stage)}`);
  if (query.kind) where.push(`b.kind = ${params.add(query.kind)}`);
  if (query.agedMonths !== undefined) {
    where.push(`b.started_on <= (${params.add(today)}::date - make_interval(months => ${params.add(query.agedMonths)}::int))::date`);
  }
  if (query.needsRacking !== undefined) where.push(query.needsRacking ? needs : `NOT ${needs}`);
  const condition = where.join(' AND ');

  // The inner select names every parameter, so PostgreSQL can type each one.
  const [{ total }]: { total: number }[] = await tx.query(
    `SELECT COUNT(*)::int AS total FROM (SELECT ${needs} AS needs_racking ${from} WHERE ${condition}) counted`,
    params.values,
  );
  const limit = params.add(query.pageSize);
  const offset = params.add((query.page - 1) * query.pageSize);
  const rows: SummaryRow[] = await tx.query(
    `SELECT ${summaryColumns(needs)} ${from} WHERE ${condition} ORDER BY ${ORDER_BY[query.sort]} LIMIT ${limit} OFFSET ${offset}`,
    params.values,
  );
  const whereabouts = await whereaboutsOf(
    tx,
    rows.map((r) => r.id),
  );
  return {
    items: rows.map((r) => ({ ...toSummary(r), whereabouts: whereabouts.get(r.id) ?? [] })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** The Batch page's data, read in one consistent snapshot. */
export async function getBatch(actor: Actor, tx: EntityManager, batchId: string): Promise<BatchDetail> {
  requireRole(actor, 'guest');
  return batchDetail(tx, actor.cellarId, batchId);
}
