import { beforeAll, describe, expect, it } from 'vitest';
import { abvBy, bottlesFrom, CAUTION_BOTTLE_PRESSURE, CAUTION_SULFITES, casesFrom, fermentationState } from '../../shared/calc';
import { labelCodeSchema } from '../../shared/schemas/vessels';
import { Batch } from '../../server/entities/batch.entity';
import { BottleLotRow } from '../../server/entities/bottle-lot.entity';
import { JournalEntryRow } from '../../server/journal/journal-entry.entity';
import { Vessel } from '../../server/entities/vessel.entity';
import { makeBatchInVessels } from '../helpers/batches';
import { bottleRequest } from '../helpers/bottles';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { daysAgo } from '../helpers/dates';
import { addReadings, amendEntry } from '../helpers/journal';
import { signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let other: CellarCrew;
let as: { hand: Agent; guest: Agent; outsider: Agent };

const OG = 1.1;
const TOLERANCE = 14;
const DAY_MS = 86_400_000;
/** Steady at the finish for over a week. */
const FINISHED = [
  { daysAgo: 30, sg: 1.06 },
  { daysAgo: 20, sg: 1.01 },
  { daysAgo: 10, sg: 1.0 },
  { daysAgo: 6, sg: 0.999 },
  { daysAgo: 2, sg: 0.999 },
];
/** Still falling, a point or so a day. */
const SLOWING = [
  { daysAgo: 10, sg: 1.03 },
  { daysAgo: 4, sg: 1.02 },
  { daysAgo: 1, sg: 1.017 },
];

/** What shared/calc says about readings given as days ago. */
function stateOf(readings: { daysAgo: number; sg: number }[]) {
  const now = new Date();
  return fermentationState({
    og: OG,
    toleranceAbv: TOLERANCE,
    readings: readings.map((r) => ({ sg: r.sg, at: new Date(now.getTime() - r.daysAgo * DAY_MS) })),
    now,
  });
}

const bottlings = (cellarId: string, batchId: string) => `/api/cellars/${cellarId}/batches/${batchId}/bottlings`;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  as = {
    hand: await signedInAgent(app, crew.hand.email, TEST_PASSWORD),
    guest: await signedInAgent(app, crew.guest.email, TEST_PASSWORD),
    outsider: await signedInAgent(app, other.keeper.email, TEST_PASSWORD),
  };
});

describe('bottling a batch whose fermentation does not look finished', () => {
  it('refuses without confirmation, naming the state and the pressure caution, and changes nothing', async () => {
    const expectedState = stateOf(SLOWING);
    expect(expectedState).not.toBe('finished');
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { og: OG, toleranceAbv: TOLERANCE });
    await addReadings(ds, crew, batch.id, SLOWING);

    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels));
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: 'confirmation_required', state: expectedState, caution: CAUTION_BOTTLE_PRESSURE });
    expect(res.body.message).toContain(`(state: ${expectedState})`);
    expect(res.body.message).toMatch(/Confirm to bottle anyway/);
    const vessel = await ds.getRepository(Vessel).findOneByOrFail({ id: vessels[0].id });
    expect(vessel.batchId).toBe(batch.id);
    expect(await ds.getRepository(BottleLotRow).countBy({ batchId: batch.id })).toBe(0);
  });

  it('bottles once confirmed, and records that it was confirmed', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { og: OG, toleranceAbv: TOLERANCE });
    await addReadings(ds, crew, batch.id, SLOWING);
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels, { confirmNotFinished: true }));
    expect(res.status).toBe(201);
    expect(res.body.cautions).toContain(CAUTION_BOTTLE_PRESSURE);
    expect(res.body.warnings.join(' ')).toMatch(/did not look finished/);
    const entry = await ds.getRepository(JournalEntryRow).findOneByOrFail({ batchId: batch.id, kind: 'bottled' });
    expect(entry.payload).toMatchObject({ kind: 'bottled', confirmedNotFinished: true });
  });

  it('asks for confirmation when there is no original gravity to judge by', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { og: null });
    await addReadings(ds, crew, batch.id, FINISHED);
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels));
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: 'confirmation_required', state: null, caution: CAUTION_BOTTLE_PRESSURE });
  });

  it('judges the readings with their amendments applied', async () => {
    const raw = [
      { daysAgo: 10, sg: 1.0 },
      { daysAgo: 6, sg: 0.999 },
      { daysAgo: 2, sg: 1.09 },
    ];
    const corrected = raw.map((r, i) => (i === 2 ? { ...r, sg: 0.999 } : r));
    expect(stateOf(raw)).not.toBe('finished');
    expect(stateOf(corrected)).toBe('finished');
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { og: OG, toleranceAbv: TOLERANCE });
    const ids = await addReadings(ds, crew, batch.id, raw);
    await amendEntry(ds, crew, batch.id, ids[2], { sg: 0.999, correctedSg: 0.999 });
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels));
    expect(res.status).toBe(201);
    // The ABV estimate uses the amended last reading too.
    expect(res.body.lot.abvEstimate).toBe(Math.round(abvBy(OG, 0.999) * 10) / 10);
  });
});

describe('bottling a finished batch', () => {
  it('makes a lot of cases, empties the vessels and marks the batch bottled', async () => {
    expect(stateOf(FINISHED)).toBe('finished');
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { og: OG, toleranceAbv: TOLERANCE, volumesL: [15, 7.5] });
    await addReadings(ds, crew, batch.id, FINISHED);
    const bottleCount = 29;
    const perCase = 12;
    const res = await as.hand
      .post(bottlings(crew.cellar.id, batch.id))
      .send(bottleRequest(vessels, { bottleCount, perCase, sulfiteAdded: true, closure: 'screw-cap', note: 'Test run' }));
    expect(res.status).toBe(201);

    const { lot } = res.body;
    expect(lot).toMatchObject({
      batchId: batch.id,
      batchName: batch.name,
      bottleCount,
      bottlesLeft: bottleCount,
      bottleMl: 750,
      closure: 'screw-cap',
      sulfiteAdded: true,
    });
    expect(lot.abvEstimate).toBe(Math.round(abvBy(OG, FINISHED.at(-1)!.sg) * 10) / 10);
    const { cases, loose } = casesFrom(bottleCount, perCase);
    const expectedSizes = [...Array<number>(cases).fill(perCase), ...(loose ? [loose] : [])];
    expect(lot.cases.map((c: { bottlesInitial: number }) => c.bottlesInitial)).toEqual(expectedSizes);
    expect(lot.cases.map((c: { number: number }) => c.number)).toEqual(expectedSizes.map((_, i) => i + 1));
    const codes = [lot.code, ...lot.cases.map((c: { code: string }) => c.code)];
    expect(new Set(codes).size).toBe(codes.length);
    for (const code of codes) expect(labelCodeSchema.safeParse(code).success).toBe(true);
    expect(res.body.cautions).toEqual(expect.arrayContaining([CAUTION_SULFITES]));
    // A batch that reads finished gets no bottle-pressure caution.
    expect(res.body.cautions).not.toContain(CAUTION_BOTTLE_PRESSURE);

    for (const v of vessels) {
      const after = await ds.getRepository(Vessel).findOneByOrFail({ id: v.id });
      expect(after).toMatchObject({ batchId: null, volumeL: null, filledAt: null, cleaningState: 'dirty' });
      expect(after.version).toBeGreaterThan(v.version);
    }
    const after = await ds.getRepository(Batch).findOneByOrFail({ id: batch.id });
    expect(after.stage).toBe('bottled');
    const entry = await ds.getRepository(JournalEntryRow).findOneByOrFail({ batchId: batch.id, kind: 'bottled' });
    expect(entry.payload).toMatchObject({
      lotId: lot.id,
      lotCode: lot.code,
      bottleCount,
      caseCount: expectedSizes.length,
      confirmedNotFinished: false,
    });
    const payload = entry.payload as { lossL: number; from: { vesselId: string }[] };
    expect(payload.lossL).toBeCloseTo(15 + 7.5 - (bottleCount * 750) / 1000, 3);
    expect(payload.from.map((f) => f.vesselId).sort()).toEqual(vessels.map((v) => v.id).sort());
  });
});

describe('bottling requests that cannot be right', () => {
  it('refuses zero bottles', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew);
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels, { bottleCount: 0, confirmNotFinished: true }));
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toContain('body.bottleCount');
  });

  it('refuses more bottles than the vessels can fill, saying how many they can', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [30] });
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels, { bottleCount: 42, confirmNotFinished: true }));
    expect(res.status).toBe(400);
    expect(res.body.message).toContain('42 bottles of 750 mL need 31.5 L but the vessels hold 30 L');
    // In US units when asked (1 US gal = 3.785411784 L, NIST Handbook 44): 31.5 L = 8.321 gal, 30 L = 7.925 gal;
    // bottle sizes stay in mL in both systems.
    const inUs = await as.hand
      .post(bottlings(crew.cellar.id, batch.id))
      .set('Units-Shown', 'us')
      .send(bottleRequest(vessels, { bottleCount: 42, confirmNotFinished: true }));
    expect(inUs.body.message).toContain('42 bottles of 750 mL need 8.32 US gal but the vessels hold 7.93 US gal');
    expect(res.body.maxBottles).toBe(bottlesFrom({ volumeL: 30, bottleMl: 750 }).bottles);
    const vessel = await ds.getRepository(Vessel).findOneByOrFail({ id: vessels[0].id });
    expect(vessel.volumeL).toBe(30);
  });

  it('refuses a bottling date before the batch was started or in the future', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { startedDaysAgo: 60 });
    const early = await as.hand
      .post(bottlings(crew.cellar.id, batch.id))
      .send(bottleRequest(vessels, { bottledOn: daysAgo(61), confirmNotFinished: true }));
    expect(early.status).toBe(400);
    expect(early.body.message).toContain(`before ${batch.name} was started`);
    const future = await as.hand
      .post(bottlings(crew.cellar.id, batch.id))
      .send(bottleRequest(vessels, { bottledOn: daysAgo(-5), confirmNotFinished: true }));
    expect(future.status).toBe(400);
    expect(future.body.message).toMatch(/in the future/);
  });

  it('refuses a vessel that does not hold the batch', async () => {
    const mine = await makeBatchInVessels(ds, crew, { name: 'Test cyser' });
    const theirs = await makeBatchInVessels(ds, crew, { name: 'Test perry' });
    const res = await as.hand.post(bottlings(crew.cellar.id, mine.batch.id)).send(bottleRequest(theirs.vessels, { confirmNotFinished: true }));
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/does not hold Test cyser/);
  });

  it('refuses a stale vessel version', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew);
    const stale = bottleRequest(vessels, { confirmNotFinished: true });
    stale.from[0].expectedVersion = vessels[0].version + 5;
    const res = await as.hand.post(bottlings(crew.cellar.id, batch.id)).send(stale);
    expect(res.status).toBe(409);
    expect(res.body.currentVersion).toBe(vessels[0].version);
  });
});

describe('who may bottle', () => {
  it('lets a Guest look but not bottle', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew);
    const res = await as.guest.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels, { confirmNotFinished: true }));
    expect(res.status).toBe(403);
    expect(await ds.getRepository(BottleLotRow).countBy({ batchId: batch.id })).toBe(0);
  });

  it('answers 404 for another cellar and for a batch of another cellar', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew);
    const foreign = await as.outsider.post(bottlings(crew.cellar.id, batch.id)).send(bottleRequest(vessels, { confirmNotFinished: true }));
    expect(foreign.status).toBe(404);
    const wrongCellar = await as.outsider.post(bottlings(other.cellar.id, batch.id)).send(bottleRequest(vessels, { confirmNotFinished: true }));
    expect(wrongCellar.status).toBe(404);
    expect(await ds.getRepository(BottleLotRow).countBy({ batchId: batch.id })).toBe(0);
  });
});
