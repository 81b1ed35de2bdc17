import { beforeAll, describe, expect, it } from 'vitest';
import { casesFrom } from '../../shared/calc';
import { bottleCaseSchema, bottleLotSchema, departureSchema } from '../../shared/schemas/bottles';
import { Batch } from '../../server/entities/batch.entity';
import { BottleDeparture } from '../../server/entities/bottle-departure.entity';
import { makeLotViaApi } from '../helpers/bottles';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { makeShelf } from '../helpers/places';
import { signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let other: CellarCrew;
let as: { hand: Agent; guest: Agent; keeper: Agent; outsider: Agent };

const caseUrl = (cellarId: string, caseId: string) => `/api/cellars/${cellarId}/cases/${caseId}`;
const lotUrl = (cellarId: string, lotId: string) => `/api/cellars/${cellarId}/lots/${lotId}`;
const lotsUrl = (cellarId: string) => `/api/cellars/${cellarId}/lots`;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  as = {
    hand: await signedInAgent(app, crew.hand.email, TEST_PASSWORD),
    guest: await signedInAgent(app, crew.guest.email, TEST_PASSWORD),
    keeper: await signedInAgent(app, crew.keeper.email, TEST_PASSWORD),
    outsider: await signedInAgent(app, other.keeper.email, TEST_PASSWORD),
  };
});

describe('drawing bottles from a case', () => {
  it('never takes more bottles than the case holds', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 29, perCase: 12 });
    const third = lot.cases[2];
    expect(third.bottlesLeft).toBe(casesFrom(29, 12).loose);

    const tooMany = await as.hand.post(`${caseUrl(crew.cellar.id, third.id)}/departures`).send({ count: third.bottlesLeft + 1, reason: 'drunk' });
    expect(tooMany.status).toBe(409);
    expect(tooMany.body.message).toBe(`Case 3 has only ${third.bottlesLeft} bottles left.`);

    const all = await as.hand
      .post(`${caseUrl(crew.cellar.id, third.id)}/departures`)
      .send({ count: third.bottlesLeft, reason: 'gift', note: 'For the test neighbours' });
    expect(all.status).toBe(201);
    expect(bottleCaseSchema.parse(all.body)).toMatchObject({ id: third.id, bottlesLeft: 0, version: third.version + 1 });

    const empty = await as.hand.post(`${caseUrl(crew.cellar.id, third.id)}/departures`).send({ count: 1, reason: 'drunk' });
    expect(empty.status).toBe(409);
    expect(empty.body.message).toBe('Case 3 is empty.');
    expect(await ds.getRepository(BottleDeparture).countBy({ caseId: third.id })).toBe(1);
  });

  it('refuses a draw-down made against an old version of the case', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 6 });
    const c = lot.cases[0];
    const first = await as.hand.post(`${caseUrl(crew.cellar.id, c.id)}/departures`).send({ count: 1, reason: 'drunk', expectedVersion: c.version });
    expect(first.status).toBe(201);
    const stale = await as.hand.post(`${caseUrl(crew.cellar.id, c.id)}/departures`).send({ count: 1, reason: 'drunk', expectedVersion: c.version });
    expect(stale.status).toBe(409);
    expect(stale.body.currentVersion).toBe(c.version + 1);
  });

  it('serves two draw-downs at once one after the other: one succeeds, the other is refused', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 10 });
    const c = lot.cases[0];
    expect(c.bottlesLeft).toBe(10);
    const url = `${caseUrl(crew.cellar.id, c.id)}/departures`;
    const [a, b] = await Promise.all([as.hand.post(url).send({ count: 8, reason: 'sold' }), as.keeper.post(url).send({ count: 8, reason: 'sold' })]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    const refused = a.status === 409 ? a : b;
    expect(refused.body.message).toBe('Case 1 has only 2 bottles left.');
    const now = await as.hand.get(caseUrl(crew.cellar.id, c.id));
    expect(now.body.bottlesLeft).toBe(2);
    expect(await ds.getRepository(BottleDeparture).countBy({ caseId: c.id })).toBe(1);
  });

  it('marks the batch finished when the last bottle of the last case leaves', async () => {
    const { batch, lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 3, perCase: 2 });
    const stage = async () => (await ds.getRepository(Batch).findOneByOrFail({ id: batch.id })).stage;
    expect(await stage()).toBe('bottled');
    await as.hand
      .post(`${caseUrl(crew.cellar.id, lot.cases[0].id)}/departures`)
      .send({ count: 2, reason: 'drunk' })
      .expect(201);
    expect(await stage()).toBe('bottled');
    await as.hand
      .post(`${caseUrl(crew.cellar.id, lot.cases[1].id)}/departures`)
      .send({ count: 1, reason: 'broken' })
      .expect(201);
    expect(await stage()).toBe('finished');
  });

  it('lists departures on the lot, newest first, with who took them', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 12 });
    const url = `${caseUrl(crew.cellar.id, lot.cases[0].id)}/departures`;
    await as.hand.post(url).send({ count: 1, reason: 'drunk' }).expect(201);
    await as.keeper.post(url).send({ count: 2, reason: 'competition', note: 'Test county show' }).expect(201);
    const res = await as.guest.get(lotUrl(crew.cellar.id, lot.id));
    expect(res.status).toBe(200);
    expect(bottleLotSchema.parse(res.body).bottlesLeft).toBe(9);
    const departures = res.body.departures.map((d: unknown) => departureSchema.parse(d));
    expect(departures.map((d: { count: number; author: { name: string } }) => [d.count, d.author.name])).toEqual([
      [2, crew.keeper.displayName],
      [1, crew.hand.displayName],
    ]);
  });

  it('refuses bad input with 400', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 4 });
    const url = `${caseUrl(crew.cellar.id, lot.cases[0].id)}/departures`;
    expect((await as.hand.post(url).send({ count: 0, reason: 'drunk' })).status).toBe(400);
    expect((await as.hand.post(url).send({ count: 1, reason: 'spilt' })).status).toBe(400);
    expect((await as.hand.post(`${caseUrl(crew.cellar.id, 'not-an-id')}/departures`).send({ count: 1, reason: 'drunk' })).status).toBe(400);
  });
});

describe('a case and where it sits', () => {
  it('shows a case with its lot', async () => {
    const { batch, lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 5, name: 'Test quince cyser' });
    const res = await as.guest.get(caseUrl(crew.cellar.id, lot.cases[0].id));
    expect(res.status).toBe(200);
    expect(bottleCaseSchema.parse(res.body)).toMatchObject({ lotId: lot.id, bottlesLeft: 5, place: null });
    expect(res.body.lot).toEqual({
      id: lot.id,
      code: lot.code,
      batchId: batch.id,
      batchName: 'Test quince cyser',
      bottledOn: lot.bottledOn,
      bottleMl: 750,
      sulfiteAdded: false,
      abvEstimate: lot.abvEstimate,
    });
  });

  it('puts cases into free slots only, and takes them off again', async () => {
    const shelf = await makeShelf(ds, crew.cellar.id, 4, 'Test bottle rack');
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 24 });
    const [first, second] = lot.cases;
    const place = (caseId: string) => `${caseUrl(crew.cellar.id, caseId)}/place`;

    const moved = await as.hand.put(place(first.id)).send({ to: { shelfId: shelf.id, slot: 2 }, expectedVersion: first.version });
    expect(moved.status).toBe(200);
    expect(moved.body.place).toMatchObject({ shelfId: shelf.id, rackName: 'Test bottle rack', shelfNumber: 1, slot: 2 });
    expect(moved.body.version).toBe(first.version + 1);

    const taken = await as.hand.put(place(second.id)).send({ to: { shelfId: shelf.id, slot: 2 } });
    expect(taken.status).toBe(409);
    const noSuchSlot = await as.hand.put(place(second.id)).send({ to: { shelfId: shelf.id, slot: 9 } });
    expect(noSuchSlot.status).toBe(400);
    const stale = await as.hand.put(place(first.id)).send({ to: { shelfId: shelf.id, slot: 3 }, expectedVersion: first.version });
    expect(stale.status).toBe(409);

    const theirShelf = await makeShelf(ds, other.cellar.id, 4);
    const foreignShelf = await as.hand.put(place(second.id)).send({ to: { shelfId: theirShelf.id, slot: 1 } });
    expect(foreignShelf.status).toBe(404);

    const listed = await as.guest.get(lotUrl(crew.cellar.id, lot.id));
    expect(listed.body.cases[0].place).toMatchObject({ shelfId: shelf.id, slot: 2 });

    const off = await as.hand.put(place(first.id)).send({ to: null });
    expect(off.status).toBe(200);
    expect(off.body.place).toBeNull();
  });
});

describe('the lot list', () => {
  it('pages in order and filters by name and stock', async () => {
    const own = await makeCellarWithCrew(ds);
    const hand = await signedInAgent(app, own.hand.email, TEST_PASSWORD);
    const made = [];
    for (const name of ['Test sour cherry melomel', 'Test blackcurrant wine', 'Test cherry cyser']) {
      made.push(await makeLotViaApi(ds, hand, own, { bottles: 2, perCase: 2, name }));
    }
    await hand
      .post(`${caseUrl(own.cellar.id, made[1].lot.cases[0].id)}/departures`)
      .send({ count: 2, reason: 'drunk' })
      .expect(201);

    const page1 = await hand.get(lotsUrl(own.cellar.id)).query({ pageSize: 2 });
    expect(page1.status).toBe(200);
    expect(page1.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(page1.body.items).toHaveLength(2);
    const page2 = await hand.get(lotsUrl(own.cellar.id)).query({ pageSize: 2, page: 2 });
    expect(page2.body.items).toHaveLength(1);
    // All bottled today: the newest bottling run comes first.
    const ids = [...page1.body.items, ...page2.body.items].map((l: { id: string }) => l.id);
    expect(ids).toEqual(made.map((m) => m.lot.id).reverse());
    for (const item of page1.body.items) expect(bottleLotSchema.parse(item).cases).toHaveLength(1);

    const inStock = await hand.get(lotsUrl(own.cellar.id)).query({ inStock: 'true' });
    expect(inStock.body.items.map((l: { id: string }) => l.id).sort()).toEqual([made[0].lot.id, made[2].lot.id].sort());
    const outOfStock = await hand.get(lotsUrl(own.cellar.id)).query({ inStock: 'false' });
    expect(outOfStock.body.items.map((l: { id: string }) => l.id)).toEqual([made[1].lot.id]);
    expect(outOfStock.body.items[0].bottlesLeft).toBe(0);

    const cherry = await hand.get(lotsUrl(own.cellar.id)).query({ q: 'cherry' });
    expect(cherry.body.total).toBe(2);
    expect(cherry.body.items.map((l: { batchName: string }) => l.batchName).sort()).toEqual(['Test cherry cyser', 'Test sour cherry melomel']);
    const wildcard = await hand.get(lotsUrl(own.cellar.id)).query({ q: '%' });
    expect(wildcard.body.total).toBe(0);

    const bad = await hand.get(lotsUrl(own.cellar.id)).query({ inStock: 'maybe' });
    expect(bad.status).toBe(400);
  });
});

describe('who may touch bottles', () => {
  it('lets a Guest look but not draw down or move cases', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 3 });
    const c = lot.cases[0];
    expect((await as.guest.get(lotsUrl(crew.cellar.id))).status).toBe(200);
    const draw = await as.guest.post(`${caseUrl(crew.cellar.id, c.id)}/departures`).send({ count: 1, reason: 'drunk' });
    expect(draw.status).toBe(403);
    const move = await as.guest.put(`${caseUrl(crew.cellar.id, c.id)}/place`).send({ to: null });
    expect(move.status).toBe(403);
    expect((await as.guest.get(caseUrl(crew.cellar.id, c.id))).body.bottlesLeft).toBe(3);
  });

  it('answers 404 from another cellar', async () => {
    const { lot } = await makeLotViaApi(ds, as.hand, crew, { bottles: 3 });
    const c = lot.cases[0];
    expect((await as.outsider.get(caseUrl(crew.cellar.id, c.id))).status).toBe(404);
    expect((await as.outsider.get(lotUrl(crew.cellar.id, lot.id))).status).toBe(404);
    // Through their own cellar the ids lead nowhere either.
    expect((await as.outsider.get(caseUrl(other.cellar.id, c.id))).status).toBe(404);
    expect((await as.outsider.get(lotUrl(other.cellar.id, lot.id))).status).toBe(404);
    const draw = await as.outsider.post(`${caseUrl(other.cellar.id, c.id)}/departures`).send({ count: 1, reason: 'drunk' });
    expect(draw.status).toBe(404);
    const list = await as.outsider.get(lotsUrl(other.cellar.id));
    expect(list.body.items.map((l: { id: string }) => l.id)).not.toContain(lot.id);
  });
});
