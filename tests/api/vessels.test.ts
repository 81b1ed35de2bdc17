import { beforeAll, describe, expect, it } from 'vitest';
import { bestVesselForRacking, headspace, rackingLoss } from '../../shared/calc';
import { labelCodeSchema, rackTargetSuggestionSchema, vesselDetailSchema, vesselPageSchema, vesselSchema, type Vessel } from '../../shared/schemas/vessels';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/factories';
import { agentsFor, signedInAgent, testApp } from '../helpers/test-app';
import {
  addJournalEntry,
  countQueries,
  fillVessel,
  makeBatch,
  makeRack,
  makeVessel,
  placeDirectly,
  reading,
  sanitisedDaysAgo,
} from '../helpers/vessel-factories';

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
    const again = await create({ name: 'Tall carboy' });
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
    ids.holding = (await makeVessel(ds, c, { name: 'Keg of cyser', kind: 'keg', material: 'stainless', capacityL: 19, cleaningState: 'sanitised' })).id;
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
      expect(res.body.items.every((v: Vessel) => v.state === state), state).toBe(true);
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
    await addJournalEntry(ds, crew.cellar.id, batch.id, { kind: 'amendment', reason: 'misread', changes: { sg: 1.012, correctedSg: 1.013 } }, { amendsEntryId: mine });

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

describe('PATCH /vessels/:vesselId', () => {
  it('changes what it is told and bumps the version', async () => {
    const v = await create({ name: 'To rename' });
    const res = await as.hand.patch(vessel(v.id)).send({ name: 'Renamed', notes: 'new bung', expectedVersion: v.version });
    expect(res.status).toBe(200);
    expect(vesselSchema.parse(res.body)).toMatchObject({ name: 'Renamed', notes: 'new bung', kind: 'carboy', version: v.version + 1 });
  });

  it('refuses a capacity below what it holds', async () => {
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Holding carboy', capacityL: 23 });
    await fillVessel(ds, v.id, (await makeBatch(ds, crew.cellar.id)).id, 20);
    const res = await as.hand.patch(vessel(v.id)).send({ capacityL: 19 });
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/Holding carboy holds 20 L/);
    expect((await as.hand.patch(vessel(v.id)).send({ capacityL: 20 })).status).toBe(200);
  });

  it('answers 409 naming the vessel when someone changed it meanwhile', async () => {
    const v = await create({ name: 'Stale carboy' });
    await as.hand.patch(vessel(v.id)).send({ notes: 'first' }).expect(200);
    const res = await as.hand.patch(vessel(v.id)).send({ notes: 'second', expectedVersion: v.version });
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/^Stale carboy changed while you were working/);
  });

  it('refuses a Guest, another cellar and bad fields', async () => {
    const v = await create({ name: 'Guarded' });
    expect((await as.guest.patch(vessel(v.id)).send({ name: 'Guest' })).status).toBe(403);
    const theirs = await makeVessel(ds, other.cellar.id);
    expect((await as.hand.patch(vessel(theirs.id)).send({ name: 'Mine now' })).status).toBe(404);
    const bad = await as.hand.patch(vessel(v.id)).send({ capacityL: -2, material: 'cardboard' });
    expect(bad.status).toBe(400);
    expect(issuePaths(bad.body)).toEqual(expect.arrayContaining(['body.capacityL', 'body.material']));
  });
});

describe('POST /vessels/:vesselId/cleaning', () => {
  const clean = (id: string, state: string, expectedVersion?: number) => as.hand.post(`${vessel(id)}/cleaning`).send({ state, expectedVersion });

  it('goes dirty → clean → sanitised, refusing to sanitise a dirty vessel', async () => {
    const v = await create({ name: 'Cleaning carboy' });
    const direct = await clean(v.id, 'sanitised');
    expect(direct.status).toBe(409);
    expect(direct.body.message).toMatch(/^Clean it first/);
    const cleaned = await clean(v.id, 'clean', v.version);
    expect(cleaned.status).toBe(200);
    expect(vesselSchema.parse(cleaned.body)).toMatchObject({ state: 'clean', version: v.version + 1 });
    const sanitised = await clean(v.id, 'sanitised');
    expect(sanitised.body).toMatchObject({ state: 'sanitised', version: v.version + 2 });
    expect(sanitised.body.sanitisedAt).not.toBeNull();
    expect(Object.keys(sanitised.body).sort()).toEqual(Object.keys(vesselSchema.shape).sort());
  });

  it('re-sanitises a sanitised or lapsed vessel with a fresh time, and marks anything dirty', async () => {
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Lapsing carboy', cleaningState: 'sanitised' });
    await sanitisedDaysAgo(ds, v.id, 10);
    const lapsed = await as.hand.get(vessel(v.id));
    expect(lapsed.body.state).toBe('clean');
    const old = new Date(lapsed.body.sanitisedAt).getTime();
    const again = await clean(v.id, 'sanitised');
    expect(again.status).toBe(200);
    expect(again.body.state).toBe('sanitised');
    expect(new Date(again.body.sanitisedAt).getTime()).toBeGreaterThan(old + 9 * 24 * 3600 * 1000);
    const twice = await clean(v.id, 'sanitised');
    expect(twice.status).toBe(200);
    expect(new Date(twice.body.sanitisedAt).getTime()).toBeGreaterThanOrEqual(new Date(again.body.sanitisedAt).getTime());
    const toClean = await clean(v.id, 'clean');
    expect(toClean.status).toBe(409);
    const dirty = await clean(v.id, 'dirty');
    expect(dirty.body.state).toBe('dirty');
  });

  it('only cleans an empty vessel in use', async () => {
    const full = await makeVessel(ds, crew.cellar.id, { name: 'Busy carboy' });
    await fillVessel(ds, full.id, (await makeBatch(ds, crew.cellar.id)).id, 10);
    const busy = await clean(full.id, 'dirty');
    expect(busy.status).toBe(409);
    expect(busy.body.message).toMatch(/Busy carboy holds a batch/);
    const old = await makeVessel(ds, crew.cellar.id, { name: 'Old jug', retiredAt: new Date() });
    expect((await clean(old.id, 'clean')).status).toBe(409);
  });

  it('refuses a Guest and a bad state', async () => {
    const v = await create({ name: 'Guest-proof' });
    expect((await as.guest.post(`${vessel(v.id)}/cleaning`).send({ state: 'clean' })).status).toBe(403);
    const bad = await clean(v.id, 'sparkling');
    expect(bad.status).toBe(400);
    expect(issuePaths(bad.body)).toEqual(['body.state']);
  });

  it('lets exactly one of two simultaneous changes with the same version through', async () => {
    const v = await create({ name: 'Contested carboy' });
    const [a, b] = await Promise.all([clean(v.id, 'clean', v.version), clean(v.id, 'clean', v.version)]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    expect(loser.body.message).toMatch(/Contested carboy/);
    expect(loser.body.currentVersion).toBe(v.version + 1);
    const [{ version }] = await ds.query(`SELECT version FROM vessels WHERE id = $1`, [v.id]);
    expect(version).toBe(v.version + 1);
  });
});

describe('POST /vessels/:vesselId/retirement', () => {
  it('retires only an empty vessel, keeps its place, and brings it back dirty', async () => {
    const v = await create({ name: 'Retiring carboy', state: 'sanitised' });
    const rack = await makeRack(ds, crew.cellar.id, 'Retirement rack', [2]);
    await as.hand.put(`${vessel(v.id)}/place`).send({ to: { shelfId: rack.shelfIds[0], slot: 1 } }).expect(200);
    const retired = await as.hand.post(`${vessel(v.id)}/retirement`).send({ retired: true });
    expect(retired.status).toBe(200);
    expect(retired.body).toMatchObject({ state: 'retired', place: { shelfId: rack.shelfIds[0], slot: 1 } });
    const back = await as.hand.post(`${vessel(v.id)}/retirement`).send({ retired: false });
    expect(back.body.state).toBe('dirty');

    const full = await makeVessel(ds, crew.cellar.id, { name: 'Working carboy' });
    await fillVessel(ds, full.id, (await makeBatch(ds, crew.cellar.id)).id, 10);
    const refused = await as.hand.post(`${vessel(full.id)}/retirement`).send({ retired: true });
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/Only an empty vessel can be retired/);
  });

  it('refuses a Guest and a missing flag', async () => {
    const v = await create({ name: 'Unretirable by guests' });
    expect((await as.guest.post(`${vessel(v.id)}/retirement`).send({ retired: true })).status).toBe(403);
    const bad = await as.hand.post(`${vessel(v.id)}/retirement`).send({});
    expect(issuePaths(bad.body)).toEqual(['body.retired']);
  });
});

describe('PUT /vessels/:vesselId/place', () => {
  it('places, moves and takes a vessel off its shelf, one thing per slot', async () => {
    const rack = await makeRack(ds, crew.cellar.id, 'Move rack', [2, 3]);
    const a = await create({ name: 'Mover A' });
    const b = await create({ name: 'Mover B' });
    const put = (id: string, to: unknown, expectedVersion?: number) => as.hand.put(`${vessel(id)}/place`).send({ to, expectedVersion });

    const placed = await put(a.id, { shelfId: rack.shelfIds[1], slot: 3 }, a.version);
    expect(placed.status).toBe(200);
    expect(vesselSchema.parse(placed.body)).toMatchObject({
      place: { rackId: rack.id, rackName: 'Move rack', shelfId: rack.shelfIds[1], shelfNumber: 2, slot: 3 },
      version: a.version + 1,
    });
    const taken = await put(b.id, { shelfId: rack.shelfIds[1], slot: 3 });
    expect(taken.status).toBe(409);
    expect(taken.body.message).toMatch(/Slot 3 on shelf 2 of Move rack is already taken/);
    const beyond = await put(b.id, { shelfId: rack.shelfIds[0], slot: 3 });
    expect(beyond.status).toBe(400);
    expect(beyond.body.message).toMatch(/has 2 slots/);
    const moved = await put(a.id, { shelfId: rack.shelfIds[0], slot: 1 });
    expect(moved.body.place).toMatchObject({ shelfNumber: 1, slot: 1 });
    expect((await put(b.id, { shelfId: rack.shelfIds[1], slot: 3 })).status).toBe(200);
    const off = await put(a.id, null);
    expect(off.body.place).toBeNull();
  });

  it('refuses a shelf of another cellar, slot 0 and a Guest', async () => {
    const theirs = await makeRack(ds, other.cellar.id, 'Their rack', [4]);
    const v = await create({ name: 'Homebody' });
    const foreign = await as.hand.put(`${vessel(v.id)}/place`).send({ to: { shelfId: theirs.shelfIds[0], slot: 1 } });
    expect(foreign.status).toBe(404);
    const zero = await as.hand.put(`${vessel(v.id)}/place`).send({ to: { shelfId: theirs.shelfIds[0], slot: 0 } });
    expect(issuePaths(zero.body)).toEqual(['body.to.slot']);
    const guest = await as.guest.put(`${vessel(v.id)}/place`).send({ to: null });
    expect(guest.status).toBe(403);
  });

  it('gives the slot to one of two vessels racing for it, and a plain 409 to the other', async () => {
    const rack = await makeRack(ds, crew.cellar.id, 'Race rack', [2]);
    const [a, b] = await Promise.all([create({ name: 'Racer A' }), create({ name: 'Racer B' })]);
    const to = { shelfId: rack.shelfIds[0], slot: 2 };
    const results = await Promise.all([a, b].map((v) => as.hand.put(`${vessel(v.id)}/place`).send({ to })));
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(results.find((r) => r.status === 409)!.body.message).toMatch(/Slot 2 on shelf 1 of Race rack is already taken/);
    const [{ count }] = await ds.query(`SELECT count(*)::int AS count FROM placements WHERE shelf_id = $1`, [rack.shelfIds[0]]);
    expect(count).toBe(1);
  });

  it('holds one thing per slot in the database itself', async () => {
    const rack = await makeRack(ds, crew.cellar.id, 'Constraint rack', [1]);
    const a = await makeVessel(ds, crew.cellar.id);
    const b = await makeVessel(ds, crew.cellar.id);
    await placeDirectly(ds, crew.cellar.id, rack.shelfIds[0], 1, { vesselId: a.id });
    await expect(placeDirectly(ds, crew.cellar.id, rack.shelfIds[0], 1, { vesselId: b.id })).rejects.toMatchObject({
      driverError: { code: '23505', constraint: 'uq_placements_slot' },
    });
  });
});

describe('DELETE /vessels/:vesselId', () => {
  it('lets only a Keeper delete, and only an empty vessel', async () => {
    const v = await create({ name: 'Doomed jug' });
    expect((await as.hand.delete(vessel(v.id))).status).toBe(403);
    expect((await as.guest.delete(vessel(v.id))).status).toBe(403);
    const gone = await as.keeper.delete(vessel(v.id));
    expect(gone.status).toBe(204);
    expect((await as.keeper.get(vessel(v.id))).status).toBe(404);

    const full = await makeVessel(ds, crew.cellar.id, { name: 'Precious carboy' });
    await fillVessel(ds, full.id, (await makeBatch(ds, crew.cellar.id)).id, 12);
    const refused = await as.keeper.delete(vessel(full.id));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/Precious carboy holds a batch/);
  });

  it('answers 404 for another cellar’s vessel', async () => {
    const theirs = await makeVessel(ds, other.cellar.id);
    expect((await as.keeper.delete(vessel(theirs.id))).status).toBe(404);
    const [{ count }] = await ds.query(`SELECT count(*)::int AS count FROM vessels WHERE id = $1`, [theirs.id]);
    expect(count).toBe(1);
  });
});
