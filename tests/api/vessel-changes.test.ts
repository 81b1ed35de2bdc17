import { beforeAll, describe, expect, it } from 'vitest';
import { vesselSchema, type Vessel } from '../../shared/schemas/vessels';
import { makeBatch } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { makeRack, placeDirectly } from '../helpers/places';
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
const issuePaths = (body: { issues?: { path: string }[] }) => (body.issues ?? []).map((i) => i.path);

/** Creates a vessel over the API as the Hand. */
async function create(body: Record<string, unknown>): Promise<Vessel> {
  const res = await as.hand.post(vessels()).send({ kind: 'carboy', material: 'glass', capacityL: 23, ...body });
  expect(res.status).toBe(201);
  return vesselSchema.parse(res.body);
}

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

  it("says when it changed by the cellar's clock", async () => {
    const away = await makeCellarWithCrew(ds);
    // IANA time zone database: India Standard Time is UTC+05:30 all year (no daylight saving since 1945).
    await ds.query(`UPDATE cellars SET time_zone = 'Asia/Kolkata' WHERE id = $1`, [away.cellar.id]);
    const awayAs = await agentsFor(app, away, TEST_PASSWORD);
    const created = await awayAs.hand.post(vessels(away.cellar.id)).send({ name: 'Far carboy', kind: 'carboy', material: 'glass', capacityL: 23 });
    await awayAs.hand.patch(vessel(created.body.id, away.cellar.id)).send({ notes: 'first' }).expect(200);
    await ds.query(`UPDATE vessels SET updated_at = '2026-07-01T10:20:00Z' WHERE id = $1`, [created.body.id]);
    const res = await awayAs.hand.patch(vessel(created.body.id, away.cellar.id)).send({ notes: 'second', expectedVersion: created.body.version });
    expect(res.status).toBe(409);
    expect(res.body.message).toContain('(changed 2026-07-01 15:50 Asia/Kolkata time)');
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
    await as.hand
      .put(`${vessel(v.id)}/place`)
      .send({ to: { shelfId: rack.shelfIds[0], slot: 1 } })
      .expect(200);
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
