import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION_BOTTLE_PRESSURE, CAUTION_SULFITES, correctGravity, headspace, CAUTION_SPICE_IN_PRIMARY } from '../../shared/calc';
import { batchDetailSchema, operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchInVessels, makeBatch } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { sanitisedVessel, vesselRow } from '../helpers/vessels';
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

const url = (batchId: string, path: string, c: Crew = crew) => `${c.batches}/${batchId}/${path}`;
const detailOf = async (batchId: string) => batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${batchId}`)).body);
const oak = { category: 'oak', name: 'Medium toast oak cubes', amount: 30, unit: 'g', removeOn: '2026-09-01' };

describe('additions and removals', () => {
  it('keeps oak on the "still in" list until its removal is recorded, once', async () => {
    const {
      result,
      vessels: [vessel],
    } = await batchInVessels(ds, crew, [20]);
    const added = await crew.as.hand.post(url(result.batch.id, 'additions')).send({ ...oak, vesselId: vessel.id });
    expect(added.status).toBe(201);
    const { batch, entryId } = operationResultSchema.parse(added.body);
    expect(batch.additionsIn).toEqual([{ entryId, name: 'Medium toast oak cubes', category: 'oak', removeOn: '2026-09-01' }]);
    expect(batch.journal[0].payload).toEqual({
      kind: 'addition',
      category: 'oak',
      name: 'Medium toast oak cubes',
      amount: 30,
      unit: 'g',
      vesselId: vessel.id,
      removeOn: '2026-09-01',
    });

    // Fruit with no removal date never shows as "still in".
    await crew.as.hand.post(url(result.batch.id, 'additions')).send({ category: 'fruit', name: 'Blackberries', amount: 2, unit: 'kg' }).expect(201);
    const removed = await crew.as.hand.post(url(result.batch.id, 'removals')).send({ additionEntryId: entryId });
    expect(removed.status).toBe(201);
    expect(removed.body.batch.additionsIn).toEqual([]);
    expect(removed.body.batch.journal[0].payload).toEqual({ kind: 'removed', additionEntryId: entryId, name: 'Medium toast oak cubes' });

    const again = await crew.as.hand.post(url(result.batch.id, 'removals')).send({ additionEntryId: entryId });
    expect(again.status).toBe(409);
    expect(again.body.message).toMatch(/^Medium toast oak cubes was already taken out of/);
  });

  it('refuses to remove an addition of another batch, or an entry that is no addition', async () => {
    const { result: mine } = await batchInVessels(ds, crew, [10]);
    const { result: theirs } = await batchInVessels(ds, crew, [10]);
    const theirOak = await crew.as.hand.post(url(theirs.batch.id, 'additions')).send(oak).expect(201);
    const foreign = await crew.as.hand.post(url(mine.batch.id, 'removals')).send({ additionEntryId: theirOak.body.entryId });
    expect(foreign.status).toBe(409);
    expect(foreign.body.message).toBe(`That entry is not an addition to ${mine.batch.name}, so it cannot be taken out.`);
    const started = mine.batch.journal[0].id;
    expect((await crew.as.hand.post(url(mine.batch.id, 'removals')).send({ additionEntryId: started })).status).toBe(409);
    expect((await detailOf(theirs.batch.id)).additionsIn).toHaveLength(1);
  });

  it('adds the sulfite caution to a metabisulfite addition; sulfite in primary leaves the batch in primary', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const res = await crew.as.hand
      .post(url(result.batch.id, 'additions'))
      .send({ category: 'stabiliser', name: 'Potassium metabisulfite', amount: 1.1, unit: 'g' });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([CAUTION_SULFITES]);
    // Sulfiting a must before pitching is common practice; it is not the stabilising of a finished batch.
    expect(res.body.batch.stage).toBe('primary');
    // Cinnamon in primary can slow the yeast (common practice): the caution stands beside it.
    const spice = await crew.as.hand
      .post(url(result.batch.id, 'additions'))
      .send({ category: 'spice', name: 'Cinnamon stick', amount: 1, unit: 'pc' });
    expect(spice.body.warnings).toEqual([CAUTION_SPICE_IN_PRIMARY]);
  });

  it('warns about bottle pressure when sweetening a batch that was never stabilised', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const res = await crew.as.hand
      .post(url(result.batch.id, 'additions'))
      .send({ category: 'sweetener', name: 'Orange blossom honey', amount: 400, unit: 'g' });
    expect(res.status).toBe(201);
    expect(res.body.warnings).toEqual([CAUTION_BOTTLE_PRESSURE]);
  });

  it('refuses an addition into a vessel of another batch, to a batch in no vessel, and from a Guest', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const {
      vessels: [theirs],
    } = await batchInVessels(ds, crew, [10]);
    expect((await crew.as.hand.post(url(result.batch.id, 'additions')).send({ ...oak, vesselId: theirs.id })).status).toBe(409);
    const gone = await makeBatch(ds, crew.cellar.id);
    expect((await crew.as.hand.post(url(gone.id, 'additions')).send(oak)).status).toBe(409);
    expect((await crew.as.guest.post(url(result.batch.id, 'additions')).send(oak)).status).toBe(403);
    const bad = await crew.as.hand.post(url(result.batch.id, 'additions')).send({ ...oak, category: 'glitter' });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path)).toEqual(['body.category']);
    expect((await detailOf(result.batch.id)).journal).toHaveLength(1);
  });
});

describe('top-ups, degassing, tastings and notes', () => {
  it('tops a vessel up, bumping its volume and version, and refuses more than fits', async () => {
    const {
      result,
      vessels: [vessel],
    } = await batchInVessels(ds, crew, [20], {}, { name: 'Demijohn 4', capacityL: 23 });
    // Past primary (headspace is not warned about while a batch is in primary: tests/api/batch-family.test.ts).
    await ds.query(`UPDATE batches SET stage = 'secondary' WHERE id = $1`, [result.batch.id]);
    const before = await vesselRow(ds, vessel.id);
    const res = await crew.as.hand.post(url(result.batch.id, 'top-ups')).send({ vesselId: vessel.id, volumeL: 1, with: 'Spare must' });
    expect(res.status).toBe(201);
    expect(res.body.batch.volumeL).toBe(21);
    expect(res.body.batch.journal[0].payload).toEqual({
      kind: 'topped-up',
      vesselId: vessel.id,
      vesselName: 'Demijohn 4',
      volumeL: 1,
      with: 'Spare must',
    });
    // Still above the cellar's 5 % after this top-up, so it says so.
    const percent = Math.round(headspace({ capacityL: 23, volumeL: 21 }).percent);
    expect(res.body.warnings).toEqual([`Demijohn 4 has ${percent} % headspace — top up or use a smaller vessel to limit oxidation.`]);
    const after = await vesselRow(ds, vessel.id);
    expect(after.volume_l).toBe(21);
    expect(after.version).toBe(before.version + 1);

    const over = await crew.as.hand.post(url(result.batch.id, 'top-ups')).send({ vesselId: vessel.id, volumeL: 2.5, with: 'Water' });
    expect(over.status).toBe(409);
    expect(over.body.message).toBe('Demijohn 4 holds 21 L of 23 L; 2.5 L more will not fit (room for 2 L).');
    // In the units the person reads, when the request names them: 1 US gal = 3.785411784 L and
    // 1 US fl oz = 1/128 US gal (NIST Handbook 44, Appendix C). 21 L = 5.548 gal, 23 L = 6.076 gal,
    // 2.5 L = 84.54 fl oz, 2 L = 67.63 fl oz; below a gallon the app says fl oz.
    const overIn = (units: string) =>
      crew.as.hand.post(url(result.batch.id, 'top-ups')).set('Units-Shown', units).send({ vesselId: vessel.id, volumeL: 2.5, with: 'Water' });
    const overInUs = await overIn('us');
    expect(overInUs.status).toBe(409);
    expect(overInUs.body.message).toBe('Demijohn 4 holds 5.55 US gal of 6.08 US gal; 84.5 US fl oz more will not fit (room for 67.6 US fl oz).');
    // A units name the server does not know words it in metric, as without the header: a display choice, never refused.
    expect((await overIn('imperial')).body.message).toBe(over.body.message);
    const {
      vessels: [theirs],
    } = await batchInVessels(ds, crew, [10]);
    expect((await crew.as.hand.post(url(result.batch.id, 'top-ups')).send({ vesselId: theirs.id, volumeL: 1, with: 'Water' })).status).toBe(409);
    expect((await vesselRow(ds, vessel.id)).volume_l).toBe(21);

    expect(headspace({ capacityL: 23, volumeL: 22.5 }).percent).toBeLessThan(5);
    const full = await crew.as.hand.post(url(result.batch.id, 'top-ups')).send({ vesselId: vessel.id, volumeL: 1.5, with: 'Water' });
    expect(full.status).toBe(201);
    expect(full.body.warnings).toEqual([]);
  });

  it('records degassing, tastings and notes; tastings and notes also once the batch is in bottles only', async () => {
    const {
      result,
      vessels: [vessel],
    } = await batchInVessels(ds, crew, [20]);
    const degassed = await crew.as.hand.post(url(result.batch.id, 'degassings')).send({ vesselId: vessel.id, note: 'Wand, 3 minutes' });
    expect(degassed.status).toBe(201);
    expect(degassed.body.batch.journal[0].payload).toEqual({ kind: 'degassed', vesselId: vessel.id, note: 'Wand, 3 minutes' });
    const tasted = await crew.as.hand.post(url(result.batch.id, 'tastings')).send({ aroma: 'Honey and bramble', flavour: 'Dry, warm', score: 6 });
    expect(tasted.status).toBe(201);
    expect(tasted.body.batch.journal[0].payload).toEqual({
      kind: 'tasted',
      appearance: '',
      aroma: 'Honey and bramble',
      flavour: 'Dry, warm',
      score: 6,
    });
    // Cellarwright's own 8-point scale (shared/domain/tasting-scale.ts): whole points 1 to 8.
    const tooHigh = await crew.as.hand.post(url(result.batch.id, 'tastings')).send({ score: 9 });
    expect(tooHigh.status).toBe(400);
    expect(tooHigh.body.message).toBe('body.score: at most 8');
    expect((await crew.as.hand.post(url(result.batch.id, 'tastings')).send({ score: 0 })).status).toBe(400);
    expect((await crew.as.hand.post(url(result.batch.id, 'tastings')).send({ score: 5.5 })).status).toBe(400);
    const note = await crew.as.hand.post(url(result.batch.id, 'notes')).send({ text: 'Airlock bubbling every 4 s' });
    expect(note.status).toBe(201);
    expect((await crew.as.hand.post(url(result.batch.id, 'notes')).send({ text: '   ' })).status).toBe(400);

    const bottled = await makeBatch(ds, crew.cellar.id);
    expect((await crew.as.hand.post(url(bottled.id, 'tastings')).send({ flavour: 'Lovely after a year' })).status).toBe(201);
    expect((await crew.as.hand.post(url(bottled.id, 'notes')).send({ text: 'Opened one at midsummer' })).status).toBe(201);
    expect((await crew.as.hand.post(url(bottled.id, 'degassings')).send({})).status).toBe(409);
  });

  it('answers 403 to a Guest and 404 for another cellar’s batch on every operation', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const { result: theirs } = await batchInVessels(ds, other, [20]);
    const bodies: [string, Record<string, unknown>][] = [
      ['notes', { text: 'Hello' }],
      ['tastings', { aroma: 'Fine' }],
      ['degassings', {}],
      ['additions', oak],
    ];
    for (const [path, body] of bodies) {
      expect((await crew.as.guest.post(url(result.batch.id, path)).send(body)).status, path).toBe(403);
      expect((await crew.as.hand.post(url(theirs.batch.id, path)).send(body)).status, path).toBe(404);
    }
    expect((await detailOf(result.batch.id)).journal).toHaveLength(1);
  });
});

describe('amendments', () => {
  it('corrects a reading: the readings show the corrected figures, the original stays in the journal', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const logged = await crew.as.hand.post(url(result.batch.id, 'readings')).send({ sg: 1.032, temperatureC: 20 }).expect(201);
    const readingId: string = logged.body.entryId;
    const res = await crew.as.keeper
      .post(url(result.batch.id, `journal/${readingId}/amendments`))
      .send({ reason: 'Misread the scale', changes: { sg: 1.023, temperatureC: 26 } });
    expect(res.status).toBe(201);
    const { batch, entryId } = operationResultSchema.parse(res.body);
    const expected = correctGravity(1.023, 26, 20);
    expect(batch.readings).toHaveLength(1);
    expect(batch.readings[0]).toMatchObject({ entryId: readingId, sg: 1.023, temperatureC: 26 });
    expect(batch.readings[0].correctedSg).toBeCloseTo(expected, 9);
    expect(batch.lastReading?.sg).toBeCloseTo(expected, 3);

    const original = batch.journal.find((e) => e.id === readingId);
    expect(original?.payload).toMatchObject({ kind: 'reading', sg: 1.032, temperatureC: 20 });
    expect(original?.amendedBy).toEqual([entryId]);
    const amendment = batch.journal.find((e) => e.id === entryId);
    expect(amendment).toMatchObject({ amendsEntryId: readingId, author: { id: crew.keeper.id, name: crew.keeper.displayName } });
    expect(amendment?.payload).toMatchObject({ kind: 'amendment', reason: 'Misread the scale', changes: { sg: 1.023, temperatureC: 26 } });
    const changes = amendment?.payload.kind === 'amendment' ? amendment.payload.changes : {};
    expect(changes.correctedSg).toBeCloseTo(expected, 9);

    // A second amendment builds on the first: only the pH changes, the gravity stays corrected.
    const more = await crew.as.hand
      .post(url(result.batch.id, `journal/${readingId}/amendments`))
      .send({ reason: 'Forgot the pH', changes: { ph: 3.4 } });
    expect(more.status).toBe(201);
    expect(more.body.batch.readings[0]).toMatchObject({ sg: 1.023, temperatureC: 26, ph: 3.4 });
    expect(more.body.batch.readings[0].correctedSg).toBeCloseTo(expected, 9);
    const [{ count }] = await ds.query(`SELECT COUNT(*)::int AS count FROM journal_entries WHERE batch_id = $1`, [result.batch.id]);
    expect(count).toBe(4);
  });

  it('corrects an addition’s name and removal date, a tasting and a note', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const added = await crew.as.hand.post(url(result.batch.id, 'additions')).send(oak).expect(201);
    const fixed = await crew.as.hand
      .post(url(result.batch.id, `journal/${added.body.entryId}/amendments`))
      .send({ reason: 'Wrong oak', changes: { name: 'French oak spiral', removeOn: '2026-10-15' } });
    expect(fixed.status).toBe(201);
    expect(fixed.body.batch.additionsIn).toEqual([
      { entryId: added.body.entryId, name: 'French oak spiral', category: 'oak', removeOn: '2026-10-15' },
    ]);
    const removal = await crew.as.hand.post(url(result.batch.id, 'removals')).send({ additionEntryId: added.body.entryId }).expect(201);
    expect(removal.body.batch.journal[0].payload.name).toBe('French oak spiral');

    const tasted = await crew.as.hand.post(url(result.batch.id, 'tastings')).send({ score: 5 }).expect(201);
    expect(
      (
        await crew.as.hand
          .post(url(result.batch.id, `journal/${tasted.body.entryId}/amendments`))
          .send({ reason: 'Typo', changes: { score: 6, aroma: 'Pear' } })
      ).status,
    ).toBe(201);
    const note = await crew.as.hand.post(url(result.batch.id, 'notes')).send({ text: 'Racked tomorow' }).expect(201);
    expect(
      (
        await crew.as.hand
          .post(url(result.batch.id, `journal/${note.body.entryId}/amendments`))
          .send({ reason: 'Spelling', changes: { text: 'Rack tomorrow' } })
      ).status,
    ).toBe(201);
  });

  it('refuses to amend volumes and vessel moves (409) and bad changes (400)', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [20]);
    const target = await sanitisedVessel(ds, crew.cellar.id);
    const racked = await crew.as.hand
      .post(url(result.batch.id, 'rackings'))
      .send({ from: [{ vesselId: source.id }], to: [{ vesselId: target.id, volumeL: 19 }] });
    expect(racked.status).toBe(201);
    const amendRacking = await crew.as.hand
      .post(url(result.batch.id, `journal/${racked.body.entryId}/amendments`))
      .send({ reason: 'Wrong volume', changes: { lossL: 0.5 } });
    expect(amendRacking.status).toBe(409);
    expect(amendRacking.body.message).toBe('Volumes and vessel moves cannot be amended; record a new operation instead.');
    const startedId = result.batch.journal[0].id;
    // The start's figures can be corrected (issue 12); which vessels it filled cannot.
    const amendStartVessels = await crew.as.hand
      .post(url(result.batch.id, `journal/${startedId}/amendments`))
      .send({ reason: 'Wrong vessel', changes: { vessels: [{ vesselId: target.id, vesselName: target.name, volumeL: 20 }] } });
    expect(amendStartVessels.status).toBe(400);
    expect(amendStartVessels.body.message).toMatch(/^body\.changes: the start has no field vessels/);

    const reading = await crew.as.hand.post(url(result.batch.id, 'readings')).send({ sg: 1.01 }).expect(201);
    const amend = (changes: Record<string, unknown>) =>
      crew.as.hand.post(url(result.batch.id, `journal/${reading.body.entryId}/amendments`)).send({ reason: 'Fixing it', changes });
    const unknown = await amend({ colour: 'gold' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/^body\.changes: a reading has no field colour/);
    const wrongType = await amend({ sg: 'high' });
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.issues.map((i: { path: string }) => i.path)).toEqual(['body.changes.sg']);
    const outOfRange = await amend({ sg: 1.3 });
    expect(outOfRange.status).toBe(400);
    expect(outOfRange.body.message).toBe('body.changes.sg: a gravity is at most 1.200');
    const correctedByHand = await amend({ correctedSg: 1.0 });
    expect(correctedByHand.status).toBe(400);
    expect((await amend({})).status).toBe(400);
    const amendment = await amend({ sg: 1.011 });
    expect(amendment.status).toBe(201);
    const ofAmendment = await crew.as.hand
      .post(url(result.batch.id, `journal/${amendment.body.entryId}/amendments`))
      .send({ reason: 'Again', changes: { sg: 1.012 } });
    expect(ofAmendment.status).toBe(409);
    expect((await detailOf(result.batch.id)).readings[0].sg).toBe(1.011);
  });

  it('answers 404 for an entry of another batch and 403 to a Guest', async () => {
    const { result: mine } = await batchInVessels(ds, crew, [20]);
    const { result: theirs } = await batchInVessels(ds, crew, [20]);
    const note = await crew.as.hand.post(url(theirs.batch.id, 'notes')).send({ text: 'Theirs' }).expect(201);
    const wrong = await crew.as.hand
      .post(url(mine.batch.id, `journal/${note.body.entryId}/amendments`))
      .send({ reason: 'Sneaky', changes: { text: 'Mine now' } });
    expect(wrong.status).toBe(404);
    const guest = await crew.as.guest
      .post(url(theirs.batch.id, `journal/${note.body.entryId}/amendments`))
      .send({ reason: 'Sneaky', changes: { text: 'Guest' } });
    expect(guest.status).toBe(403);
    expect((await detailOf(theirs.batch.id)).journal[0].amendedBy).toEqual([]);
  });
});
