import { beforeAll, describe, expect, it } from 'vitest';
import { bestVesselForRacking, headspace, rackingLoss } from '../../shared/calc';
import {
  labelCodeSchema,
  rackTargetSuggestionSchema,
  vesselDetailSchema,
  vesselPageSchema,
  vesselSchema,
  type Vessel,
} from '../../shared/schemas/vessels';
import { makeBatch } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { addJournalEntry, reading } from '../helpers/journal';
import { makeRack, placeDirectly } from '../helpers/places';
import { countQueries } from '../helpers/query-count';
import { fillVessel, makeVessel, sanitisedDaysAgo } from '../helpers/vessels';
import { agentsFor, signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let other: CellarCrew;
let as: { keeper: Agent; hand: Agent; guest: Agent };

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  as = await agentsFor(app, crew, TEST_PASSWORD);
});

const vessels = (cellarId = crew.cellar.id) => `/api/cellars/${cellarId}/vessels`;
const vessel = (id: string, cellarId = crew.cellar.id) => `${vessels(cellarId)}/${id}`;
const MISSING = '00000000-0000-4000-8000-000000000000';
const issuePaths = (body: { issues?: { path: string }[] }) => (body.issues ?? []).map((i) => i.path);

/** Creates a vessel over the API as the Hand. */
async function create(body: Record<string, unknown>): Promise<Vessel> {
  const res = await as.hand.post(vessels()).send({ kind: 'carboy', material: 'glass', capacityL: 23, ...body });
  expect(res.status).toBe(201);
  return vesselSchema.parse(res.body);
}

describe('POST /vessels', () => {
  it('creates a dirty vessel with a fresh label code, answering the contract', async () => {
    const created = await create({ name: 'Tall carboy', notes: 'chip on the neck' });
    expect(labelCodeSchema.safeParse(created.code).success).toBe(true);
    expect(created).toMatchObject({ name: 'Tall carboy', state: 'dirty', sanitisedAt: null, batch: null, place: null, volumeL: null });
    const again = await create({ name: 'Tall carboy 2' });
    expect(again.code).not.toBe(created.code);
  });

  it('starts the sanitising clock when created sanitised', async () => {
    const before = Date.now();
    const created = await create({ name: 'Fresh jug', kind: 'jug', capacityL: 4.5, state: 'sanitised' });
    expect(created.state).toBe('sanitised');
    expect(new Date(created.sanitisedAt!).getTime()).toBeGreaterThanOrEqual(before - 1000);
    expect(new Date(created.sanitisedAt!).getTime()).toBeLessThanOrEqual(Date.now() + 1000);
  });

  it('names the bad fields', async () => {
    const res = await as.hand.post(vessels()).send({ name: '', kind: 'vat', material: 'glass', capacityL: 0 });
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(expect.arrayContaining(['body.name', 'body.kind', 'body.capacityL']));
  });

  it('refuses a Guest', async () => {
    const res = await as.guest.post(vessels()).send({ name: 'Guest jug', kind: 'jug', material: 'glass', capacityL: 4 });
    expect(res.status).toBe(403);
  });
});

describe('GET /vessels', () => {
  let list: CellarCrew;
  let keeper: Agent;
  const ids: Record<string, string> = {};

  beforeAll(async () => {
    list = await makeCellarWithCrew(ds);
    keeper = await signedInAgent(app, list.keeper.email, TEST_PASSWORD);
    const c = list.cellar.id;
    ids.dirty = (await makeVessel(ds, c, { name: 'Amber demijohn', capacityL: 5 })).id;
    ids.clean = (await makeVessel(ds, c, { name: 'bucket one', kind: 'bucket', material: 'plastic', capacityL: 30, cleaningState: 'clean' })).id;
    ids.sanitised = (await makeVessel(ds, c, { name: 'Carboy 19', capacityL: 19, cleaningState: 'sanitised' })).id;
    ids.lapsed = (await makeVessel(ds, c, { name: 'Carboy lapsed', capacityL: 23, cleaningState: 'sanitised' })).id;
    await sanitisedDaysAgo(ds, ids.lapsed, 8); // the cellar keeps sanitising 7 days
    ids.edge = (await makeVessel(ds, c, { name: 'Carboy six days', capacityL: 11, cleaningState: 'sanitised' })).id;
    await sanitisedDaysAgo(ds, ids.edge, 6);
    ids.retired = (await makeVessel(ds, c, { name: 'Cracked jug', kind: 'jug', capacityL: 4, cleaningState: 'sanitised', retiredAt: new Date() })).id;
    ids.holding = (
      await makeVessel(ds, c, { name: 'Keg of cyser', kind: 'keg', material: 'stainless', capacityL: 19, cleaningState: 'sanitised' })
    ).id;
    const batch = await makeBatch(ds, c, { name: 'Quince cyser', kind: 'cyser' });
    await fillVessel(ds, ids.holding, batch.id, 18);
    const rack = await makeRack(ds, c, 'North wall', [3, 3]);
    ids.rack = rack.id;
    await placeDirectly(ds, c, rack.shelfIds[1], 2, { vesselId: ids.holding });
    await placeDirectly(ds, c, rack.shelfIds[0], 1, { vesselId: ids.sanitised });
  });

  const get = (query: Record<string, string | number | boolean>) => keeper.get(vessels(list.cellar.id)).query(query);
  const names = (res: { body: { items: Vessel[] } }) => res.body.items.map((v) => v.name);

  it('lists by name (case ignored) with batch, place and derived state', async () => {
    const res = await get({});
    expect(res.status).toBe(200);
    const page = vesselPageSchema.parse(res.body);
    expect(page).toMatchObject({ total: 7, page: 1, pageSize: 50 });
    expect(names(res)).toEqual(['Amber demijohn', 'bucket one', 'Carboy 19', 'Carboy lapsed', 'Carboy six days', 'Cracked jug', 'Keg of cyser']);
    const keg = page.items.find((v) => v.id === ids.holding)!;
    expect(keg).toMatchObject({ state: 'holding', volumeL: 18, batch: { name: 'Quince cyser', kind: 'cyser' } });
    expect(keg.place).toMatchObject({ rackId: ids.rack, rackName: 'North wall', shelfNumber: 2, slot: 2 });
    expect(page.items.find((v) => v.id === ids.lapsed)!.state).toBe('clean');
    expect(page.items.find((v) => v.id === ids.edge)!.state).toBe('sanitised');
    expect(page.items.find((v) => v.id === ids.retired)!.state).toBe('retired');
  });

  it('pages in SQL with the full total', async () => {
    const seen: string[] = [];
    for (const pageNo of [1, 2, 3]) {
      const res = await get({ pageSize: 3, page: pageNo });
      expect(res.body).toMatchObject({ total: 7, page: pageNo, pageSize: 3 });
      expect(res.body.items).toHaveLength(pageNo === 3 ? 1 : 3);
      seen.push(...names(res));
    }
    expect(new Set(seen).size).toBe(7);
    const beyond = await get({ pageSize: 3, page: 9 });
    expect(beyond.body).toMatchObject({ total: 7, items: [] });
  });

  it('filters free and sanitised, leaving out lapsed, holding and retired vessels', async () => {
    const res = await get({ freeAndSanitised: true });
    expect(names(res)).toEqual(['Carboy 19', 'Carboy six days']);
    expect(res.body.total).toBe(2);
    const bigEnough = await get({ freeAndSanitised: true, minCapacityL: 15 });
    expect(names(bigEnough)).toEqual(['Carboy 19']);
  });

  it('filters by each state, a lapsed one counting as clean', async () => {
    const expected: Record<string, string[]> = {
      holding: ['Keg of cyser'],
      dirty: ['Amber demijohn'],
      clean: ['bucket one', 'Carboy lapsed'],
      sanitised: ['Carboy 19', 'Carboy six days'],
      retired: ['Cracked jug'],
    };
    for (const [state, want] of Object.entries(expected)) {
      const res = await get({ state });
      expect(names(res), state).toEqual(want);
      expect(res.body.total, state).toBe(want.length);
      expect(
        res.body.items.every((v: Vessel) => v.state === state),
        state,
      ).toBe(true);
    }
  });

  it('searches name and code, and filters by capacity and rack', async () => {
    expect(names(await get({ q: 'carboy' }))).toEqual(['Carboy 19', 'Carboy lapsed', 'Carboy six days']);
    const [{ code }] = await ds.query(`SELECT code FROM vessels WHERE id = $1`, [ids.clean]);
    expect(names(await get({ q: code.slice(0, 6).toLowerCase() }))).toEqual(['bucket one']);
    expect(names(await get({ q: '100%' }))).toEqual([]);
    expect(names(await get({ minCapacityL: 20 }))).toEqual(['bucket one', 'Carboy lapsed']);
    expect(names(await get({ rackId: ids.rack }))).toEqual(['Carboy 19', 'Keg of cyser']);
  });

  it('names a bad query parameter', async () => {
    const res = await get({ state: 'sparkling', pageSize: 500 });
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(expect.arrayContaining(['query.state', 'query.pageSize']));
  });

  it('costs the same number of queries for one vessel as for a page full (no N+1)', async () => {
    const small = await makeCellarWithCrew(ds);
    const smallAgent = await signedInAgent(app, small.keeper.email, TEST_PASSWORD);
    await makeVessel(ds, small.cellar.id);
    const few = await countQueries(ds, () => smallAgent.get(vessels(small.cellar.id)).expect(200));
    const many = await countQueries(ds, () => keeper.get(vessels(list.cellar.id)).expect(200));
    expect(many).toBe(few);
  });

  it('lets a Guest read and keeps other cellars apart', async () => {
    const mine = await as.guest.get(vessels());
    expect(mine.status).toBe(200);
    expect(mine.body.items.some((v: Vessel) => Object.values(ids).includes(v.id))).toBe(false);
    expect((await as.keeper.get(vessels(list.cellar.id))).status).toBe(404);
  });
});

describe('GET /vessels/:vesselId', () => {
  it('shows headspace, the batch start and the latest reading, amendments applied', async () => {
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Detail carboy', capacityL: 23 });
    const twin = await makeVessel(ds, crew.cellar.id, { name: 'Detail twin', capacityL: 23 });
    const batch = await makeBatch(ds, crew.cellar.id, { name: 'Blackberry melomel', startedOn: '2026-02-03' });
    await fillVessel(ds, v.id, batch.id, 21);
    await fillVessel(ds, twin.id, batch.id, 20);
    const day = (n: number) => new Date(Date.UTC(2026, 1, n, 12));
    await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.1, null), { occurredAt: day(3) });
    const mine = await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.02, v.id, 1.021), { occurredAt: day(20) });
    await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.005, twin.id), { occurredAt: day(25) }); // the other vessel's
    await addJournalEntry(
      ds,
      crew.cellar.id,
      batch.id,
      { kind: 'amendment', reason: 'misread', changes: { sg: 1.012, correctedSg: 1.013 } },
      { amendsEntryId: mine },
    );

    const res = await as.guest.get(vessel(v.id));
    expect(res.status).toBe(200);
    const detail = vesselDetailSchema.parse(res.body);
    expect(detail.headspace).toEqual(headspace({ capacityL: 23, volumeL: 21 }));
    expect(detail).toMatchObject({ state: 'holding', batchStartedOn: '2026-02-03', sanitisedUntil: null });
    expect(detail.lastReading).toEqual({ sg: 1.012, correctedSg: 1.013, at: day(20).toISOString() });

    const general = await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.004, null), { occurredAt: day(27) });
    const later = await as.guest.get(vessel(v.id));
    expect(later.body.lastReading).toEqual({ sg: 1.004, correctedSg: 1.004, at: day(27).toISOString() });
    expect(general).toBeTruthy();
  });

  it('tells until when a sanitised vessel stays sanitised', async () => {
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Until jug', cleaningState: 'sanitised' });
    const res = await as.guest.get(vessel(v.id));
    const detail = vesselDetailSchema.parse(res.body);
    expect(detail).toMatchObject({ headspace: null, lastReading: null, batchStartedOn: null });
    expect(new Date(detail.sanitisedUntil!).getTime()).toBe(new Date(detail.sanitisedAt!).getTime() + 7 * 24 * 3600 * 1000);
  });

  it('answers 404 for another cellar’s vessel or an unknown one, 400 for a bad id', async () => {
    const theirs = await makeVessel(ds, other.cellar.id);
    const foreign = await as.keeper.get(vessel(theirs.id));
    expect(foreign.status).toBe(404);
    expect((await as.keeper.get(vessel(MISSING))).status).toBe(404);
    const bad = await as.keeper.get(vessel('nope'));
    expect(bad.status).toBe(400);
    expect(issuePaths(bad.body)).toEqual(['params.vesselId']);
  });
});

describe('GET /vessels/rack-target', () => {
  let cellarId: string;
  let keeper: Agent;
  beforeAll(async () => {
    const c = await makeCellarWithCrew(ds);
    cellarId = c.cellar.id;
    keeper = await signedInAgent(app, c.keeper.email, TEST_PASSWORD);
    await makeVessel(ds, cellarId, { name: 'Big carboy', capacityL: 23, cleaningState: 'sanitised' });
    await makeVessel(ds, cellarId, { name: 'Small carboy', capacityL: 19, cleaningState: 'sanitised' });
    await makeVessel(ds, cellarId, { name: 'Jug', kind: 'jug', capacityL: 4.5, cleaningState: 'sanitised' });
    const lapsed = await makeVessel(ds, cellarId, { name: 'Lapsed carboy', capacityL: 19.5, cleaningState: 'sanitised' });
    await sanitisedDaysAgo(ds, lapsed.id, 30);
    await makeVessel(ds, cellarId, { name: 'Dirty carboy', capacityL: 19.2 });
    await makeVessel(ds, cellarId, { name: 'Retired carboy', capacityL: 19.1, cleaningState: 'sanitised', retiredAt: new Date() });
    const full = await makeVessel(ds, cellarId, { name: 'Full carboy', capacityL: 19.3, cleaningState: 'sanitised' });
    await fillVessel(ds, full.id, (await makeBatch(ds, cellarId)).id, 19);
  });

  const target = (query: Record<string, string | number>) => keeper.get(`${vessels(cellarId)}/rack-target`).query(query);

  it('proposes the smallest free sanitised vessel that holds the volume after the loss', async () => {
    const res = await target({ volumeL: 19.5, stage: 'secondary' });
    expect(res.status).toBe(200);
    const body = rackTargetSuggestionSchema.parse(res.body);
    const candidates = vesselPageSchema.parse((await keeper.get(vessels(cellarId)).query({ freeAndSanitised: true })).body).items;
    const best = bestVesselForRacking({ volumeL: 19.5, stage: 'secondary', candidates });
    expect(best?.name).toBe('Small carboy'); // 19.5 L less 4 % fits 19 L
    expect(body.suggestion?.id).toBe(best?.id);
    expect(body.expectedLossL).toBeCloseTo(rackingLoss({ volumeL: 19.5, stage: 'secondary' }));
    expect(body.volumeAfterLossL).toBeCloseTo(19.5 - body.expectedLossL);
  });

  it('uses the stage, the exclusions and says so when nothing fits', async () => {
    const ageing = await target({ volumeL: 19.5, stage: 'ageing' }); // 2 % loss leaves 19.11 L
    expect(ageing.body.suggestion.name).toBe('Big carboy');
    const small = await target({ volumeL: 19.5 });
    const excluded = await target({ volumeL: 19.5, exclude: `${small.body.suggestion.id}, ${MISSING}` });
    expect(excluded.body.suggestion.name).toBe('Big carboy');
    const none = await target({ volumeL: 60 });
    expect(none.status).toBe(200);
    expect(none.body.suggestion).toBeNull();
  });

  it('names a bad parameter', async () => {
    const res = await target({ volumeL: -1, stage: 'tertiary', exclude: 'x' });
    expect(res.status).toBe(400);
    expect(issuePaths(res.body)).toEqual(expect.arrayContaining(['query.volumeL', 'query.stage']));
    const bad = await target({ volumeL: 10, exclude: `${MISSING},x` });
    expect(issuePaths(bad.body)).toEqual(['query.exclude.1']);
  });
});
