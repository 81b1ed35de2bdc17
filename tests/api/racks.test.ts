import { beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { rackSchema, type Rack } from '../../shared/schemas/places';
import { makeBatch } from '../helpers/batches';
import { makeCase } from '../helpers/bottles';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
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

const racks = (cellarId = crew.cellar.id) => `/api/cellars/${cellarId}/racks`;
const rack = (id: string, cellarId = crew.cellar.id) => `${racks(cellarId)}/${id}`;
const issuePaths = (body: { issues?: { path: string }[] }) => (body.issues ?? []).map((i) => i.path);

describe('POST /racks', () => {
  it('creates a rack with its shelves numbered from the top', async () => {
    const res = await as.hand.post(racks()).send({ name: 'Cellar stairs', description: 'under the stairs', shelves: [4, 6, 2] });
    expect(res.status).toBe(201);
    const created = rackSchema.parse(res.body);
    expect(created).toMatchObject({ name: 'Cellar stairs', description: 'under the stairs' });
    expect(created.shelves.map((s) => [s.number, s.slotCount, s.occupants])).toEqual([
      [1, 4, []],
      [2, 6, []],
      [3, 2, []],
    ]);
  });

  it('refuses a second rack of the same name in the cellar, not in another', async () => {
    await as.hand
      .post(racks())
      .send({ name: 'Twin rack', shelves: [2] })
      .expect(201);
    const again = await as.hand.post(racks()).send({ name: 'Twin rack', shelves: [3] });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/already has a rack called "Twin rack"/);
    const otherKeeper = await signedInAgent(app, other.keeper.email, TEST_PASSWORD);
    expect((await otherKeeper.post(racks(other.cellar.id)).send({ name: 'Twin rack', shelves: [3] })).status).toBe(201);
  });

  it('names the bad fields', async () => {
    const none = await as.hand.post(racks()).send({ name: ' ', shelves: [] });
    expect(none.status).toBe(400);
    expect(issuePaths(none.body)).toEqual(expect.arrayContaining(['body.name', 'body.shelves']));
    const bad = await as.hand.post(racks()).send({ name: 'Odd rack', shelves: [3, 0, 61] });
    expect(issuePaths(bad.body)).toEqual(['body.shelves.1', 'body.shelves.2']);
  });

  it('refuses a Guest', async () => {
    expect((await as.guest.post(racks()).send({ name: 'Guest rack', shelves: [1] })).status).toBe(403);
  });
});

describe('GET /racks', () => {
  let map: CellarCrew;
  let reader: Agent;
  beforeAll(async () => {
    map = await makeCellarWithCrew(ds);
    reader = await signedInAgent(app, map.guest.email, TEST_PASSWORD);
    const c = map.cellar.id;
    const north = await makeRack(ds, c, 'North wall', [3, 2]);
    const attic = await makeRack(ds, c, 'attic', [1]);
    const batch = await makeBatch(ds, c, { name: 'Elderflower mead' });
    const full = await makeVessel(ds, c, { name: 'Carboy A' });
    await fillVessel(ds, full.id, batch.id, 20);
    const fresh = await makeVessel(ds, c, { name: 'Jug B', kind: 'jug', cleaningState: 'sanitised' });
    const lapsed = await makeVessel(ds, c, { name: 'Jug C', kind: 'jug', cleaningState: 'sanitised' });
    await sanitisedDaysAgo(ds, lapsed.id, 9);
    const box = await makeCase(ds, c, batch.id, { number: 2, bottlesInitial: 12, bottlesLeft: 11 });
    const lastBottle = await makeCase(ds, c, batch.id, { number: 3, bottlesInitial: 12, bottlesLeft: 1 });
    await placeDirectly(ds, c, north.shelfIds[0], 3, { vesselId: full.id });
    await placeDirectly(ds, c, north.shelfIds[0], 1, { vesselId: fresh.id });
    await placeDirectly(ds, c, north.shelfIds[1], 2, { vesselId: lapsed.id });
    await placeDirectly(ds, c, north.shelfIds[1], 1, { caseId: box.id });
    await placeDirectly(ds, c, attic.shelfIds[0], 1, { caseId: lastBottle.id });
    await makeVessel(ds, c, { name: 'Unplaced' });
  });

  it('draws every rack, shelf by shelf, with what sits in each slot', async () => {
    const res = await reader.get(racks(map.cellar.id));
    expect(res.status).toBe(200);
    const list: Rack[] = z.array(rackSchema).parse(res.body);
    expect(list.map((r) => r.name)).toEqual(['attic', 'North wall']);
    const north = list[1];
    expect(north.shelves.map((s) => s.number)).toEqual([1, 2]);
    expect(north.shelves[0].occupants).toEqual([
      { slot: 1, vesselId: expect.any(String), caseId: null, label: 'Jug B', state: 'sanitised', caseNumber: null, batchName: null },
      { slot: 3, vesselId: expect.any(String), caseId: null, label: 'Carboy A', state: 'holding', caseNumber: null, batchName: null },
    ]);
    expect(north.shelves[1].occupants).toEqual([
      {
        slot: 1,
        vesselId: null,
        caseId: expect.any(String),
        label: 'Case 2 of Elderflower mead',
        state: '11 bottles',
        caseNumber: 2,
        batchName: 'Elderflower mead',
      },
      { slot: 2, vesselId: expect.any(String), caseId: null, label: 'Jug C', state: 'clean', caseNumber: null, batchName: null },
    ]);
    expect(list[0].shelves[0].occupants).toEqual([
      {
        slot: 1,
        vesselId: null,
        caseId: expect.any(String),
        label: 'Case 3 of Elderflower mead',
        state: '1 bottle',
        caseNumber: 3,
        batchName: 'Elderflower mead',
      },
    ]);
  });

  it('costs a fixed number of queries however much is on the racks', async () => {
    const empty = await makeCellarWithCrew(ds);
    const emptyAgent = await signedInAgent(app, empty.keeper.email, TEST_PASSWORD);
    await makeRack(ds, empty.cellar.id, 'Lonely rack', [1]);
    const few = await countQueries(ds, () => emptyAgent.get(racks(empty.cellar.id)).expect(200));
    const many = await countQueries(ds, () => reader.get(racks(map.cellar.id)).expect(200));
    expect(many).toBe(few);
  });

  it('keeps other cellars apart', async () => {
    expect((await as.keeper.get(racks(map.cellar.id))).status).toBe(404);
    const mine = await as.guest.get(racks());
    expect(mine.body.map((r: Rack) => r.name)).not.toContain('North wall');
  });
});

describe('PATCH /racks/:rackId', () => {
  it('renames and re-describes a rack', async () => {
    const { id } = await makeRack(ds, crew.cellar.id, 'Old name', [2]);
    const res = await as.hand.patch(rack(id)).send({ name: 'New name' });
    expect(res.status).toBe(200);
    expect(rackSchema.parse(res.body)).toMatchObject({ name: 'New name', description: '' });
    const described = await as.hand.patch(rack(id)).send({ description: 'by the door' });
    expect(described.body).toMatchObject({ name: 'New name', description: 'by the door' });
  });

  it('refuses a taken name, a bad name, another cellar and a Guest', async () => {
    await makeRack(ds, crew.cellar.id, 'Taken name', [2]);
    const { id } = await makeRack(ds, crew.cellar.id, 'Free name', [2]);
    expect((await as.hand.patch(rack(id)).send({ name: 'Taken name' })).status).toBe(409);
    const bad = await as.hand.patch(rack(id)).send({ name: '' });
    expect(issuePaths(bad.body)).toEqual(['body.name']);
    const theirs = await makeRack(ds, other.cellar.id, 'Their rack', [1]);
    expect((await as.hand.patch(rack(theirs.id)).send({ name: 'Ours now' })).status).toBe(404);
    expect((await as.guest.patch(rack(id)).send({ name: 'Guest name' })).status).toBe(403);
  });
});

describe('DELETE /racks/:rackId', () => {
  it('lets only a Keeper delete, and only an empty rack', async () => {
    const full = await makeRack(ds, crew.cellar.id, 'Busy rack', [2, 2]);
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Sitter' });
    await placeDirectly(ds, crew.cellar.id, full.shelfIds[1], 2, { vesselId: v.id });
    expect((await as.hand.delete(rack(full.id))).status).toBe(403);
    const refused = await as.keeper.delete(rack(full.id));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/Busy rack still holds 1 thing/);

    await as.hand.put(`/api/cellars/${crew.cellar.id}/vessels/${v.id}/place`).send({ to: null }).expect(200);
    expect((await as.keeper.delete(rack(full.id))).status).toBe(204);
    const [{ count }] = await ds.query(`SELECT count(*)::int AS count FROM shelves WHERE rack_id = $1`, [full.id]);
    expect(count).toBe(0);
    expect((await as.keeper.delete(rack(full.id))).status).toBe(404);
  });

  it('answers 404 for another cellar’s rack and 400 for a bad id', async () => {
    const theirs = await makeRack(ds, other.cellar.id, 'Not yours', [1]);
    expect((await as.keeper.delete(rack(theirs.id))).status).toBe(404);
    const bad = await as.keeper.delete(rack('rack-1'));
    expect(bad.status).toBe(400);
    expect(issuePaths(bad.body)).toEqual(['params.rackId']);
  });
});
