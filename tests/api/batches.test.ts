import { beforeAll, describe, expect, it, vi } from 'vitest';
import { CAUTION_GLASS } from '../../shared/calc';
import { batchDetailSchema, operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchPageSchema } from '../../shared/schemas/batches';
import { batchInVessels, makeBatch, startRequest, startThroughApi } from '../helpers/batches';
import { makeCase } from '../helpers/bottles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { daysAgo } from '../helpers/dates';
import { makeRack, placeDirectly } from '../helpers/places';
import { makeVessel, sanitisedDaysAgo, sanitisedVessel, vesselRow } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

describe('POST /batches (start)', () => {
  it('fills the chosen vessels, writes the started entry and warns about glass', async () => {
    const glass = await sanitisedVessel(ds, crew.cellar.id, { material: 'glass', capacityL: 23 });
    const bucket = await sanitisedVessel(ds, crew.cellar.id, { material: 'plastic', kind: 'bucket', capacityL: 30 });
    const before = await vesselRow(ds, glass.id);
    const res = await crew.as.hand.post(crew.batches).send(
      startRequest(
        [
          { vessel: glass, volumeL: 19 },
          { vessel: bucket, volumeL: 25.5 },
        ],
        { name: 'Hedgerow melomel' },
      ),
    );
    expect(res.status).toBe(201);
    const { batch, entryId, warnings } = operationResultSchema.parse(res.body);
    expect(batch).toMatchObject({
      name: 'Hedgerow melomel',
      kind: 'melomel',
      stage: 'primary',
      og: 1.11,
      volumeL: 44.5,
      vesselCount: 2,
      needsRacking: false,
    });
    expect(batch.vessels.map((v) => [v.id, v.volumeL]).sort()).toEqual(
      [
        [glass.id, 19],
        [bucket.id, 25.5],
      ].sort(),
    );
    expect(warnings).toEqual([CAUTION_GLASS]);
    expect(batch.journal).toHaveLength(1);
    const started = batch.journal[0];
    expect(started.id).toBe(entryId);
    expect(started.author).toEqual({ id: crew.hand.id, name: crew.hand.displayName });
    expect(started.payload).toMatchObject({ kind: 'started', volumeL: 44.5, og: 1.11, override: null, parents: [] });
    // Started today: the entry is dated now, not at noon.
    expect(Math.abs(Date.parse(started.occurredAt) - Date.now())).toBeLessThan(60_000);
    const after = await vesselRow(ds, glass.id);
    expect(after).toMatchObject({ batch_id: batch.id, volume_l: 19 });
    expect(after.version).toBe(before.version + 1);
  });

  it('dates a start on an earlier day at noon UTC of that day', async () => {
    const { result } = await batchInVessels(ds, crew, [18], { startedOn: '2025-09-14' });
    expect(result.batch.startedOn).toBe('2025-09-14');
    expect(result.batch.journal[0].occurredAt).toBe('2025-09-14T12:00:00.000Z');
  });

  it('refuses a vessel that already holds a batch, naming it', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [18]);
    const res = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel: vessels[0], volumeL: 10 }]));
    expect(res.status).toBe(409);
    expect(res.body.message).toBe(`${vessels[0].name} already holds ${result.batch.name} (18 L); choose an empty vessel.`);
  });

  it('refuses a retired vessel and one too small, and changes nothing', async () => {
    const retired = await makeVessel(ds, crew.cellar.id, { name: 'Cracked demijohn', retiredAt: new Date(), cleaningState: 'clean' });
    const small = await sanitisedVessel(ds, crew.cellar.id, { name: 'Gallon jug', capacityL: 4.5 });
    const retiredRes = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel: retired, volumeL: 4 }]));
    expect(retiredRes.status).toBe(409);
    expect(retiredRes.body.message).toMatch(/Cracked demijohn is retired/);
    const free = await sanitisedVessel(ds, crew.cellar.id);
    const tooMuch = await crew.as.hand.post(crew.batches).send(
      startRequest([
        { vessel: free, volumeL: 20 },
        { vessel: small, volumeL: 5 },
      ]),
    );
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.message).toBe('Gallon jug holds 4.5 L; 5 L will not fit.');
    // All or nothing: the first vessel was not filled either.
    expect((await vesselRow(ds, free.id)).batch_id).toBeNull();
  });

  it('refuses a dirty or lapsed vessel without a reason, and journals the reason when given', async () => {
    const dirty = await makeVessel(ds, crew.cellar.id, { name: 'Unwashed carboy', cleaningState: 'dirty' });
    const lapsed = await sanitisedVessel(ds, crew.cellar.id, { name: 'Old sanitised carboy' });
    await sanitisedDaysAgo(ds, lapsed.id, 30);
    const refused = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel: dirty, volumeL: 10 }]));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/^Unwashed carboy is dirty, not sanitised\..*give a reason/);
    const lapsedRes = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel: lapsed, volumeL: 10 }]));
    expect(lapsedRes.status).toBe(409);
    expect(lapsedRes.body.message).toMatch(/Old sanitised carboy was sanitised on .*more than 7 days ago/);
    const allowed = await startThroughApi(crew.as.hand, crew.batches, [{ vessel: dirty, volumeL: 10 }], {
      override: { reason: 'Rinsed with boiling water' },
    });
    expect(allowed.batch.journal[0].payload).toMatchObject({ kind: 'started', override: 'Rinsed with boiling water' });
  });

  it('refuses a start date in the future and an OG above 1.200', async () => {
    const vessel = await sanitisedVessel(ds, crew.cellar.id);
    const future = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel, volumeL: 10 }], { startedOn: daysAgo(-3) }));
    expect(future.status).toBe(400);
    expect(future.body.message).toMatch(/startedOn/);
    const og = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel, volumeL: 10 }], { og: 1.25 }));
    expect(og.status).toBe(400);
    expect(og.body.issues.map((i: { path: string }) => i.path)).toContain('body.og');
  });

  it('refuses a vessel of another cellar (404) and a Guest (403)', async () => {
    const theirs = await sanitisedVessel(ds, other.cellar.id);
    const foreign = await crew.as.hand.post(crew.batches).send(startRequest([{ vessel: theirs, volumeL: 10 }]));
    expect(foreign.status).toBe(404);
    const ours = await sanitisedVessel(ds, crew.cellar.id);
    const guest = await crew.as.guest.post(crew.batches).send(startRequest([{ vessel: ours, volumeL: 10 }]));
    expect(guest.status).toBe(403);
    expect((await vesselRow(ds, ours.id)).batch_id).toBeNull();
    expect((await vesselRow(ds, theirs.id)).batch_id).toBeNull();
  });
});

describe('GET /batches/:batchId', () => {
  it('shows vessels with their place, bottle lots with bottles left, and the journal newest first', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [20, 4], { startedOn: daysAgo(10) });
    const rack = await makeRack(ds, crew.cellar.id, `Stair rack ${result.batch.id.slice(0, 6)}`, [3]);
    await placeDirectly(ds, crew.cellar.id, rack.shelfIds[0], 2, { vesselId: vessels[0].id });
    const box = await makeCase(ds, crew.cellar.id, result.batch.id, { bottlesInitial: 12, bottlesLeft: 7 });
    await ds.query(
      `INSERT INTO bottle_cases (cellar_id, lot_id, code, number, bottles_initial, bottles_left) VALUES ($1, $2, 'ZZZZ2345', 2, 12, 5)`,
      [crew.cellar.id, box.lotId],
    );
    await crew.as.hand.post(`${crew.batches}/${result.batch.id}/notes`).send({ text: 'Smells of blackberries' }).expect(201);

    const res = await crew.as.guest.get(`${crew.batches}/${result.batch.id}`);
    expect(res.status).toBe(200);
    const detail = batchDetailSchema.parse(res.body);
    const placed = detail.vessels.find((v) => v.id === vessels[0].id);
    expect(placed?.place).toEqual({ rackId: rack.id, rackName: rack.name, shelfId: rack.shelfIds[0], shelfNumber: 1, slot: 2 });
    expect(detail.vessels.find((v) => v.id === vessels[1].id)?.place).toBeNull();
    expect(detail.lots).toEqual([
      { id: box.lotId, code: expect.any(String), bottledOn: '2026-03-01', bottleMl: 750, bottleCount: 24, bottlesLeft: 12 },
    ]);
    expect(detail.journal.map((e) => e.payload.kind)).toEqual(['note', 'started']);
    expect(detail.ingredients).toEqual([{ category: 'honey', name: 'Wildflower honey', amount: 6, unit: 'kg' }]);
    expect(detail).toMatchObject({ yeastName: 'Test wine yeast', yeastToleranceAbv: 14, plannedVolumeL: 24, volumeL: 24, vesselCount: 2 });
  });

  it('answers 404 for a batch of another cellar and 400 for an id that is not one', async () => {
    const { result } = await batchInVessels(ds, other, [10]);
    const res = await crew.as.keeper.get(`${crew.batches}/${result.batch.id}`);
    expect(res.status).toBe(404);
    expect(res.body.message).toBe('No such batch in this cellar.');
    const bad = await crew.as.keeper.get(`${crew.batches}/not-an-id`);
    expect(bad.status).toBe(400);
  });
});

describe('GET /batches (list)', () => {
  it('filters by stage, kind, age, racking due and name, in SQL, with totals', async () => {
    const own = await crewWithAgents(app, ds);
    const fresh = await batchInVessels(ds, own, [20], { name: 'Fresh traditional', kind: 'traditional-mead' });
    const oldCider = await batchInVessels(ds, own, [20], { name: 'Old orchard cider', kind: 'cider', startedOn: daysAgo(200) });
    const longRacked = await batchInVessels(ds, own, [20], { name: 'Long racked melomel', startedOn: daysAgo(100) });
    const justRacked = await batchInVessels(ds, own, [20], { name: 'Just racked melomel', startedOn: daysAgo(100) });
    for (const [made, days] of [
      [longRacked, 95],
      [justRacked, 10],
    ] as const) {
      const target = await sanitisedVessel(ds, own.cellar.id);
      const rack = await own.as.hand.post(`${own.batches}/${made.result.batch.id}/rackings`).send({
        from: [{ vesselId: made.vessels[0].id }],
        to: [{ vesselId: target.id, volumeL: 19 }],
        at: new Date(Date.now() - days * 86_400_000).toISOString(),
      });
      expect(rack.status).toBe(201);
    }
    // Long finished, in no vessel: never "needs racking".
    const gone = await makeBatch(ds, own.cellar.id, { name: 'Gone 50% cyser', kind: 'cyser', startedOn: daysAgo(400) });

    const list = async (query: string) => {
      const res = await own.as.guest.get(`${own.batches}?${query}`);
      expect(res.status).toBe(200);
      const page = batchPageSchema.parse(res.body);
      return { total: page.total, names: page.items.map((b) => b.name).sort() };
    };
    expect(await list('stage=secondary')).toEqual({ total: 2, names: ['Just racked melomel', 'Long racked melomel'] });
    expect(await list('kind=cider')).toEqual({ total: 1, names: ['Old orchard cider'] });
    expect(await list('agedMonths=6')).toEqual({ total: 2, names: ['Gone 50% cyser', 'Old orchard cider'] });
    expect(await list('agedMonths=3')).toEqual({
      total: 4,
      names: ['Gone 50% cyser', 'Just racked melomel', 'Long racked melomel', 'Old orchard cider'],
    });
    expect(await list('needsRacking=true')).toEqual({ total: 2, names: ['Long racked melomel', 'Old orchard cider'] });
    expect(await list('needsRacking=false')).toEqual({ total: 3, names: ['Fresh traditional', 'Gone 50% cyser', 'Just racked melomel'] });
    expect(await list('q=RACKED')).toEqual({ total: 2, names: ['Just racked melomel', 'Long racked melomel'] });
    // % is a character to look for, not a wildcard.
    expect(await list('q=50%25')).toEqual({ total: 1, names: ['Gone 50% cyser'] });
    expect(await list('stage=primary&needsRacking=true')).toEqual({ total: 1, names: ['Old orchard cider'] });

    const all = batchPageSchema.parse((await own.as.guest.get(`${own.batches}?sort=started-asc`)).body);
    expect(all.total).toBe(5);
    // Same start day: the one started first comes first.
    expect(all.items.map((b) => b.id)).toEqual([
      gone.id,
      oldCider.result.batch.id,
      longRacked.result.batch.id,
      justRacked.result.batch.id,
      fresh.result.batch.id,
    ]);
    const summary = all.items.find((b) => b.id === longRacked.result.batch.id);
    expect(summary).toMatchObject({ stage: 'secondary', volumeL: 19, vesselCount: 1, needsRacking: true });
    expect(all.items.find((b) => b.id === gone.id)).toMatchObject({ volumeL: 0, vesselCount: 0, needsRacking: false });

    const page2 = batchPageSchema.parse((await own.as.guest.get(`${own.batches}?sort=name&pageSize=2&page=2`)).body);
    expect(page2).toMatchObject({ total: 5, page: 2, pageSize: 2 });
    expect(page2.items.map((b) => b.name)).toEqual(['Just racked melomel', 'Long racked melomel']);
  });

  it('never reads a journal for the list: a fixed number of queries, none on journal_entries', async () => {
    const own = await crewWithAgents(app, ds);
    const queriesFor = async (count: number) => {
      while ((await own.as.guest.get(own.batches)).body.total < count) await batchInVessels(ds, own, [10]);
      const spy = vi.spyOn(ds.logger, 'logQuery');
      try {
        await own.as.guest.get(`${own.batches}?needsRacking=false`).expect(200);
        return spy.mock.calls.map((call) => String(call[0]));
      } finally {
        spy.mockRestore();
      }
    };
    const withOne = await queriesFor(1);
    const withThree = await queriesFor(3);
    expect(withOne.length).toBeGreaterThan(0);
    expect(withThree.length).toBe(withOne.length);
    expect(withThree.filter((sql) => sql.includes('journal_entries'))).toEqual([]);
  });

  it('refuses a filter it does not know', async () => {
    const res = await crew.as.guest.get(`${crew.batches}?stage=fermenting`);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/query\.stage/);
  });
});

describe('PATCH and DELETE /batches/:batchId', () => {
  it('renames a batch and journals who renamed it', async () => {
    const { result } = await batchInVessels(ds, crew, [12], { name: 'Working title' });
    const res = await crew.as.hand.patch(`${crew.batches}/${result.batch.id}`).send({ name: 'Midsummer melomel', targetSweetness: 'semi-sweet' });
    expect(res.status).toBe(200);
    const detail = batchDetailSchema.parse(res.body);
    expect(detail).toMatchObject({ name: 'Midsummer melomel', targetSweetness: 'semi-sweet' });
    expect(detail.journal[0].payload).toEqual({
      kind: 'note',
      text: 'Renamed from “Working title” to “Midsummer melomel”. Target sweetness changed from none to semi-sweet.',
    });
    const guest = await crew.as.guest.patch(`${crew.batches}/${result.batch.id}`).send({ name: 'Guest was here' });
    expect(guest.status).toBe(403);
  });

  it('deletes only for a Keeper, and only a batch with no vessels, lots or descendants', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [12]);
    const byHand = await crew.as.hand.delete(`${crew.batches}/${result.batch.id}`);
    expect(byHand.status).toBe(403);
    const inVessel = await crew.as.keeper.delete(`${crew.batches}/${result.batch.id}`);
    expect(inVessel.status).toBe(409);
    expect(inVessel.body.message).toBe(
      `${result.batch.name} is still in ${vessels[0].name} (12 L). Rack, bottle or empty it before deleting the batch.`,
    );

    const bottled = await makeBatch(ds, crew.cellar.id);
    await makeCase(ds, crew.cellar.id, bottled.id);
    const withLots = await crew.as.keeper.delete(`${crew.batches}/${bottled.id}`);
    expect(withLots.status).toBe(409);
    expect(withLots.body.message).toMatch(/bottle lot/);

    const mistake = await makeBatch(ds, crew.cellar.id);
    const ok = await crew.as.keeper.delete(`${crew.batches}/${mistake.id}`);
    expect(ok.status).toBe(204);
    expect((await crew.as.keeper.get(`${crew.batches}/${mistake.id}`)).status).toBe(404);

    const theirs = await makeBatch(ds, other.cellar.id);
    expect((await crew.as.keeper.delete(`${crew.batches}/${theirs.id}`)).status).toBe(404);
  });
});
