import { beforeAll, describe, expect, it } from 'vitest';
import { CALIBRATION_20C, correctGravity } from '../../shared/calc';
import { batchDetailSchema } from '../../shared/schemas/batch-detail';
import { readingResultSchema } from '../../shared/schemas/journal';
import { batchInVessels, makeBatch } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { momentDaysAgo } from '../helpers/dates';
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

const readings = (batchId: string) => `${crew.batches}/${batchId}/readings`;
/** The batch as the Batch page reads it. */
const batchDetail = async (batchId: string) => batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${batchId}`)).body);

describe('POST /batches/:batchId/readings', () => {
  it('keeps a reading without a temperature as it was read, and shows it as the last reading', async () => {
    const {
      result,
      vessels: [vessel],
    } = await batchInVessels(ds, crew, [20]);
    const res = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.062, ph: 3.6, vesselId: vessel.id });
    expect(res.status).toBe(201);
    // The answer is the reading and the stage, not the whole batch.
    const answer = readingResultSchema.parse(res.body);
    expect(res.body).not.toHaveProperty('batch');
    const { entryId } = answer;
    expect(answer.reading).toEqual({ entryId, at: expect.any(String), sg: 1.062, correctedSg: 1.062, temperatureC: null, ph: 3.6 });
    expect(answer.stage).toBe('primary');
    const batch = await batchDetail(result.batch.id);
    expect(batch.readings).toEqual([answer.reading]);
    expect(batch.lastReading).toEqual({ sg: 1.062, at: batch.readings[0].at });
    expect(batch.journal[0].payload).toEqual({
      kind: 'reading',
      sg: 1.062,
      temperatureC: null,
      calibrationC: 20,
      correctedSg: 1.062,
      ph: 3.6,
      vesselId: vessel.id,
    });
  });

  it('corrects for the sample temperature with shared/calc correctGravity', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const warm = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.05, temperatureC: 28 });
    expect(warm.status).toBe(201);
    const warmReading = readingResultSchema.parse(warm.body).reading;
    expect((await batchDetail(result.batch.id)).readings[0]).toEqual(warmReading);
    expect(warmReading.correctedSg).toBeCloseTo(correctGravity(1.05, 28, CALIBRATION_20C), 9);
    // A warm sample reads low: the correction raises it.
    expect(warmReading.correctedSg).toBeGreaterThan(1.05);
    const old = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.04, temperatureC: 10, calibrationC: 15.56 });
    expect(old.status).toBe(201);
    const oldReading = readingResultSchema.parse(old.body).reading;
    expect((await batchDetail(result.batch.id)).readings.at(-1)).toEqual(oldReading);
    expect(oldReading.correctedSg).toBeCloseTo(correctGravity(1.04, 10, 15.56), 9);
  });

  it('lists readings oldest first whatever order they were logged in', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: momentDaysAgo(20).slice(0, 10) });
    await crew.as.hand
      .post(readings(result.batch.id))
      .send({ sg: 1.01, at: momentDaysAgo(1) })
      .expect(201);
    await crew.as.hand
      .post(readings(result.batch.id))
      .send({ sg: 1.08, at: momentDaysAgo(15) })
      .expect(201);
    await crew.as.hand
      .post(readings(result.batch.id))
      .send({ sg: 1.03, at: momentDaysAgo(7) })
      .expect(201);
    const detail = batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${result.batch.id}`)).body);
    expect(detail.readings.map((r) => r.sg)).toEqual([1.08, 1.03, 1.01]);
    expect(detail.lastReading?.sg).toBe(1.01);
  });

  it('answers 400 naming body.sg for a gravity above 1.200, and for a pH out of range', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const high = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.25 });
    expect(high.status).toBe(400);
    expect(high.body.message).toBe('body.sg: a gravity is at most 1.200');
    const ph = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.01, ph: 7 });
    expect(ph.status).toBe(400);
    expect(ph.body.issues.map((i: { path: string }) => i.path)).toEqual(['body.ph']);
    const detail = (await crew.as.guest.get(`${crew.batches}/${result.batch.id}`)).body;
    expect(detail.readings).toEqual([]);
  });

  it('refuses a vessel that does not hold the batch, and a batch in no vessel', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const {
      result: neighbour,
      vessels: [theirs],
    } = await batchInVessels(ds, crew, [10]);
    const wrong = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.02, vesselId: theirs.id });
    expect(wrong.status).toBe(409);
    expect(wrong.body.message).toMatch(new RegExp(`^${theirs.name} changed while you were working: it now holds ${neighbour.batch.name}`));
    expect(wrong.body.message).toContain(`now holds ${neighbour.batch.name} (10 L)`);
    // What the vessel holds now, in the units the request names: 10 L = 2.642 US gal (1 US gal = 3.785411784 L, NIST Handbook 44).
    const wrongInUs = await crew.as.hand.post(readings(result.batch.id)).set('Units-Shown', 'us').send({ sg: 1.02, vesselId: theirs.id });
    expect(wrongInUs.body.message).toContain(`now holds ${neighbour.batch.name} (2.64 US gal)`);
    const bottled = await makeBatch(ds, crew.cellar.id, { name: 'All bottled mead' });
    const none = await crew.as.hand.post(readings(bottled.id)).send({ sg: 1.0 });
    expect(none.status).toBe(409);
    expect(none.body.message).toMatch(/^All bottled mead is not in any vessel any more/);
  });

  it('refuses a reading dated in the future or before the start', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { startedOn: '2026-02-01' });
    const future = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.02, at: momentDaysAgo(-1) });
    expect(future.status).toBe(400);
    expect(future.body.message).toBe('body.at: that moment is in the future.');
    const early = await crew.as.hand.post(readings(result.batch.id)).send({ sg: 1.02, at: '2026-01-31T08:00:00Z' });
    expect(early.status).toBe(400);
  });

  it('answers 403 to a Guest and 404 for a batch of another cellar', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    expect((await crew.as.guest.post(readings(result.batch.id)).send({ sg: 1.02 })).status).toBe(403);
    const { result: theirs } = await batchInVessels(ds, other, [20]);
    const foreign = await crew.as.hand.post(readings(theirs.batch.id)).send({ sg: 1.02 });
    expect(foreign.status).toBe(404);
    const [{ count }] = await ds.query(`SELECT COUNT(*)::int AS count FROM journal_entries WHERE batch_id = $1 AND kind = 'reading'`, [
      theirs.batch.id,
    ]);
    expect(count).toBe(0);
  });
});
