import { beforeAll, describe, expect, it } from 'vitest';
import type { Actor } from '../../server/core/actor';
import { inTransaction } from '../../server/core/unit-of-work';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { seedDemoTasks } from '../../server/seed/demo-tasks';
import { refreshEveryCellarsTaskSnapshots } from '../../server/tasks/task-snapshot-job';
import { batchesWithoutSnapshot, refreshTaskSnapshots } from '../../server/tasks/task-snapshots';
import { addOneOffTask, dismissTask, listTasks, markTaskDone, snoozeTask } from '../../server/tasks/tasks.service';
import { addDays } from '../../shared/domain/plans/local-dates';
import { taskListQuerySchema, type TaskList, type TaskListQuery } from '../../shared/schemas/tasks';
import { contextOf, crewWithAgents, type Crew } from '../helpers/crew';
import { makeBatch } from '../helpers/batches';
import { testApp } from '../helpers/test-app';

/**
 * The stored task snapshots are a cache of the rule engine's answer: a list read from them is
 * the list worked out from the journal, for every filter; they are used only while current, and
 * every change to what tasks are computed from puts the batches it touches out of date.
 */

let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let demo: Crew;
let keeper: Actor;
let hand: Actor;

const list = (query: TaskListQuery): Promise<TaskList> => inTransaction(ds, 'read', (tx) => listTasks(hand, tx, taskListQuerySchema.parse(query)));
const refresh = (): Promise<number> => inTransaction(ds, 'write', (tx) => refreshTaskSnapshots(hand, tx));
const outOfDate = async (): Promise<string[]> =>
  inTransaction(ds, 'read', async (tx) => {
    const { today } = await list({ limit: 1 });
    return (await batchesWithoutSnapshot(tx, demo.cellar.id, {}, today)).sort();
  });
const forgetSnapshots = (where = 'true') =>
  ds.query(`UPDATE task_snapshots SET computed_for = NULL WHERE batch_id IN (SELECT id FROM batches WHERE cellar_id = $1) AND ${where}`, [
    demo.cellar.id,
  ]);
const batchIds = async (): Promise<string[]> =>
  ((await ds.query(`SELECT id FROM batches WHERE cellar_id = $1 AND stage <> 'finished' ORDER BY id`, [demo.cellar.id])) as { id: string }[]).map(
    (r) => r.id,
  );

beforeAll(async () => {
  let app;
  ({ app, ds } = await testApp());
  demo = await crewWithAgents(app, ds);
  keeper = contextOf(demo, 'keeper');
  hand = contextOf(demo, 'hand');
  await ds.transaction(async (tx) => {
    await seedDemoRecords(tx, { keeper, hand });
    await seedDemoTasks(tx, { keeper, hand });
  });
  // Every kind of state a person can leave on a task, and a one-off task, besides the demo's snooze.
  const all = await list({ buckets: 'overdue,today,upcoming', withinDays: 60 });
  const open = all.tasks.filter((t) => t.status === 'open');
  // A repeat marked done before it falls due: closed after an overdue task, yet due after it, and past a short horizon.
  const nextReading = open.find((t) => t.bucket === 'upcoming' && t.key.includes('/weekly-reading/'));
  expect(nextReading).toBeDefined();
  // Closed one after the other (each its own moment), the latest due last.
  await inTransaction(ds, 'write', (tx) => markTaskDone(hand, tx, open[0]!.key));
  await inTransaction(ds, 'write', (tx) => markTaskDone(hand, tx, nextReading!.key));
  await inTransaction(ds, 'write', async (tx) => {
    await dismissTask(hand, tx, open[1]!.key, 'done another way');
    await snoozeTask(hand, tx, open.at(-1)!.key, addDays(all.today, 1));
    await addOneOffTask(keeper, tx, { batchId: open[2]!.batch.id, title: 'Buy new airlocks', dueOn: addDays(all.today, 3), showDaysAhead: 3 });
    // Two tasks due today, on two batches: today's count is stored per batch.
    await addOneOffTask(keeper, tx, { batchId: open[2]!.batch.id, title: 'Rinse the funnel', dueOn: all.today, showDaysAhead: 0 });
    await addOneOffTask(keeper, tx, { batchId: open[0]!.batch.id, title: 'Label the jugs', dueOn: all.today, showDaysAhead: 0 });
  });
});

describe('a list read from the snapshots', () => {
  const queries: TaskListQuery[] = [
    {},
    { buckets: 'overdue,today,upcoming,done', withinDays: 14 },
    { buckets: 'overdue,today', withinDays: 14, limit: 50 },
    { withinDays: 0 },
    { buckets: '' },
    { buckets: 'overdue,today,upcoming,done', withinDays: 120 },
    { buckets: 'done' },
    // A page cut inside each bucket: the SQL's order decides which tasks make it.
    { buckets: 'done', limit: 2 },
    { buckets: 'done', withinDays: 0 },
    { buckets: 'upcoming', limit: 2 },
    { buckets: 'overdue', limit: 2 },
    { buckets: 'today', limit: 1 },
    { buckets: 'overdue,today,upcoming,done', limit: 3 },
    { kind: 'melomel', buckets: 'overdue,today,upcoming,done' },
  ];

  it('is the list worked out from the journal, for every filter, with all, none or half the batches stored', async () => {
    const racks: { id: string }[] = await ds.query(`SELECT id FROM racks WHERE cellar_id = $1`, [demo.cellar.id]);
    const [firstBatch] = await batchIds();
    const all = [...queries, { rackId: racks[0]!.id, buckets: 'overdue,today,upcoming,done' }, { batchId: firstBatch, withinDays: 120 }];
    await forgetSnapshots();
    const worked = [];
    for (const query of all) worked.push(await list(query));
    expect(worked.some((l) => l.tasks.some((t) => t.status === 'dismissed'))).toBe(true);
    expect(worked.some((l) => l.more > 0)).toBe(true);
    expect(worked.filter((l) => l.tasks.length === 2 && l.more > 0)).toHaveLength(3);
    expect(worked.find((l) => l.tasks.length === 1 && l.tasks[0]!.bucket === 'today')!.more).toBeGreaterThan(0);

    expect(await refresh()).toBe((await batchIds()).length);
    expect(await outOfDate()).toEqual([]);
    for (const [i, query] of all.entries()) expect([query, await list(query)]).toEqual([query, worked[i]]);

    await forgetSnapshots(`batch_id::text < '8'`);
    expect((await outOfDate()).length).toBeGreaterThan(0);
    for (const [i, query] of all.entries()) expect([query, await list(query)]).toEqual([query, worked[i]]);
  });

  it('takes the page from the stored rows while they are current, and never once they are out of date or from another day', async () => {
    await refresh();
    const overdue = (await list({ buckets: 'overdue' })).tasks.map((t) => t.key);
    expect(overdue.length).toBeGreaterThan(2);
    const last = overdue.at(-1)!;
    const batchOfLast = last.split('/')[0];
    // Current: a stored row moved to the front of its bucket makes the page of one (so the list
    // really reads them; the page is then put in order from the tasks themselves).
    const firstOverdue = async () => (await list({ buckets: 'overdue', limit: 1 })).tasks.map((t) => t.key);
    await ds.query(`UPDATE snapshot_tasks SET sort_on = '2000-01-01' WHERE task_key = $1`, [last]);
    expect(await firstOverdue()).toEqual([last]);
    // Yesterday's snapshot is worked out again.
    await ds.query(`UPDATE task_snapshots SET computed_for = computed_for - 1 WHERE batch_id = $1`, [batchOfLast]);
    expect(await firstOverdue()).toEqual([overdue[0]]);
    // A refresh writes it anew.
    expect(await refresh()).toBe(1);
    expect(await firstOverdue()).toEqual([overdue[0]]);
  });

  it('is worked out from the journal whole when a stored task cannot be found again', async () => {
    await refresh();
    const query = { buckets: 'overdue,today,upcoming,done' };
    const before = await list(query);
    const [first] = before.tasks;
    await ds.query(`UPDATE snapshot_tasks SET task_key = $2 WHERE task_key = $1`, [first!.key, `${first!.batch.id}/no-such-rule/0`]);
    expect(await list(query)).toEqual(before);
  });
});

describe('what puts a snapshot out of date', () => {
  it('a journal entry, a task state and a one-off task put their batch out of date; a plan or the time zone puts every batch', async () => {
    const ids = await batchIds();
    // A batch still in its vessels takes a reading.
    const [{ id: one }]: { id: string }[] = await ds.query(
      `SELECT id FROM batches WHERE cellar_id = $1 AND stage IN ('primary', 'secondary', 'bulk-ageing') ORDER BY id LIMIT 1`,
      [demo.cellar.id],
    );
    const waiting = (await list({})).tasks.find((t) => t.status === 'open' && t.batch.id !== one)!;
    const two = waiting.batch.id;
    const three = ids.find((id) => id !== one && id !== two);
    const changes: { change: () => Promise<unknown>; expected: string[] }[] = [
      {
        change: () =>
          demo.as.hand
            .post(`${demo.batches}/${one}/readings`)
            .send({ sg: 1.01 })
            .then((r) => expect(r.status).toBe(201)),
        expected: [one],
      },
      {
        change: async () => {
          const { today } = await list({ limit: 1 });
          await inTransaction(ds, 'write', (tx) => snoozeTask(hand, tx, waiting.key, addDays(today, 5)));
        },
        expected: [two],
      },
      {
        change: () =>
          inTransaction(ds, 'write', (tx) =>
            addOneOffTask(keeper, tx, { batchId: three!, title: 'Clean the bung', dueOn: '2027-01-04', showDaysAhead: 2 }),
          ),
        expected: [three!],
      },
      {
        // The demo's batches follow their kind's default plan (no plan_id): name one.
        change: () =>
          ds.query(`UPDATE batches SET plan_id = (SELECT id FROM plans WHERE cellar_id = $2 ORDER BY name DESC LIMIT 1) WHERE id = $1`, [
            one,
            demo.cellar.id,
          ]),
        expected: [one],
      },
      {
        change: () =>
          ds.query(`UPDATE plans SET name = name || ' (edited)' WHERE id = (SELECT id FROM plans WHERE cellar_id = $1 LIMIT 1)`, [demo.cellar.id]),
        expected: ids,
      },
      { change: () => ds.query(`UPDATE cellars SET time_zone = 'Pacific/Auckland' WHERE id = $1`, [demo.cellar.id]), expected: ids },
    ];
    for (const [i, { change, expected }] of changes.entries()) {
      await refresh();
      expect(await outOfDate()).toEqual([]);
      await change();
      expect([i, await outOfDate()]).toEqual([i, [...expected].sort()]);
    }
    // A new batch has no snapshot until the next refresh.
    await refresh();
    const added = await makeBatch(ds, demo.cellar.id, { name: 'Fresh cyser' });
    expect(await outOfDate()).toEqual([added.id]);
    await refresh();
    expect(await outOfDate()).toEqual([]);
  });

  it('a change to an unrelated column (the batch’s notes) leaves its snapshot current', async () => {
    await refresh();
    const [one] = await batchIds();
    await ds.query(`UPDATE batches SET notes = 'Smells of honey' WHERE id = $1`, [one]);
    expect(await outOfDate()).toEqual([]);
  });
});

describe('the scheduled refresh', () => {
  it('brings every cellar’s out-of-date snapshots up to date', async () => {
    await forgetSnapshots();
    const active = (await batchIds()).length;
    // Other test files share the database: their cellars may be refreshed too.
    expect(await refreshEveryCellarsTaskSnapshots(ds)).toBeGreaterThanOrEqual(active);
    expect(await outOfDate()).toEqual([]);
    expect(await refresh()).toBe(0);
  });
});
