import { beforeAll, describe, expect, it } from 'vitest';
import { batchInVessels, makeBatchInVessels } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { testApp } from '../helpers/test-app';

let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

beforeAll(async () => {
  const made = await testApp();
  ds = made.ds;
  crew = await crewWithAgents(made.app, ds);
});

type Entry = { id: string; amendedBy: string[]; payload: { kind: string } };
const startedEntryOf = (journal: readonly Entry[]): Entry => journal.find((e) => e.payload.kind === 'started')!;

describe('correcting a started batch', () => {
  it('corrects the original gravity, start date, volume, yeast and tolerance, and the batch follows', async () => {
    const { result } = await batchInVessels(ds, crew, [20], { og: 0.99, startedOn: '2026-10-01', yeast: { name: 'Wrong yeast', toleranceAbv: 12 } });
    const started = startedEntryOf(result.batch.journal);
    const res = await crew.as.hand.post(`${crew.batches}/${result.batch.id}/journal/${started.id}/amendments`).send({
      reason: 'read the hydrometer upside down',
      changes: { og: 1.112, startedOn: '2026-09-28', volumeL: 19.5, yeastName: 'Sweet mead yeast', yeastToleranceAbv: 15 },
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const batch = (await crew.as.guest.get(`${crew.batches}/${result.batch.id}`)).body;
    expect(batch).toMatchObject({ og: 1.112, startedOn: '2026-09-28', plannedVolumeL: 19.5, yeastName: 'Sweet mead yeast', yeastToleranceAbv: 15 });
    // The original entry stays; the amendment points at it.
    expect(startedEntryOf(batch.journal).amendedBy).toEqual([res.body.entryId]);
    // The list and Today read the corrected figures too.
    const list = await crew.as.guest.get(`${crew.batches}?q=${encodeURIComponent(result.batch.name)}`);
    expect(list.body.items[0]).toMatchObject({ og: 1.112, startedOn: '2026-09-28' });
  });

  it('refuses a start date after today and an impossible gravity, changing nothing', async () => {
    const { result } = await batchInVessels(ds, crew, [10]);
    const started = startedEntryOf(result.batch.journal);
    const url = `${crew.batches}/${result.batch.id}/journal/${started.id}/amendments`;
    const future = await crew.as.hand.post(url).send({ reason: 'typo', changes: { startedOn: '2199-01-01' } });
    expect(future.status).toBe(400);
    const gravity = await crew.as.hand.post(url).send({ reason: 'typo', changes: { og: 0.5 } });
    expect(gravity.status).toBe(400);
    expect(gravity.body.issues[0].path).toBe('body.changes.og');
    const batch = (await crew.as.guest.get(`${crew.batches}/${result.batch.id}`)).body;
    expect(batch.og).toBe(result.batch.og);
    expect(startedEntryOf(batch.journal).amendedBy).toEqual([]);
  });
});

describe('dating what happened earlier', () => {
  it('records bottles leaving a case on the day given, not before bottling or in the future', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    const { cases } = await makeLotWithCases(ds, crew.cellar.id, batch, { bottledOn: '2026-05-01', cases: 1 });
    const url = `/api/cellars/${crew.cellar.id}/cases/${cases[0].id}/departures`;
    const dated = await crew.as.hand.post(url).send({ count: 2, reason: 'gift', at: '2026-06-14T18:00:00Z' });
    expect(dated.status, JSON.stringify(dated.body)).toBe(201);
    const [row] = await ds.query(`SELECT occurred_at FROM bottle_departures WHERE case_id = $1`, [cases[0].id]);
    expect((row.occurred_at as Date).toISOString()).toBe('2026-06-14T18:00:00.000Z');

    const early = await crew.as.hand.post(url).send({ count: 1, reason: 'drunk', at: '2026-04-30T12:00:00Z' });
    expect(early.status).toBe(400);
    const future = await crew.as.hand.post(url).send({ count: 1, reason: 'drunk', at: '2199-01-01T12:00:00Z' });
    expect(future.status).toBe(400);
    const yearZero = await crew.as.hand.post(url).send({ count: 1, reason: 'drunk', at: '0000-01-01T12:00:00Z' });
    expect(yearZero.status).toBe(400);
    const [{ left }] = await ds.query(`SELECT bottles_left AS left FROM bottle_cases WHERE id = $1`, [cases[0].id]);
    expect(left).toBe(10);
  });

  it('records an oak removal on the day given', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [5], startedDaysAgo: 90 });
    const added = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/additions`)
      .send({ category: 'oak', name: 'Oak spiral', amount: 1, unit: 'piece', removeOn: '2026-11-20', at: '2026-10-01T10:00:00Z' });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    const removed = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/removals`)
      .send({ additionEntryId: added.body.entryId, at: '2026-11-18T09:30:00Z' });
    expect(removed.status, JSON.stringify(removed.body)).toBe(201);
    const entry = removed.body.batch.journal.find((e: { payload: { kind: string } }) => e.payload.kind === 'removed');
    expect(entry.occurredAt).toBe('2026-11-18T09:30:00.000Z');
  });
});
