import type { EntityManager } from 'typeorm';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { Task, TaskBucket } from '../../shared/schemas/tasks';
import { requireRole, type Actor } from '../core/actor';
import { cellarTasks, workedOutTasks } from './cellar-tasks';
import { scopeConditions, type TaskScope } from './task-facts';
import { cellarToday } from './task-lookup';

/**
 * Each batch's tasks kept as the list shows them, for one day (tables and triggers: migration
 * CreateTaskSnapshots), so a list of a large cellar is one sorted page in SQL. A snapshot is
 * made by the same code as a list worked out from the journal (`workedOutTasks`, the rule engine's
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
  const worked = await workedOutTasks(tx, actor.cellarId, timeZone, { batchIds }, today, SNAPSHOT_LOOKAHEAD_DAYS);
  // Closed work from before any list looks back is left out: no list of this day shows it.
  const doneSince = addDays(today, -DONE_SHOWN_DAYS);
  const rows = worked.filter(({ task }) => task.bucket !== 'done' || task.closed!.at.slice(0, 10) >= doneSince);
  const counts = new Map(batchIds.map((id) => [id, { overdue: 0, today: 0 }]));
  for (const { task } of rows) {
    if (task.bucket === 'overdue') counts.get(task.batch.id)!.overdue += 1;
    if (task.bucket === 'today') counts.get(task.batch.id)!.today += 1;
  }
  const written: { batch_id: string }[] = await tx.query(
    `WITH mine AS (
       SELECT ts.batch_id FROM task_snapshots ts WHERE ts.batch_id = ANY($1::uuid[]) ORDER BY ts.batch_id FOR UPDATE SKIP LOCKED
     ), stored AS (
       UPDATE task_snapshots ts SET computed_for = $3::date, overdue_count = v.overdue, today_count = v.today
         FROM unnest($1::uuid[], $2::bigint[], $4::int[], $5::int[]) AS v(batch_id, version, overdue, today), mine
        WHERE ts.batch_id = v.batch_id AND mine.batch_id = v.batch_id AND ts.inputs_version = v.version
        RETURNING ts.batch_id)
     SELECT batch_id FROM stored`,
    [batchIds, stale.map((s) => s.inputs_version), today, batchIds.map((id) => counts.get(id)!.overdue), batchIds.map((id) => counts.get(id)!.today)],
  );
  if (written.length === 0) return 0;
  const writtenIds = new Set(written.map((w) => w.batch_id));
  await tx.query(`DELETE FROM snapshot_tasks WHERE batch_id = ANY($1::uuid[])`, [[...writtenIds]]);
  const kept = rows.filter(({ task }) => writtenIds.has(task.batch.id));
  for (let i = 0; i < kept.length; i += ROWS_PER_INSERT) {
    // One JSON document per statement: PostgreSQL parses it once, quicker than many arrays.
    const chunk = kept.slice(i, i + ROWS_PER_INSERT).map(({ task, repeats }) => ({
      batch_id: task.batch.id,
      task_key: task.key,
      bucket: BUCKET_NUMBER[task.bucket],
      closed_order: task.bucket === 'done' ? task.closed!.at : null,
      sort_on: effectiveDate(task),
      due_on: task.dueOn,
      repeats,
    }));
    await tx.query(
      `INSERT INTO snapshot_tasks (batch_id, cellar_id, task_key, bucket, closed_order, sort_on, due_on, repeats)
       SELECT x.batch_id, $2, x.task_key, x.bucket, x.closed_order, x.sort_on, x.due_on, x.repeats FROM jsonb_to_recordset($1::jsonb)
         AS x(batch_id uuid, task_key text, bucket smallint, closed_order text, sort_on date, due_on date, repeats boolean)`,
      [JSON.stringify(chunk), actor.cellarId],
    );
  }
  // A day's first refresh rewrites most rows: fresh statistics keep the page's plans (index walks, a hash join to count).
  if (writtenIds.size >= ANALYZE_AFTER_BATCHES) await tx.query(`ANALYZE task_snapshots, snapshot_tasks`);
  return writtenIds.size;
}

/** What a page of the list is: the buckets, and the horizon of upcoming work. */
export interface PageQuery {
  timeZone: string;
  today: string;
  buckets: TaskBucket[];
  horizon: string;
  limit: number;
}

/**
 * One page of the list from the batches whose snapshot is current, in the list's order
 * (bucket; closed work newest first; then the day it is due or snoozed to, and the key), and how
 * many tasks pass the filter in all; null if a task on the page could not be found again (the
 * caller then works the whole list out). The snapshot says which tasks are on the page; they
 * are then worked out for their few batches, so each is exactly what the journal gives now.
 */
export async function snapshotPage(
  tx: EntityManager,
  cellarId: string,
  scope: TaskScope,
  page: PageQuery,
): Promise<{ tasks: Task[]; total: number } | null> {
  if (page.buckets.length === 0) return { tasks: [], total: 0 };
  const params: unknown[] = [cellarId];
  const where = scopeConditions(scope, params);
  const p = (value: unknown) => `$${params.push(value)}`;
  const [today, limit] = [p(page.today), p(page.limit)];
  // Sent only if a bucket asked for uses it: PostgreSQL refuses a parameter it never sees.
  let horizonParam: string | undefined;
  const horizon = () => (horizonParam ??= p(page.horizon));
  const current = `ts.computed_for = ${today}::date AND ${where.join(' AND ')}`;
  // What else a bucket asks: upcoming work within the horizon, and repeats only that far.
  const beyond = () => `NOT (st.repeats AND st.due_on > ${horizon()}::date)`;
  const filters: Record<TaskBucket, () => string> = {
    overdue: () => 'true',
    today: () => 'true',
    upcoming: () => `st.sort_on <= ${horizon()}::date AND ${beyond()}`,
    done: beyond,
  };
  const order = `closed_order DESC NULLS LAST, sort_on, task_key`;
  // Each bucket walks its part of the index in the list's order until the page is full.
  const walks = page.buckets.map(
    (bucket) =>
      `(SELECT st.batch_id, st.task_key, st.bucket, st.closed_order, st.sort_on FROM snapshot_tasks st
         WHERE st.cellar_id = $1 AND st.bucket = ${BUCKET_NUMBER[bucket]} AND ${filters[bucket]()}
           AND EXISTS (SELECT 1 FROM task_snapshots ts JOIN batches b ON b.id = ts.batch_id WHERE ts.batch_id = st.batch_id AND ${current})
         ORDER BY ${order} LIMIT ${limit})`,
  );
  // Overdue and today's tasks are counted per batch when stored; the rest are counted here.
  const counted = page.buckets.filter((b) => b === 'upcoming' || b === 'done');
  const perBatch = [page.buckets.includes('overdue') ? 'ts.overdue_count' : '0', page.buckets.includes('today') ? 'ts.today_count' : '0'];
  const rows: { batch_id: string; task_key: string; total: string }[] = await tx.query(
    `WITH fresh AS MATERIALIZED (
       SELECT b.id, ${perBatch.join(' + ')} AS stored FROM batches b JOIN task_snapshots ts ON ts.batch_id = b.id WHERE ${current}
     ), total AS (
       SELECT (SELECT coalesce(sum(stored), 0) FROM fresh)
            + ${
              counted.length === 0
                ? '0'
                : `(SELECT count(*) FROM snapshot_tasks st JOIN fresh f ON f.id = st.batch_id WHERE st.cellar_id = $1
                     AND (${counted.map((b) => `(st.bucket = ${BUCKET_NUMBER[b]} AND ${filters[b]()})`).join(' OR ')}))`
            } AS n
     )
     SELECT top.batch_id, top.task_key, (SELECT n FROM total) AS total
       FROM (${walks.join(' UNION ALL ')}) top
      ORDER BY top.bucket, top.${order.replaceAll(', ', ', top.')} LIMIT ${limit}`,
    params,
  );
  if (rows.length === 0) return { tasks: [], total: 0 };
  const batchIds = [...new Set(rows.map((r) => r.batch_id))];
  const worked = await cellarTasks(tx, cellarId, page.timeZone, { batchIds }, page.today, SNAPSHOT_LOOKAHEAD_DAYS);
  const byKey = new Map(worked.map((t) => [t.key, t]));
  const tasks = rows.map((r) => byKey.get(r.task_key));
  if (tasks.some((t) => t === undefined)) return null;
  return { tasks: tasks as Task[], total: Number(rows[0]!.total) };
}
