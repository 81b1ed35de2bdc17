import { beforeAll, describe, expect, it } from 'vitest';
import { batchPlanSchema, planListSchema, planSchema, type Plan, type PlanRuleInput } from '../../shared/schemas/plans';
import { taskListSchema } from '../../shared/schemas/tasks';
import { batchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { daysAgo } from '../helpers/dates';
import { testApp } from '../helpers/test-app';
import { AgeMilestoneTitles1796171400000 } from '../../server/db/migrations/1796171400000-AgeMilestoneTitles';

/** Plans over HTTP: the default plans, a Keeper's edits (batches' tasks follow), assigning, bad input. */

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

const plansUrl = (c: Crew = crew) => `/api/cellars/${c.cellar.id}/plans`;

async function plansOf(c: Crew = crew): Promise<Plan[]> {
  const res = await c.as.guest.get(plansUrl(c)).expect(200);
  return planListSchema.parse(res.body);
}

const rule = (over: Record<string, unknown> = {}): PlanRuleInput =>
  ({
    id: 'check',
    what: 'reading',
    when: { type: 'after', anchor: 'start', after: { count: 7, unit: 'days' } },
    showDaysAhead: 1,
    ...over,
  }) as PlanRuleInput;

describe('the default plans', () => {
  it('gives each cellar a plan for mead, fruit wine and cider, every rule noted as common practice', async () => {
    const plans = await plansOf();
    expect(plans.map((p) => [p.name, p.defaultFor.includes('melomel'), p.defaultFor.includes('cider')])).toEqual([
      ['Cider', false, true],
      ['Fruit wine', false, false],
      ['Mead', true, false],
    ]);
    for (const p of plans) for (const r of p.rules) expect(r.note).toMatch(/^Common practice/);
    // Reads never write: the plans keep their ids once a Keeper's first change writes them.
    await crew.as.keeper
      .post(plansUrl())
      .send({ name: 'Spare plan', rules: [rule()] })
      .expect(201);
    expect((await plansOf()).filter((p) => p.name !== 'Spare plan').map((p) => p.id)).toEqual(plans.map((p) => p.id));
    // Another cellar has its own copies.
    const theirs = await plansOf(other);
    expect(theirs.map((p) => p.id).some((id) => plans.some((p) => p.id === id))).toBe(false);
  });
});

describe('the age milestones', () => {
  it('are named for what they count from, with no colon of their own before the rule’s words', async () => {
    const mead = (await plansOf(other)).find((p) => p.name === 'Mead')!;
    expect(mead.rules.filter((r) => r.what === 'milestone').map((r) => [r.title, r.when])).toEqual([
      ...[3, 6, 12].map((n) => [`Taste it at ${n} months old`, { type: 'after', anchor: 'start', after: { count: n, unit: 'months' } }]),
      ...[6, 12].map((n) => [`Open one at ${n} months in bottle`, { type: 'after', anchor: 'bottling', after: { count: n, unit: 'months' } }]),
    ]);
  });

  it('are renamed in plans a cellar already wrote, unless a Keeper wrote the title', async () => {
    type Row = { rules: { id: string; title: string }[]; version: number };
    const rollback = new Error('rollback');
    const stored = [
      { id: 'bulk-3-months', title: '3 months in bulk: taste it' },
      { id: 'bulk-6-months', title: 'Half a year: pour a glass' },
      { id: 'bottle-12-months', title: '12 months in bottle: open one' },
      { id: 'bottle-6-months', title: '12 months in bottle: open one' },
      { id: 'weekly-reading', title: '3 months in bulk: taste it' },
    ].map((r) => ({ ...r, what: 'milestone', when: { type: 'after', anchor: 'start', after: { count: 3, unit: 'months' } }, showDaysAhead: 0 }));
    const seen = await ds
      .transaction(async (tx) => {
        const [{ id }]: { id: string }[] = await tx.query(
          `INSERT INTO plans (cellar_id, name, default_for, rules) VALUES ($1, 'Written before', '{}', $2) RETURNING id`,
          [other.cellar.id, JSON.stringify(stored)],
        );
        const read = async (): Promise<Row> => (await tx.query(`SELECT rules, version FROM plans WHERE id = $1`, [id]))[0];
        const migration = new AgeMilestoneTitles1796171400000();
        await migration.up(tx.queryRunner!);
        const up = await read();
        await migration.down(tx.queryRunner!);
        throw Object.assign(rollback, { up, down: await read() });
      })
      .catch((err: unknown) => (err === rollback ? (rollback as Error & { up: Row; down: Row }) : Promise.reject(err)));
    // Only milestones still titled as the old default for their own months change; order and every other field stay.
    expect(seen.up.rules.map((r) => [r.id, r.title])).toEqual([
      ['bulk-3-months', 'Taste it at 3 months old'],
      ['bulk-6-months', 'Half a year: pour a glass'],
      ['bottle-12-months', 'Open one at 12 months in bottle'],
      ['bottle-6-months', '12 months in bottle: open one'],
      ['weekly-reading', '3 months in bulk: taste it'],
    ]);
    expect(seen.up.rules[0]).toEqual({ ...stored[0], title: 'Taste it at 3 months old' });
    expect(seen.up.version).toBe(2);
    // Down gives the old titles back.
    expect(seen.down.rules).toEqual(stored);
  });
});

describe('editing plans', () => {
  it('lets a Keeper change a rule, and the batches on that plan follow at once', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(25) });
    const id = result.batch.id;
    const racking = async () =>
      taskListSchema
        .parse((await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/tasks`).query({ batchId: id }).expect(200)).body)
        .tasks.find((t) => t.key === `${id}/rack-off-primary/start`);
    // 30 days after the start (common practice): 5 days from now.
    expect(await racking()).toMatchObject({ dueOn: daysAgo(-5), bucket: 'upcoming' });

    const mead = (await plansOf()).find((p) => p.name === 'Mead')!;
    const rules = mead.rules.map((r) =>
      r.id === 'rack-off-primary' ? { ...r, when: { type: 'after', anchor: 'start', after: { count: 20, unit: 'days' } } } : r,
    );
    const res = await crew.as.keeper
      .put(`${plansUrl()}/${mead.id}`)
      .send({ name: 'Mead', defaultFor: mead.defaultFor, rules, expectedVersion: mead.version });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(planSchema.parse(res.body).version).toBe(mead.version + 1);
    expect(await racking()).toMatchObject({ dueOn: daysAgo(5), bucket: 'overdue' });

    // A stale version is refused.
    const stale = await crew.as.keeper
      .put(`${plansUrl()}/${mead.id}`)
      .send({ name: 'Mead', defaultFor: mead.defaultFor, rules, expectedVersion: mead.version });
    expect(stale.status).toBe(409);
  });

  it('refuses a Hand (403) and another cellar’s plan (404)', async () => {
    const mine = (await plansOf())[0]!;
    expect((await crew.as.hand.post(plansUrl()).send({ name: 'Mine', rules: [rule()] })).status).toBe(403);
    expect((await crew.as.hand.put(`${plansUrl()}/${mine.id}`).send({ name: 'X', rules: [rule()] })).status).toBe(403);
    expect((await other.as.keeper.put(`${plansUrl(other)}/${mine.id}`).send({ name: 'X', rules: [rule()] })).status).toBe(404);
    expect((await other.as.keeper.delete(`${plansUrl(other)}/${mine.id}`)).status).toBe(404);
  });

  it('answers bad rules with the field and words a maker reads', async () => {
    const cases: [PlanRuleInput, string, RegExp][] = [
      [rule({ when: { type: 'after', anchor: 'start', after: { count: -3, unit: 'days' } } }), 'body.rules.0.when.after.count', /cannot be negative/],
      [rule({ when: { type: 'every', every: { count: 0, unit: 'weeks' }, while: 'primary' } }), 'body.rules.0.when.every.count', /at least 1/],
      [rule({ when: { type: 'after', anchor: 'start', after: { count: 4000, unit: 'days' } } }), 'body.rules.0.when.after.count', /ten years/],
      [rule({ what: 'juggle' }), 'body.rules.0.what', /choose what the task is/],
      [
        rule({ when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'bulk-ageing' }, until: { stage: 'primary' } }),
        'body.rules.0.until',
        /can never fire/,
      ],
    ];
    for (const [bad, path, message] of cases) {
      const res = await crew.as.keeper.post(plansUrl()).send({ name: 'Bad plan', rules: [bad] });
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe(path);
      expect(res.body.issues[0].message).toMatch(message);
    }
  });
});

describe('assigning a plan to a batch', () => {
  it('follows the default for the kind until a Keeper chooses another, and back', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: daysAgo(3) });
    const url = `${crew.batches}/${result.batch.id}/plan`;
    expect(batchPlanSchema.parse((await crew.as.guest.get(url).expect(200)).body)).toMatchObject({ plan: { name: 'Mead' }, byDefault: true });

    const quick = planSchema.parse(
      (
        await crew.as.keeper
          .post(plansUrl())
          .send({
            name: 'Quick check',
            rules: [
              rule({ id: 'day-two', title: 'Smell it', what: 'custom', when: { type: 'after', anchor: 'start', after: { count: 2, unit: 'days' } } }),
            ],
          })
          .expect(201)
      ).body,
    );
    expect((await crew.as.hand.put(url).send({ planId: quick.id })).status).toBe(403);
    expect((await crew.as.keeper.put(url).send({ planId: quick.id }).expect(200)).body).toMatchObject({ plan: { id: quick.id }, byDefault: false });
    const tasks = taskListSchema.parse(
      (await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/tasks`).query({ batchId: result.batch.id }).expect(200)).body,
    ).tasks;
    expect(tasks.map((t) => [t.key.split('/')[1], t.title, t.dueOn])).toEqual([['day-two', 'Smell it', daysAgo(1)]]);

    expect((await crew.as.keeper.put(url).send({ planId: null }).expect(200)).body).toMatchObject({ plan: { name: 'Mead' }, byDefault: true });
    expect((await other.as.keeper.put(`${other.batches}/${result.batch.id}/plan`).send({ planId: null })).status).toBe(404);
  });
});
