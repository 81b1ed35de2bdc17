import type { EntityManager } from 'typeorm';
import type { BatchFacts, FactEvent } from '../../shared/domain/plans/batch-facts';
import type { BatchKind, Stage } from '../../shared/schemas/batches';
import { taskEvents, type TaskEventRow } from '../journal/journal-queries';

/**
 * What the rule engine needs of a cellar's batches, read in a fixed number of statements
 * whatever the number of batches: the batches (with the vessels holding them) and the journal
 * entries that anchor or complete tasks, dated in the cellar's time zone.
 */

export interface TaskScope {
  batchId?: string;
  /** These batches only (those whose stored tasks are out of date). */
  batchIds?: string[];
  kind?: BatchKind;
  rackId?: string;
}

export interface TaskBatch {
  id: string;
  name: string;
  kind: BatchKind;
  stage: Stage;
  startedOn: string;
  planId: string | null;
  vesselNames: string[];
}

/**
 * SQL conditions on `batches b` for the cellar's batches that can have tasks (everything not
 * finished), narrowed by the scope; `params` holds the cellar as $1 and gets the scope's values.
 */
export function scopeConditions(scope: TaskScope, params: unknown[]): string[] {
  const where = [`b.cellar_id = $1`, `b.stage <> 'finished'`];
  if (scope.batchId) where.push(`b.id = $${params.push(scope.batchId)}`);
  if (scope.batchIds) where.push(`b.id = ANY($${params.push(scope.batchIds)})`);
  if (scope.kind) where.push(`b.kind = $${params.push(scope.kind)}`);
  if (scope.rackId) {
    const rack = `$${params.push(scope.rackId)}`;
    where.push(`(EXISTS (SELECT 1 FROM vessels rv JOIN placements pl ON pl.vessel_id = rv.id JOIN shelves s ON s.id = pl.shelf_id
                         WHERE rv.batch_id = b.id AND s.rack_id = ${rack})
              OR EXISTS (SELECT 1 FROM bottle_lots l JOIN bottle_cases c ON c.lot_id = l.id JOIN placements pl ON pl.case_id = c.id
                         JOIN shelves s ON s.id = pl.shelf_id WHERE l.batch_id = b.id AND s.rack_id = ${rack}))`);
  }
  return where;
}

/** The cellar's batches that can have tasks, narrowed by the scope. */
export async function taskBatches(tx: EntityManager, cellarId: string, scope: TaskScope): Promise<TaskBatch[]> {
  const params: unknown[] = [cellarId];
  const where = scopeConditions(scope, params);
  return tx.query(
    `SELECT b.id, b.name, b.kind, b.stage, b.started_on::text AS "startedOn", b.plan_id AS "planId",
            COALESCE(array_agg(v.name ORDER BY v.name) FILTER (WHERE v.id IS NOT NULL), '{}') AS "vesselNames"
       FROM batches b LEFT JOIN vessels v ON v.batch_id = b.id
      WHERE ${where.join(' AND ')}
      GROUP BY b.id`,
    params,
  );
}

/** A journal entry as the rule engine reads it, or null for kinds it does not use. */
function toFactEvent(row: TaskEventRow): FactEvent | null {
  const on = row.localOn;
  const p = row.payload;
  switch (p.kind) {
    case 'reading':
      return { kind: 'reading', id: row.id, on, sg: p.correctedSg };
    case 'racked':
      return { kind: 'racking', id: row.id, on };
    case 'addition':
      return { kind: 'addition', id: row.id, on, category: p.category, name: p.name, removeOn: p.removeOn };
    case 'removed':
      return { kind: 'removed', id: row.id, on, additionId: p.additionEntryId };
    case 'topped-up':
      return { kind: 'topped-up', id: row.id, on };
    case 'tasted':
      return { kind: 'tasted', id: row.id, on };
    case 'bottled':
      return { kind: 'bottled', id: row.id, on };
    default:
      return null;
  }
}

/** Each batch's facts for the rule engine, by batch id. */
export async function batchFacts(tx: EntityManager, batches: TaskBatch[], timeZone: string): Promise<Map<string, BatchFacts>> {
  const eventsOf = await taskEvents(
    tx,
    batches.map((b) => b.id),
    timeZone,
  );
  const facts = new Map<string, BatchFacts>();
  for (const b of batches) {
    const events: FactEvent[] = [];
    for (const row of eventsOf.get(b.id) ?? []) {
      const event = toFactEvent(row);
      if (event) events.push(event);
    }
    facts.set(b.id, { batchId: b.id, startedOn: b.startedOn, stage: b.stage, events });
  }
  return facts;
}
