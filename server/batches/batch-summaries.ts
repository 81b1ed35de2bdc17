import type { EntityManager } from 'typeorm';
import { RACK_AGAIN_AFTER_DAYS, RACK_PRIMARY_AFTER_DAYS } from '../../shared/domain/racking-due';
import type { BatchKind, BatchSummary, Stage } from '../../shared/schemas/batches';

/** Collects positional parameters ($1, $2…) for a hand-written query. */
export class SqlParams {
  readonly values: unknown[] = [];
  /** Adds a value and returns its placeholder. */
  add(value: unknown): string {
    this.values.push(value);
    return `$${this.values.length}`;
  }
}

/**
 * FROM clause of every batch summary: the batch and one aggregate of the vessels holding it
 * (never the journal). Alias `b` for the batch, `v` for volume and vessel count.
 */
export function summaryFrom(params: SqlParams, cellarId: string): string {
  const cellar = params.add(cellarId);
  return `FROM batches b
    LEFT JOIN (
      SELECT batch_id, SUM(volume_l)::float8 AS volume_l, COUNT(*)::int AS vessel_count
        FROM vessels WHERE cellar_id = ${cellar} AND batch_id IS NOT NULL GROUP BY batch_id
    ) v ON v.batch_id = b.id`;
}

/**
 * SQL truth value "this batch is due for racking" (common practice, shared/domain/racking-due):
 * in primary for RACK_PRIMARY_AFTER_DAYS, or in secondary/bulk ageing RACK_AGAIN_AFTER_DAYS
 * after its last racking (or its start); only batches still in vessels.
 * @param today - the cellar's local date (YYYY-MM-DD)
 */
export function needsRackingSql(params: SqlParams, today: string, now: Date): string {
  const day = params.add(today);
  const moment = params.add(now);
  const primaryDays = params.add(RACK_PRIMARY_AFTER_DAYS);
  const againDays = params.add(RACK_AGAIN_AFTER_DAYS);
  return `(COALESCE(v.vessel_count, 0) > 0 AND (
      (b.stage = 'primary' AND b.started_on <= ${day}::date - ${primaryDays}::int)
      OR (b.stage IN ('secondary', 'bulk-ageing') AND CASE
            WHEN b.last_racked_at IS NULL THEN b.started_on <= ${day}::date - ${againDays}::int
            ELSE b.last_racked_at <= ${moment}::timestamptz - make_interval(days => ${againDays}::int) END)))`;
}

/** Columns of a summary row; `needs` is the needsRackingSql expression. */
export function summaryColumns(needs: string): string {
  return `b.id, b.name, b.kind, b.stage, b.started_on::text AS started_on, b.og::float8 AS og,
    b.last_reading_sg::float8 AS last_reading_sg, b.last_reading_at, b.last_racked_at,
    b.yeast_tolerance_abv::float8 AS yeast_tolerance_abv,
    COALESCE(v.volume_l, 0)::float8 AS volume_l, COALESCE(v.vessel_count, 0)::int AS vessel_count,
    ${needs} AS needs_racking`;
}

export interface SummaryRow {
  id: string;
  name: string;
  kind: BatchKind;
  stage: Stage;
  started_on: string;
  og: number | null;
  last_reading_sg: number | null;
  last_reading_at: Date | null;
  last_racked_at: Date | null;
  yeast_tolerance_abv: number;
  volume_l: number;
  vessel_count: number;
  needs_racking: boolean;
}

/** The API's summary of a batch from a summary row. */
export function toSummary(row: SummaryRow): BatchSummary {
  return {
    id: row.id,
    name: row.name,
    kind: row.kind,
    stage: row.stage,
    startedOn: row.started_on,
    og: row.og,
    volumeL: Number(row.volume_l.toFixed(3)),
    vesselCount: row.vessel_count,
    lastReading: row.last_reading_sg !== null && row.last_reading_at ? { sg: row.last_reading_sg, at: row.last_reading_at.toISOString() } : null,
    lastRackedAt: row.last_racked_at ? row.last_racked_at.toISOString() : null,
    needsRacking: row.needs_racking,
    yeastToleranceAbv: row.yeast_tolerance_abv,
  };
}

/** One batch's summary (null when it is not in this cellar). */
export async function findSummary(tx: EntityManager, cellarId: string, batchId: string, today: string, now: Date): Promise<BatchSummary | null> {
  const params = new SqlParams();
  const from = summaryFrom(params, cellarId);
  const needs = needsRackingSql(params, today, now);
  const id = params.add(batchId);
  const cellar = params.add(cellarId);
  const rows: SummaryRow[] = await tx.query(`SELECT ${summaryColumns(needs)} ${from} WHERE b.id = ${id} AND b.cellar_id = ${cellar}`, params.values);
  return rows[0] ? toSummary(rows[0]) : null;
}
