import { beforeAll, describe, expect, it } from 'vitest';
import { memberActor } from '../../server/core/actor';
import { TastingScoresOnOwnScale1796171100000 } from '../../server/db/migrations/1796171100000-TastingScoresOnOwnScale';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { batchDetailSchema, operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchPageSchema } from '../../shared/schemas/batches';
import { batchFamilySchema } from '../../shared/schemas/family';
import { vesselPageSchema } from '../../shared/schemas/vessels';
import { makeBatchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { addJournalEntry, addReadings } from '../helpers/journal';
import { makeRack, placeDirectly } from '../helpers/places';
import { testApp } from '../helpers/test-app';
import { sanitisedVessel } from '../helpers/vessels';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

/** A batch in two vessels with readings 30, 20 and 10 days ago, its second vessel split off. */
async function splitFamily() {
  const { batch, vessels } = await makeBatchInVessels(ds, crew, {
    name: `Hawthorn must ${Date.now()}`,
    og: 1.1,
    volumesL: [10, 9],
    startedDaysAgo: 40,
  });
  await addReadings(ds, crew, batch.id, [
    { daysAgo: 30, sg: 1.06 },
    { daysAgo: 20, sg: 1.02 },
    { daysAgo: 10, sg: 1.004 },
  ]);
  const splitAt = new Date(Date.now() - 15 * 86_400_000);
  const res = await crew.as.hand
    .post(`${crew.batches}/${batch.id}/splits`)
    .send({ vessels: [{ vesselId: vessels[1]!.id }], name: `Hawthorn on oak ${Date.now()}`, kind: 'melomel', at: splitAt.toISOString() });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { parent: batch, vessels, child: operationResultSchema.parse(res.body).batch, splitAt };
}

describe('a split follows the must it came from', () => {
  it('keeps the start date, takes the parent’s readings up to the split and says since when it is its own batch', async () => {
    const { parent, child, splitAt } = await splitFamily();
    expect(child.startedOn).toBe(parent.startedOn);
    expect(new Date(child.ownSince!).getTime()).toBe(splitAt.getTime());
    // Readings 30 and 20 days ago came before the split 15 days ago; the one 10 days ago did not.
    expect(child.readings.map((r) => r.correctedSg)).toEqual([1.06, 1.02]);
    expect(child.readings.every((r) => r.inheritedFrom?.batchId === parent.id)).toBe(true);
    // The list shows its latest figure as well, not a blank.
    const list = batchPageSchema.parse((await crew.as.guest.get(`${crew.batches}?q=${encodeURIComponent(child.name)}`)).body);
    expect(list.items[0]?.lastReading?.sg).toBe(1.02);
    // The parent's own page is unchanged: its own readings, no "own since".
    const parentDetail = batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${parent.id}`)).body);
    expect(parentDetail.readings.map((r) => r.correctedSg)).toEqual([1.06, 1.02, 1.004]);
    expect(parentDetail.ownSince).toBeNull();
  });
});

describe('GET /batches/:batchId/family', () => {
  it('answers the same family, oldest first, from each member', async () => {
    const { parent, child } = await splitFamily();
    for (const id of [parent.id, child.id]) {
      const res = await crew.as.guest.get(`${crew.batches}/${id}/family`);
      expect(res.status).toBe(200);
      const family = batchFamilySchema.parse(res.body);
      expect(family.batchId).toBe(id);
      expect(family.members.map((m) => m.id)).toEqual([parent.id, child.id]);
      expect(family.truncated).toBe(false);
    }
  });

  it('is the batch alone when it has no splits or blends', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const family = batchFamilySchema.parse((await crew.as.guest.get(`${crew.batches}/${batch.id}/family`)).body);
    expect(family.members.map((m) => m.id)).toEqual([batch.id]);
  });

  it('answers 404 for another cellar’s batch', async () => {
    const { parent } = await splitFamily();
    expect((await other.as.keeper.get(`${other.batches}/${parent.id}/family`)).status).toBe(404);
    expect((await other.as.keeper.get(`${crew.batches}/${parent.id}/family`)).status).toBe(404);
  });

  it('works on the demo’s split family', async () => {
    const demo = await crewWithAgents(app, ds);
    await ds.transaction((tx) =>
      seedDemoRecords(tx, { keeper: memberActor(demo.cellar.id, demo.keeper.id, 'keeper'), hand: memberActor(demo.cellar.id, demo.hand.id, 'hand') }),
    );
    const list = batchPageSchema.parse((await demo.as.guest.get(`${demo.batches}?q=Vanilla`)).body);
    const vanilla = list.items[0]!;
    const family = batchFamilySchema.parse((await demo.as.guest.get(`${demo.batches}/${vanilla.id}/family`)).body);
    const names = family.members.map((m) => m.name);
    expect(names).toEqual(['Linden Blossom Metheglin', 'Linden & Vanilla']);
    const [linden, child] = family.members;
    // The demo applies the same rule: the split keeps the must's start, its readings up to the split, and says when it split.
    expect(child!.startedOn).toBe(linden!.startedOn);
    expect(child!.ownSince).not.toBeNull();
    expect(child!.readings.length).toBeGreaterThan(0);
    expect(child!.readings.every((r) => r.inheritedFrom?.batchId === linden!.id && r.at <= child!.ownSince!)).toBe(true);
    expect(child!.lastReading).not.toBeNull();
    // Its tasting sits on our own scale.
    const tasted = linden!.journal.find((e) => e.payload.kind === 'tasted');
    expect(tasted?.payload).toMatchObject({ kind: 'tasted', score: 6 });
  });
});

describe('top-ups record their liquid', () => {
  it('keeps what, its gravity and the batch’s litres before it; an entry without the liquid still reads', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [18] });
    const res = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/top-ups`)
      .send({ vesselId: vessels[0]!.id, volumeL: 0.3, with: 'Honey-water', liquid: { kind: 'honey-water', sg: 1.12 } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(operationResultSchema.parse(res.body).batch.journal[0]!.payload).toEqual({
      kind: 'topped-up',
      vesselId: vessels[0]!.id,
      vesselName: vessels[0]!.name,
      volumeL: 0.3,
      with: 'Honey-water',
      liquid: { kind: 'honey-water', sg: 1.12, abv: null },
      batchVolumeBeforeL: 18,
    });
    await crew.as.hand.post(`${crew.batches}/${batch.id}/top-ups`).send({ vesselId: vessels[0]!.id, volumeL: 0.1, with: 'Water' }).expect(201);
    const detail = batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${batch.id}`)).body);
    expect(detail.journal[0]!.payload).toEqual({
      kind: 'topped-up',
      vesselId: vessels[0]!.id,
      vesselName: vessels[0]!.name,
      volumeL: 0.1,
      with: 'Water',
    });
  });

  it('does not warn about headspace while the batch is in primary', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [12] });
    await ds.query(`UPDATE vessels SET capacity_l = 20 WHERE id = $1`, [vessels[0]!.id]);
    const res = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/top-ups`)
      .send({ vesselId: vessels[0]!.id, volumeL: 1, with: 'Water', liquid: { kind: 'water' } });
    expect(res.status).toBe(201);
    // 13 L in 20 L is 35 % headspace, far above the cellar's limit, and still no warning in primary.
    expect(res.body.batch.stage).toBe('primary');
    expect(res.body.warnings).toEqual([]);
  });

  it('refuses a liquid of no known kind or an impossible gravity', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [19] });
    const url = `${crew.batches}/${batch.id}/top-ups`;
    expect((await crew.as.hand.post(url).send({ vesselId: vessels[0]!.id, volumeL: 0.1, with: 'x', liquid: { kind: 'juice' } })).status).toBe(400);
    expect((await crew.as.hand.post(url).send({ vesselId: vessels[0]!.id, volumeL: 0.1, with: 'x', liquid: { kind: 'water', sg: 2 } })).status).toBe(
      400,
    );
  });
});

describe('lists say where things are', () => {
  it('filters free sanitised vessels by one size', async () => {
    const small = await sanitisedVessel(ds, crew.cellar.id, { name: `Jug 4.5 ${Date.now()}`, capacityL: 4.5 });
    await sanitisedVessel(ds, crew.cellar.id, { name: `Jug 5 ${Date.now()}`, capacityL: 5 });
    const page = vesselPageSchema.parse((await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/vessels?freeAndSanitised=true&capacityL=4.5`)).body);
    expect(page.items.map((v) => v.id)).toContain(small.id);
    expect(page.items.every((v) => v.capacityL === 4.5)).toBe(true);
  });

  it('gives each batch of a list its vessels and their rack slots', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { name: `Placed batch ${Date.now()}`, volumesL: [10, 5] });
    const { shelves } = await makeRack(ds, crew.cellar.id, `Rack W ${Date.now()}`, [4, 4]);
    await placeDirectly(ds, crew.cellar.id, shelves[1]!.id, 3, { vesselId: vessels[0]!.id });
    const list = batchPageSchema.parse((await crew.as.guest.get(`${crew.batches}?q=${encodeURIComponent(batch.name)}`)).body);
    expect(list.items[0]!.whereabouts).toEqual([
      { vesselName: vessels[0]!.name, place: expect.objectContaining({ shelfId: shelves[1]!.id, shelfNumber: 2, slot: 3 }) },
      { vesselName: vessels[1]!.name, place: null },
    ]);
  });
});

describe('tasting scores move to our own scale', () => {
  it('maps stored scores out of 20 and corrections of them by the documented mapping, and back', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    // Written as an older installation stored them: out of 20.
    const tasted = await addJournalEntry(ds, crew.cellar.id, batch.id, { kind: 'tasted', appearance: '', aroma: '', flavour: '', score: 15 });
    const corrected = await addJournalEntry(
      ds,
      crew.cellar.id,
      batch.id,
      { kind: 'amendment', reason: 'typo', changes: { score: 19 } },
      { amendsEntryId: tasted },
    );
    const runner = ds.createQueryRunner();
    await runner.startTransaction();
    try {
      const scoreOf = async (id: string, path: string) =>
        Number((await runner.query(`SELECT payload #>> $2::text[] AS v FROM journal_entries WHERE id = $1`, [id, `{${path}}`]))[0].v);
      await new TastingScoresOnOwnScale1796171100000().up(runner);
      // 1 + round(15 × 7 / 20) = 1 + round(5.25) = 6; 1 + round(19 × 7 / 20) = 1 + round(6.65) = 8.
      expect(await scoreOf(tasted, 'score')).toBe(6);
      expect(await scoreOf(corrected, 'changes,score')).toBe(8);
      await new TastingScoresOnOwnScale1796171100000().down(runner);
      // round((6 − 1) × 20 / 7) = round(14.29) = 14; round((8 − 1) × 20 / 7) = 20.
      expect(await scoreOf(tasted, 'score')).toBe(14);
      expect(await scoreOf(corrected, 'changes,score')).toBe(20);
    } finally {
      await runner.rollbackTransaction();
      await runner.release();
    }
  });
});
