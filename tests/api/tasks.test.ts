import { beforeAll, describe, expect, it } from 'vitest';
import { taskListSchema, taskSchema, type Task, type TaskListQuery } from '../../shared/schemas/tasks';
import type { Agent, Crew } from '../helpers/crew';
import { batchInVessels } from '../helpers/batches';
import { contextOf, crewWithAgents } from '../helpers/crew';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { seedDemoTasks } from '../../server/seed/demo-tasks';
import { daysAgo } from '../helpers/dates';
import { testApp } from '../helpers/test-app';
import { sanitisedVessel } from '../helpers/vessels';

/**
 * Tasks over HTTP: derived from the default plans (common practice: a reading weekly in
 * primary, racking after 30 days, a headspace check 3 days after each racking, the oak out on
 * its date) and the journal; done, snooze, dismiss and undo; the gate's answers.
 */

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

const tasksUrl = (c: Crew = crew) => `/api/cellars/${c.cellar.id}/tasks`;

async function tasksOf(agent: Agent, query: TaskListQuery & { buckets?: string } = {}, c: Crew = crew): Promise<Task[]> {
  const res = await agent.get(tasksUrl(c)).query(query);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return taskListSchema.parse(res.body).tasks;
}

const allBuckets = 'overdue,today,upcoming,done';

async function taskOf(batchId: string, key: string): Promise<Task | undefined> {
  return (await tasksOf(crew.as.guest, { batchId, buckets: allBuckets })).find((t) => t.key === key);
}

describe('GET /tasks', () => {
  it('lists the overdue weekly reading of a batch in primary, and a logged reading completes it', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(10) });
    const id = result.batch.id;
    const key = `${id}/weekly-reading/primary.0`;
    // A week after the start (common practice): 3 days ago.
    expect(await taskOf(id, key)).toMatchObject({ what: 'reading', dueOn: daysAgo(3), bucket: 'overdue', status: 'open', closed: null });
    expect((await taskOf(id, `${id}/weekly-reading/primary.1`))!.dueOn).toBe(daysAgo(-4));

    await crew.as.hand.post(`${crew.batches}/${id}/readings`).send({ sg: 1.05 }).expect(201);
    expect(await taskOf(id, key)).toMatchObject({
      status: 'done',
      bucket: 'done',
      closed: { byJournal: true, by: null, reason: 'a reading was logged' },
    });
    // The next week's reading is still to do.
    expect(await taskOf(id, `${id}/weekly-reading/primary.1`)).toMatchObject({ status: 'open', bucket: 'upcoming' });
  });

  it('counts a reading logged the day the next weekly reading shows for that one, and the missed one is no longer overdue', async () => {
    // Started 13 days ago: readings due 6 days ago (missed) and tomorrow, shown a day ahead, so from today.
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(13) });
    const id = result.batch.id;
    expect(await taskOf(id, `${id}/weekly-reading/primary.0`)).toMatchObject({ dueOn: daysAgo(6), bucket: 'overdue', status: 'open' });

    await crew.as.hand.post(`${crew.batches}/${id}/readings`).send({ sg: 1.05 }).expect(201);
    expect(await taskOf(id, `${id}/weekly-reading/primary.1`)).toMatchObject({ dueOn: daysAgo(-1), status: 'done', closed: { byJournal: true } });
    expect(await taskOf(id, `${id}/weekly-reading/primary.0`)).toBeUndefined();
    // Nothing about readings is left to do now, looking two weeks ahead (Today) or only at today (the reminder mail).
    for (const withinDays of [14, 0]) {
      const due = await tasksOf(crew.as.guest, { batchId: id, buckets: 'overdue,today', withinDays });
      expect(due.filter((t) => t.what === 'reading')).toEqual([]);
    }
  });

  it('completes the first racking with a racking, which brings a headspace check 3 days later', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(40) });
    const id = result.batch.id;
    expect(await taskOf(id, `${id}/rack-off-primary/start`)).toMatchObject({ dueOn: daysAgo(10), bucket: 'overdue' });
    const target = await sanitisedVessel(ds, crew.cellar.id, { capacityL: 21 });
    const racked = await crew.as.hand
      .post(`${crew.batches}/${id}/rackings`)
      .send({ from: [{ vesselId: vessels[0]!.id }], to: [{ vesselId: target.id, volumeL: 19.5 }] })
      .expect(201);
    expect((await taskOf(id, `${id}/rack-off-primary/start`))!.closed).toMatchObject({ byJournal: true, reason: 'the batch was racked' });
    expect(await taskOf(id, `${id}/headspace-after-racking/${racked.body.entryId}`)).toMatchObject({
      what: 'headspace-check',
      dueOn: daysAgo(-3),
      status: 'open',
      vesselNames: [target.name],
    });
  });

  /** A batch 50 days in, with oak put in that is to come out in 5 days: the batch, the addition and its take-out task's key. */
  async function batchWithOak(name: string) {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(50) });
    const id = result.batch.id;
    const added = await crew.as.hand
      .post(`${crew.batches}/${id}/additions`)
      .send({ category: 'oak', name, amount: 30, unit: 'g', removeOn: daysAgo(-5) })
      .expect(201);
    return { id, added, key: `${id}/oak-out/${added.body.entryId}` };
  }

  it('reminds to take the oak out on the date the form asked for', async () => {
    const { id, added, key } = await batchWithOak('Medium toast oak cubes');
    expect(await taskOf(id, key)).toMatchObject({ what: 'oak-out', title: 'Take out Medium toast oak cubes', dueOn: daysAgo(-5), status: 'open' });
    await crew.as.hand.post(`${crew.batches}/${id}/removals`).send({ additionEntryId: added.body.entryId }).expect(201);
    expect(await taskOf(id, key)).toMatchObject({ status: 'done', closed: { byJournal: true } });
  });

  it('follows a corrected take-out date, the later of two corrections winning', async () => {
    const { id, added, key } = await batchWithOak('Oak spiral');
    const amend = (removeOn: string) =>
      crew.as.keeper
        .post(`${crew.batches}/${id}/journal/${added.body.entryId}/amendments`)
        .send({ reason: 'Misread the calendar', changes: { removeOn } })
        .expect(201);
    await amend(daysAgo(-9));
    await amend(daysAgo(-12));
    expect(await taskOf(id, key)).toMatchObject({ what: 'oak-out', dueOn: daysAgo(-12), status: 'open' });
  });

  it('filters by batch and answers a field error for a bad filter', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(35) });
    const tasks = await tasksOf(crew.as.guest, { batchId: result.batch.id });
    expect(tasks.length).toBeGreaterThan(0);
    expect(tasks.every((t) => t.batch.id === result.batch.id)).toBe(true);
    const res = await crew.as.guest.get(tasksUrl()).query({ batchId: 'nope' });
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('query.batchId');
  });
});

describe('done, snooze, dismiss and undo', () => {
  let id: string;
  let key: string;

  beforeAll(async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(35) });
    id = result.batch.id;
    key = `${id}/rack-off-primary/start`;
  });

  const act = (agent: Agent, action: string, body: Record<string, unknown>, c: Crew = crew) => agent.post(`${tasksUrl(c)}/${action}`).send(body);

  it('lets a Hand snooze to a later day, dismiss with a reason, undo, and mark done', async () => {
    const snoozed = await act(crew.as.hand, 'snooze', { key, until: daysAgo(-2) }).expect(200);
    expect(taskSchema.parse(snoozed.body)).toMatchObject({ status: 'snoozed', snoozedUntil: daysAgo(-2), bucket: 'upcoming' });

    const dismissed = await act(crew.as.hand, 'dismiss', { key, reason: 'racked it into the spare keg' }).expect(200);
    expect(dismissed.body).toMatchObject({
      status: 'dismissed',
      bucket: 'done',
      closed: { by: 'Hal Hand', byJournal: false, reason: 'racked it into the spare keg' },
    });
    expect((await tasksOf(crew.as.guest, { batchId: id })).some((t) => t.key === key)).toBe(false);

    const reopened = await act(crew.as.hand, 'reopen', { key }).expect(200);
    expect(reopened.body).toMatchObject({ status: 'open', bucket: 'overdue', closed: null });

    const done = await act(crew.as.hand, 'done', { key }).expect(200);
    expect(done.body).toMatchObject({ status: 'done', closed: { by: 'Hal Hand', byJournal: false } });
    await act(crew.as.hand, 'reopen', { key }).expect(200);
  });

  it('takes a missed task of the same work off the list when the next one, shown today, is marked done by hand', async () => {
    // Started 13 days ago: readings due 6 days ago (missed) and tomorrow, shown a day ahead, so from today.
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(13) });
    const batchId = result.batch.id;
    const missed = `${batchId}/weekly-reading/primary.0`;
    const next = `${batchId}/weekly-reading/primary.1`;
    const openReadings = async (withinDays: number) =>
      (await tasksOf(crew.as.guest, { batchId, buckets: 'overdue,today,upcoming', withinDays }))
        .filter((t) => t.what === 'reading' && t.status === 'open')
        .map((t) => t.key);
    expect(await openReadings(0)).toEqual([missed]);

    await act(crew.as.hand, 'done', { key: next }).expect(200);
    // Today (two weeks ahead) and the reminder mail (today only) agree: nothing is overdue.
    expect(await openReadings(14)).toEqual([`${batchId}/weekly-reading/primary.2`]);
    expect(await openReadings(0)).toEqual([]);
    expect(await taskOf(batchId, next)).toMatchObject({ status: 'done', closed: { by: 'Hal Hand', byJournal: false } });

    // Undone, the missed one is back.
    await act(crew.as.hand, 'reopen', { key: next }).expect(200);
    expect(await openReadings(0)).toEqual([missed]);
  });

  it('refuses snoozing into the past or to today, naming the field', async () => {
    for (const until of [daysAgo(1), daysAgo(0)]) {
      const res = await act(crew.as.hand, 'snooze', { key, until });
      expect(res.status).toBe(400);
      expect(res.body.issues).toEqual([{ path: 'body.until', message: expect.stringContaining('a day after today') }]);
    }
  });

  it('lets a Guest see tasks but not act on them (403), and hides another cellar’s task (404)', async () => {
    expect((await act(crew.as.guest, 'done', { key })).status).toBe(403);
    expect((await act(other.as.keeper, 'done', { key }, other)).status).toBe(404);
    expect((await act(crew.as.hand, 'done', { key: `${id}/no-such-rule/start` })).status).toBe(404);
    expect((await act(crew.as.hand, 'done', { key: 'not a key' })).status).toBe(400);
  });

  it('lets a Keeper add a one-off task to a batch; a Hand may not', async () => {
    const body = { batchId: id, title: 'Order more corks', dueOn: daysAgo(-1) };
    expect((await act(crew.as.hand, 'one-off', body)).status).toBe(403);
    const res = await act(crew.as.keeper, 'one-off', body).expect(201);
    expect(taskSchema.parse(res.body)).toMatchObject({ what: 'custom', title: 'Order more corks', dueOn: daysAgo(-1), rule: null, status: 'open' });
    expect((await tasksOf(crew.as.guest, { batchId: id })).map((t) => t.title)).toContain('Order more corks');
    expect((await act(other.as.keeper, 'one-off', body, other)).status).toBe(404);
  });
});

describe('the demo cellar', () => {
  it('shows overdue and due tasks, one snoozed and one done by a logged reading', async () => {
    const demo = await crewWithAgents(app, ds);
    const people = { keeper: contextOf(demo, 'keeper'), hand: contextOf(demo, 'hand') };
    await ds.transaction(async (tx) => {
      await seedDemoRecords(tx, people);
      await seedDemoTasks(tx, people);
    });
    const tasks = await tasksOf(demo.as.guest, { buckets: allBuckets, withinDays: 14 }, demo);
    const byBatch = (name: string) => tasks.filter((t) => t.batch.name === name);
    // The metheglin was last racked more than 90 days ago (demo-records): racking again is overdue (common practice).
    expect(byBatch('Linden Blossom Metheglin').find((t) => t.what === 'racking')).toMatchObject({ bucket: 'overdue', status: 'open' });
    // The bottled cider has no work on the liquid left, only its milestones in bottle.
    expect(byBatch('Orchard Gate Cider').every((t) => t.what === 'milestone')).toBe(true);
    // The traditional's first weekly reading (day 7) was done by the reading of day 6.
    expect(byBatch('Hawthorn Hollow Traditional').find((t) => t.key.endsWith('weekly-reading/primary.0'))).toMatchObject({
      status: 'done',
      closed: { byJournal: true },
    });
    expect(tasks.filter((t) => t.status === 'snoozed')).toHaveLength(1);
    expect(byBatch('Blackcurrant Melomel').find((t) => t.what === 'oak-out')).toMatchObject({ status: 'open', bucket: 'upcoming' });
    expect(tasks.filter((t) => t.bucket === 'overdue' || t.bucket === 'today').length).toBeGreaterThanOrEqual(2);
  });
});
