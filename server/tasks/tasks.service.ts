import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { oneOffTaskRequestSchema, Task, TaskBucket, TaskList, taskListQuerySchema } from '../../shared/schemas/tasks';
import { requireRole, type Actor } from '../core/actor';
import { BadRequestError, NotFoundError } from '../http/errors';
import { cellarTasks } from './cellar-tasks';
import { cellarToday, findTask } from './task-lookup';
import { batchesWithoutSnapshot, BUCKET_NUMBER, DONE_SHOWN_DAYS, effectiveDate, SNAPSHOT_LOOKAHEAD_DAYS, snapshotPage } from './task-snapshots';

type TaskListQuery = z.output<typeof taskListQuerySchema>;
type OneOffTaskRequest = z.output<typeof oneOffTaskRequestSchema>;

/** The list's order: overdue, today, upcoming, done; closed work newest first, the rest soonest first. */
function listOrder(a: Task, b: Task): number {
  const byBucket = BUCKET_NUMBER[a.bucket] - BUCKET_NUMBER[b.bucket];
  if (byBucket !== 0) return byBucket;
  if (a.bucket === 'done') {
    if (a.closed!.at !== b.closed!.at) return a.closed!.at < b.closed!.at ? 1 : -1;
    if (a.dueOn !== b.dueOn) return a.dueOn < b.dueOn ? -1 : 1;
    return a.key < b.key ? -1 : a.key > b.key ? 1 : 0;
  }
  return effectiveDate(a) < effectiveDate(b) ? -1 : effectiveDate(a) > effectiveDate(b) ? 1 : a.key < b.key ? -1 : 1;
}

/**
 * The Tasks screen: overdue, today's and upcoming tasks (within `withinDays`), and recently
 * closed ones when asked, narrowed to a batch, a kind of batch or a rack. Batches with a
 * current snapshot (task-snapshots.ts) come as one sorted page from SQL; the others are worked
 * out from their journal here and merged in, so the answer is the same either way.
 */
export async function listTasks(actor: Actor, tx: EntityManager, query: TaskListQuery): Promise<TaskList> {
  requireRole(actor, 'guest');
  const { timeZone, today } = await cellarToday(tx, actor.cellarId);
  const buckets = new Set<TaskBucket>(query.buckets ?? ['overdue', 'today', 'upcoming']);
  const horizon = addDays(today, query.withinDays);
  const doneSince = addDays(today, -DONE_SHOWN_DAYS);
  const scope = { batchId: query.batchId, kind: query.kind, rackId: query.rackId };
  const stale = query.withinDays <= SNAPSHOT_LOOKAHEAD_DAYS ? await batchesWithoutSnapshot(tx, actor.cellarId, scope, today) : null;
  const page = stale && (await snapshotPage(tx, actor.cellarId, scope, { timeZone, today, buckets: [...buckets], horizon, limit: query.limit }));
  // The batches without a current snapshot are worked out from the journal; all of them when the
  // snapshots cannot answer (a horizon past theirs).
  const worked = !page ? scope : stale!.length > 0 ? { ...scope, batchIds: stale! } : null;
  const derived = worked ? await cellarTasks(tx, actor.cellarId, timeZone, worked, today, query.withinDays) : [];
  const shown = derived
    .filter((t) => buckets.has(t.bucket))
    .filter((t) => (t.bucket === 'upcoming' ? effectiveDate(t) <= horizon : t.bucket !== 'done' || t.closed!.at.slice(0, 10) >= doneSince))
    .sort(listOrder);
  const fromSnapshots = page ?? { tasks: [], total: 0 };
  const tasks = [...fromSnapshots.tasks, ...shown.slice(0, query.limit)].sort(listOrder).slice(0, query.limit);
  const total = fromSnapshots.total + shown.length;
  return { today, tasks, more: Math.max(0, total - query.limit) };
}

/**
 * Open tasks falling due on or before `until` (the cellar's local date), snoozed ones once
 * their snooze ends: what a reminder mail lists. Callable by a system actor from a job.
 */
export async function tasksDue(actor: Actor, tx: EntityManager, options: { until: string; batchId?: string }): Promise<Task[]> {
  requireRole(actor, 'guest');
  const { timeZone, today } = await cellarToday(tx, actor.cellarId);
  const lookahead = Math.max(0, Math.round((Date.parse(options.until) - Date.parse(today)) / 86_400_000));
  const all = await cellarTasks(tx, actor.cellarId, timeZone, { batchId: options.batchId }, today, lookahead);
  return all.filter((t) => (t.status === 'open' || t.status === 'snoozed') && effectiveDate(t) <= options.until);
}

/** Stores what a person did to a task (replacing what was done before). */
async function setState(
  actor: Actor,
  tx: EntityManager,
  task: Task,
  state: { status: 'done' | 'snoozed' | 'dismissed'; snoozedUntil?: string; reason?: string },
): Promise<void> {
  await tx.query(
    `INSERT INTO task_states (cellar_id, batch_id, task_key, status, snoozed_until, reason, by_user_id, at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, now())
     ON CONFLICT (cellar_id, task_key) DO UPDATE SET status = EXCLUDED.status, snoozed_until = EXCLUDED.snoozed_until,
       reason = EXCLUDED.reason, by_user_id = EXCLUDED.by_user_id, at = EXCLUDED.at`,
    [actor.cellarId, task.batch.id, task.key, state.status, state.snoozedUntil ?? null, state.reason ?? '', actor.userId],
  );
}

/** Marks a task done by hand. */
export async function markTaskDone(actor: Actor, tx: EntityManager, key: string): Promise<Task> {
  requireRole(actor, 'hand');
  const { task } = await findTask(actor, tx, key);
  await setState(actor, tx, task, { status: 'done' });
  return (await findTask(actor, tx, key)).task;
}

/** Hides a task until a later day; it comes back open on that day. */
export async function snoozeTask(actor: Actor, tx: EntityManager, key: string, until: string): Promise<Task> {
  requireRole(actor, 'hand');
  const { task, today } = await findTask(actor, tx, key);
  if (until <= today) {
    throw new BadRequestError('Snooze to a day after today.', { issues: [{ path: 'body.until', message: `choose a day after today (${today})` }] });
  }
  await setState(actor, tx, task, { status: 'snoozed', snoozedUntil: until });
  return (await findTask(actor, tx, key)).task;
}

/** Dismisses a task that will not be done, with an optional reason. */
export async function dismissTask(actor: Actor, tx: EntityManager, key: string, reason: string): Promise<Task> {
  requireRole(actor, 'hand');
  const { task } = await findTask(actor, tx, key);
  await setState(actor, tx, task, { status: 'dismissed', reason });
  return (await findTask(actor, tx, key)).task;
}

/** Undoes done, snoozed or dismissed: the task is open again (unless the journal shows it done). */
export async function reopenTask(actor: Actor, tx: EntityManager, key: string): Promise<Task> {
  requireRole(actor, 'hand');
  const { task } = await findTask(actor, tx, key);
  await tx.query(`DELETE FROM task_states WHERE cellar_id = $1 AND task_key = $2`, [actor.cellarId, task.key]);
  return (await findTask(actor, tx, key)).task;
}

/** A task outside any plan, on one batch (a Keeper's call, like the plans). */
export async function addOneOffTask(actor: Actor, tx: EntityManager, request: OneOffTaskRequest): Promise<Task> {
  requireRole(actor, 'keeper');
  const [batch]: { id: string }[] = await tx.query(`SELECT id FROM batches WHERE id = $1 AND cellar_id = $2 AND stage <> 'finished'`, [
    request.batchId,
    actor.cellarId,
  ]);
  if (!batch) throw new NotFoundError('No such batch in this cellar (or it is finished).');
  const [row]: { id: string }[] = await tx.query(
    `INSERT INTO one_off_tasks (cellar_id, batch_id, title, due_on, show_days_ahead, created_by) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [actor.cellarId, batch.id, request.title, request.dueOn, request.showDaysAhead, actor.userId],
  );
  return (await findTask(actor, tx, `${batch.id}/one-off/${row!.id}`)).task;
}
