import type { EntityManager } from 'typeorm';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { BatchKind, Stage } from '../../shared/schemas/batches';
import type { Task, TaskBucket } from '../../shared/schemas/tasks';
import { requireRole, type Actor } from '../core/actor';
import { computeCellarTasks, toTask } from './cellar-tasks';
import { scopeConditions, type TaskScope } from './task-facts';
import { cellarToday } from './task-lookup';

/**
 * Each batch's tasks kept as the list shows them, for one day (tables and triggers: migration
 * CreateTaskSnapshots), so a list of a large cellar is one sorted page in SQL. A snapshot is
 * made by the same code as a list worked out from the journal (`toTask` over the rule engine's
 * answer) and is used only while nothing it was made from has changed and it is still the
 * cellar's same day; the batches without one are worked out from the journal as before, so a
 * list is right whether or not the snapshots have caught up.
 */

/**
 * Snapshots hold this many days ahead: the Tasks screen and Today ask for 14, the default is 30.
 * A batch's own page asks for more and works its one batch out from the journal.
 */
export const SNAPSHOT_LOOKAHEAD_DAYS = 30;
/** Done and dismissed tasks stay in the list this many days. */
export const DONE_SHOWN_DAYS = 14;
export const BUCKET_NUMBER: Record<TaskBucket, number> = { overdue: 0, today: 1, upcoming: 2, done: 3 };
/** Rows per INSERT when writing snapshots: one statement stays a few megabytes. */
const ROWS_PER_INSERT = 5000;
/** A refresh that wrote this many batches updates the planner's statistics of the snapshot tables. */
const ANALYZE_AFTER_BATCHES = 500;

/** The day a task is due, or snoozed to: the list's order within a bucket. */
export const effectiveDate = (t: Task): string => t.snoozedUntil ?? t.dueOn;

/** The batches in scope whose snapshot is missing, out of date or from another day. */
export async function batchesWithoutSnapshot(tx: EntityManager, cellarId: string, scope: TaskScope, today: string): Promise<string[]> {
  const params: unknown[] = [cellarId];
  const where = scopeConditions(scope, params);
  const rows: { id: string }[] = await tx.query(
    `SELECT b.id FROM batches b LEFT JOIN task_snapshots ts ON ts.batch_id = b.id
      WHERE ${where.join(' AND ')} AND ts.computed_for IS DISTINCT FROM $${params.push(today)}::date`,
    params,
  );
  return rows.map((r) => r.id);
}

/**
 * Brings the cellar's out-of-date snapshots up to date; returns how many batches it wrote. Run
 * in a write transaction of its own before a list is read. It never waits on a writer: one
 * refresh per cellar at a time (others return at once), and snapshot rows a writer holds are
 * skipped. A snapshot is stored only if its version is still the one read before computing:
 * a change committed meanwhile leaves it out of date, for the next refresh.
 */
export async function refreshTaskSnapshots(actor: Actor, tx: EntityManager): Promise<number> {
  requireRole(actor, 'guest');
  const [{ locked }] = await tx.query(`SELECT pg_try_advisory_xact_lock(hashtext('task-snapshots'), hashtext($1)) AS locked`, [actor.cellarId]);
  if (!locked) return 0;
  const { timeZone, today } = await cellarToday(tx, actor.cellarId);
  const stale: { batch_id: string; inputs_version: string }[] = await tx.query(
    `SELECT ts.batch_id, ts.inputs_version FROM task_snapshots ts JOIN batches b ON b.id = ts.batch_id
      WHERE b.cellar_id = $1 AND b.stage <> 'finished' AND ts.computed_for IS DISTINCT FROM $2::date`,
    [actor.cellarId, today],
  );
  if (stale.length === 0) return 0;
  const batchIds = stale.map((s) => s.batch_id);
  const { computed, stateOf } = await computeCellarTasks(tx, actor.cellarId, timeZone, { batchIds }, today, SNAPSHOT_LOOKAHEAD_DAYS);
  const written: { batch_id: string }[] = await tx.query(
    `WITH mine AS (
       SELECT ts.batch_id FROM task_snapshots ts WHERE ts.batch_id = ANY($1::uuid[]) ORDER BY ts.batch_id FOR UPDATE SKIP LOCKED
     ), stored AS (
       UPDATE task_snapshots ts SET computed_for = $3::date
         FROM unnest($1::uuid[], $2::bigint[]) AS v(batch_id, version), mine
        WHERE ts.batch_id = v.batch_id AND mine.batch_id = v.batch_id AND ts.inputs_version = v.version
        RETURNING ts.batch_id)
     SELECT batch_id FROM stored`,
    [batchIds, stale.map((s) => s.inputs_version), today],
  );
  if (written.length === 0) return 0;
  const writtenIds = new Set(written.map((w) => w.batch_id));
  await tx.query(`DELETE FROM snapshot_tasks WHERE batch_id = ANY($1::uuid[])`, [[...writtenIds]]);
  await tx.query(`DELETE FROM snapshot_task_details WHERE batch_id = ANY($1::uuid[])`, [[...writtenIds]]);
  // Closed work from before any list looks back is left out: no list of this day shows it.
  const doneSince = addDays(today, -DONE_SHOWN_DAYS);
  const rows = computed
    .filter((c) => writtenIds.has(c.batch.id))
    .map((c) => ({ task: toTask(c.batch, c.task, stateOf.get(c.task.key), today, c.oneOff), repeats: c.repeats }))
    .filter(({ task }) => task.bucket !== 'done' || task.closed!.at.slice(0, 10) >= doneSince);
  for (let i = 0; i < rows.length; i += ROWS_PER_INSERT) {
    const chunk = rows.slice(i, i + ROWS_PER_INSERT);
    const keys = chunk.map(({ task }) => task.key);
    const batches = chunk.map(({ task }) => task.batch.id);
    await tx.query(
      `INSERT INTO snapshot_tasks (batch_id, task_key, bucket, closed_order, sort_on, due_on, repeats)
       SELECT * FROM unnest($1::uuid[], $2::text[], $3::smallint[], $4::text[], $5::date[], $6::date[], $7::boolean[])`,
      [
        batches,
        keys,
        chunk.map(({ task }) => BUCKET_NUMBER[task.bucket]),
        chunk.map(({ task }) => (task.bucket === 'done' ? task.closed!.at : null)),
        chunk.map(({ task }) => effectiveDate(task)),
        chunk.map(({ task }) => task.dueOn),
        chunk.map(({ repeats }) => repeats),
      ],
    );
    await tx.query(`INSERT INTO snapshot_task_details (batch_id, task_key, task) SELECT * FROM unnest($1::uuid[], $2::text[], $3::jsonb[])`, [
      batches,
      keys,
      chunk.map(({ task }) => JSON.stringify(task)),
    ]);
  }
  // A day's first refresh rewrites most rows: fresh statistics keep the list's plan a hash join.
  if (writtenIds.size >= ANALYZE_AFTER_BATCHES) await tx.query(`ANALYZE task_snapshots, snapshot_tasks`);
  return writtenIds.size;
}

/** What a page of the list is: the buckets, and the horizon of upcoming work. */
export interface PageQuery {
  today: string;
  buckets: TaskBucket[];
  horizon: string;
  limit: number;
}

interface SnapshotRow {
  task: Task;
  batch_name: string;
  batch_kind: BatchKind;
  batch_stage: Stage;
  vessel_names: string[];
  by_name: string | null;
  total: string;
}

/**
 * One page of the list from the batches whose snapshot is current, in the list's order
 * (bucket; closed work newest first; then the day it is due or snoozed to, and the key), and how
 * many tasks pass the filter in all. What can change without touching a snapshot is read as it
 * is now: the batch's name and vessels, and the name of whoever closed a task.
 */
export async function snapshotPage(
  tx: EntityManager,
  cellarId: string,
  scope: TaskScope,
  page: PageQuery,
): Promise<{ tasks: Task[]; total: number }> {
  const params: unknown[] = [cellarId];
  const where = scopeConditions(scope, params);
  const p = (value: unknown) => `$${params.push(value)}`;
  const horizon = p(page.horizon);
  const order = `bucket, closed_order DESC NULLS LAST, sort_on, task_key`;
  const rows: SnapshotRow[] = await tx.query(
    `WITH fresh AS MATERIALIZED (
       SELECT b.id FROM batches b JOIN task_snapshots ts ON ts.batch_id = b.id AND ts.computed_for = ${p(page.today)}::date
        WHERE ${where.join(' AND ')}
     ), shown AS (
       SELECT st.batch_id, st.task_key, st.bucket, st.closed_order, st.sort_on
         FROM snapshot_tasks st
        WHERE st.batch_id IN (SELECT id FROM fresh) AND st.bucket = ANY(${p(page.buckets.map((b) => BUCKET_NUMBER[b]))}::smallint[])
          AND NOT (st.repeats AND st.due_on > ${horizon}::date) AND (st.bucket <> 2 OR st.sort_on <= ${horizon}::date)
     ), picked AS (
       SELECT top.*, row_number() OVER (ORDER BY ${order}) AS place
         FROM (SELECT * FROM shown ORDER BY ${order} LIMIT ${p(page.limit)}) top
     )
     SELECT d.task, b.name AS batch_name, b.kind AS batch_kind, b.stage AS batch_stage, u.display_name AS by_name,
            (SELECT count(*) FROM shown) AS total,
            (SELECT COALESCE(array_agg(v.name ORDER BY v.name), '{}') FROM vessels v WHERE v.batch_id = b.id) AS vessel_names
       FROM picked pk
       JOIN snapshot_task_details d ON d.batch_id = pk.batch_id AND d.task_key = pk.task_key
       JOIN batches b ON b.id = pk.batch_id
       LEFT JOIN task_states s ON s.cellar_id = $1 AND s.task_key = pk.task_key
       LEFT JOIN users u ON u.id = s.by_user_id
      ORDER BY pk.place`,
    params,
  );
  const tasks = rows.map(({ task, batch_name, batch_kind, batch_stage, vessel_names, by_name }) => ({
    ...task,
    batch: { id: task.batch.id, name: batch_name, kind: batch_kind, stage: batch_stage },
    vesselNames: vessel_names,
    closed: task.closed && !task.closed.byJournal ? { ...task.closed, by: by_name } : task.closed,
  }));
  return { tasks, total: rows.length > 0 ? Number(rows[0]!.total) : 0 };
}
