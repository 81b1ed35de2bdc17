import type { EntityManager } from 'typeorm';
import { computeTasks, type ComputedTask } from '../../shared/domain/plans/compute-tasks';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { Task, TaskBucket, TaskStatus } from '../../shared/schemas/tasks';
import { planFor, plansOf } from '../plans/plan-queries';
import { batchFacts, taskBatches, type TaskBatch, type TaskScope } from './task-facts';

/**
 * A cellar's tasks worked out from the record: each batch's plan and journal through the rule
 * engine, the one-off tasks, and what people did to them (task_states). Lists read the same
 * answer from the day's snapshots where they are current (task-snapshots.ts), which are made here.
 */

interface StateRow {
  task_key: string;
  status: Exclude<TaskStatus, 'open'>;
  snoozed_until: string | null;
  reason: string;
  by_name: string | null;
  at: Date;
}

interface OneOffRow {
  id: string;
  batch_id: string;
  title: string;
  due_on: string;
  show_days_ahead: number;
}

/** Words for the journal entry that completed a task. */
const DONE_BY: Record<ComputedTask['what'], string> = {
  reading: 'a reading was logged',
  racking: 'the batch was racked',
  'headspace-check': 'the batch was topped up',
  'oak-check': '',
  'oak-out': 'it was taken out',
  stabilise: 'a stabiliser was added',
  bottle: 'the batch was bottled',
  tasting: 'a tasting was logged',
  milestone: 'a tasting was logged',
  custom: '',
};

function bucketOf(status: TaskStatus, dueOn: string, snoozedUntil: string | null, today: string): TaskBucket {
  if (status === 'done' || status === 'dismissed') return 'done';
  const effective = status === 'snoozed' && snoozedUntil && snoozedUntil > dueOn ? snoozedUntil : dueOn;
  return effective < today ? 'overdue' : effective === today ? 'today' : 'upcoming';
}

/** Merges a computed (or one-off) task with what people did to it. */
function toTask(batch: TaskBatch, computed: ComputedTask, state: StateRow | undefined, today: string, oneOff: boolean): Task {
  let status: TaskStatus = 'open';
  let closed: Task['closed'] = null;
  let snoozedUntil: string | null = null;
  if (state && state.status !== 'snoozed') {
    status = state.status;
    closed = { by: state.by_name, at: state.at.toISOString(), byJournal: false, reason: state.reason };
  } else if (computed.doneByJournal) {
    status = 'done';
    closed = { by: null, at: computed.doneByJournal.on, byJournal: true, reason: DONE_BY[computed.what] };
  } else if (state?.status === 'snoozed' && state.snoozed_until && state.snoozed_until > today) {
    status = 'snoozed';
    snoozedUntil = state.snoozed_until;
  }
  return {
    key: computed.key,
    batch: { id: batch.id, name: batch.name, kind: batch.kind, stage: batch.stage },
    vesselNames: batch.vesselNames,
    what: computed.what,
    title: computed.title,
    dueOn: computed.dueOn,
    showFrom: computed.showFrom,
    rule: oneOff ? null : { id: computed.ruleId, note: computed.note },
    reason: computed.reason,
    status,
    bucket: bucketOf(status, computed.dueOn, snoozedUntil, today),
    snoozedUntil,
    closed,
  };
}

/** A task as a list shows it, and whether its rule repeats (a list shows repeats only as far as it looks). */
export interface WorkedTask {
  task: Task;
  repeats: boolean;
}

/** Every task of the batches in scope (all statuses), soonest first, worked out from the record. */
export async function workedOutTasks(
  tx: EntityManager,
  cellarId: string,
  timeZone: string,
  scope: TaskScope,
  today: string,
  lookaheadDays: number,
): Promise<WorkedTask[]> {
  const batches = await taskBatches(tx, cellarId, scope);
  if (batches.length === 0) return [];
  const ids = batches.map((b) => b.id);
  const [plans, facts, states, oneOffs] = [
    await plansOf(tx, cellarId),
    await batchFacts(tx, batches, timeZone),
    (await tx.query(
      `SELECT s.task_key, s.status, s.snoozed_until::text AS snoozed_until, s.reason, u.display_name AS by_name, s.at
         FROM task_states s LEFT JOIN users u ON u.id = s.by_user_id WHERE s.cellar_id = $1 AND s.batch_id = ANY($2)`,
      [cellarId, ids],
    )) as StateRow[],
    (await tx.query(
      `SELECT id, batch_id, title, due_on::text AS due_on, show_days_ahead FROM one_off_tasks WHERE cellar_id = $1 AND batch_id = ANY($2)`,
      [cellarId, ids],
    )) as OneOffRow[],
  ];
  const stateOf = new Map(states.map((s) => [s.task_key, s]));
  const doneByHand = new Set(states.filter((s) => s.status === 'done').map((s) => s.task_key));
  const worked: WorkedTask[] = [];
  for (const batch of batches) {
    const { plan } = planFor(plans, batch);
    if (!plan) continue;
    const repeating = new Set(plan.rules.filter((r) => r.when.type === 'every').map((r) => r.id));
    for (const c of computeTasks(plan.rules, facts.get(batch.id)!, { today, lookaheadDays, doneByHand })) {
      worked.push({ task: toTask(batch, c, stateOf.get(c.key), today, false), repeats: repeating.has(c.ruleId) });
    }
  }
  const batchById = new Map(batches.map((b) => [b.id, b]));
  for (const o of oneOffs) {
    const computed: ComputedTask = {
      key: `${o.batch_id}/one-off/${o.id}`,
      ruleId: 'one-off',
      what: 'custom',
      title: o.title,
      dueOn: o.due_on,
      showFrom: addDays(o.due_on, -o.show_days_ahead),
      reason: 'added by hand',
      note: '',
      doneByJournal: null,
    };
    worked.push({ task: toTask(batchById.get(o.batch_id)!, computed, stateOf.get(computed.key), today, true), repeats: false });
  }
  return worked.sort(({ task: a }, { task: b }) => (a.dueOn < b.dueOn ? -1 : a.dueOn > b.dueOn ? 1 : a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
}

/** Every task of the batches in scope (all statuses), soonest first. */
export async function cellarTasks(...args: Parameters<typeof workedOutTasks>): Promise<Task[]> {
  return (await workedOutTasks(...args)).map((w) => w.task);
}
