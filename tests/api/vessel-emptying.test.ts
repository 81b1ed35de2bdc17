import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import { operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchInVessels, makeBatchInVessels } from '../helpers/batches';
import { bottleRequest } from '../helpers/bottles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { daysAgo, momentDaysAgo } from '../helpers/dates';
import { sanitisedVessel, vesselRow } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  const made = await testApp();
  ds = made.ds;
  crew = await crewWithAgents(made.app, ds);
  other = await crewWithAgents(made.app, ds);
});

const emptying = (c: Crew, vesselId: string) => `/api/cellars/${c.cellar.id}/vessels/${vesselId}/emptying`;
const journalCount = async (batchId: string): Promise<number> =>
  Number((await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE batch_id = $1`, [batchId]))[0].n);

describe('emptying a vessel', () => {
  it('lets a Hand pour a vessel out: journalled with the reason, the vessel left empty and dirty, the batch smaller', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [10, 4.5] });
    const res = await crew.as.hand.post(emptying(crew, vessels[1].id)).send({ reason: 'spoiled', note: 'smelled of nail varnish' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const result = operationResultSchema.parse(res.body);

    const entry = result.batch.journal.find((e) => e.id === result.entryId)!;
    expect(entry.payload).toEqual({
      kind: 'emptied',
      vesselId: vessels[1].id,
      vesselName: vessels[1].name,
      volumeL: 4.5,
      reason: 'spoiled',
      note: 'smelled of nail varnish',
    });
    expect(entry.author.name).not.toBe('');
    const row = await vesselRow(ds, vessels[1].id);
    expect(row).toMatchObject({ batch_id: null, volume_l: null, filled_at: null, cleaning_state: 'dirty', sanitised_at: null });
    // 10 L + 4.5 L before, 4.5 L poured out: 10 L left, in one vessel; still a working batch.
    expect(result.batch.volumeL).toBe(10);
    expect(result.batch.vessels.map((v) => v.id)).toEqual([vessels[0].id]);
    expect(result.batch.stage).toBe('primary');
    const detail = await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/vessels/${vessels[1].id}`);
    expect(detail.body).toMatchObject({ state: 'dirty', batch: null, volumeL: null });
    expect(batch.id).toBe(result.batch.id);
  });

  it('lets a Keeper empty the last vessel; a batch in no vessel and with no bottles reads as finished in lists', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [6], name: 'Emptied cyser' });
    const res = await crew.as.keeper.post(emptying(crew, vessels[0].id)).send({ reason: 'other', note: 'the airlock ran dry for a month' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.batch).toMatchObject({ volumeL: 0, vesselCount: 0, stage: 'finished' });
    const list = await crew.as.guest.get(`${crew.batches}?q=${encodeURIComponent('Emptied cyser')}`);
    expect(list.body.items.find((b: { id: string }) => b.id === batch.id)).toMatchObject({ stage: 'finished', volumeL: 0, vesselCount: 0 });
    // With nothing left anywhere, a Keeper may now delete the batch.
    expect((await crew.as.keeper.delete(`${crew.batches}/${batch.id}`)).status).toBe(204);
  });

  it('leaves a batch with bottles in cases as bottled when its last vessel is poured out', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [10, 6]);
    const bottled = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/bottlings`)
      .send(bottleRequest([vessels[0]], { from: [{ vesselId: vessels[0].id }], bottleCount: 12, confirmNotFinished: true }));
    expect(bottled.status, JSON.stringify(bottled.body)).toBe(201);
    const res = await crew.as.hand.post(emptying(crew, vessels[1].id)).send({ reason: 'spilled' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.batch).toMatchObject({ volumeL: 0, stage: 'bottled' });
  });

  it('dates the emptying as asked, never in the future, before the batch began or before the liquid went in', async () => {
    const { vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5], startedDaysAgo: 30 });
    const url = emptying(crew, vessels[0].id);
    const future = await crew.as.hand.post(url).send({ reason: 'spilled', at: momentDaysAgo(-2) });
    expect(future.status).toBe(400);
    expect(future.body.issues).toEqual([{ path: 'body.at', message: 'that moment is in the future.' }]);
    const early = await crew.as.hand.post(url).send({ reason: 'spilled', at: momentDaysAgo(45) });
    expect(early.status).toBe(400);
    expect(early.body.issues[0].path).toBe('body.at');
    const dated = await crew.as.hand.post(url).send({ reason: 'spilled', at: `${daysAgo(3)}T12:00:00Z` });
    expect(dated.status, JSON.stringify(dated.body)).toBe(201);
    const entry = dated.body.batch.journal.find((e: { id: string }) => e.id === dated.body.entryId);
    expect(entry.occurredAt).toBe(`${daysAgo(3)}T12:00:00.000Z`);
  });

  it('refuses a vessel filled later than the date given', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5], startedDaysAgo: 30 });
    // Racked into a fresh vessel today: the liquid was not in it ten days ago.
    const target = await sanitisedVessel(ds, crew.cellar.id, { capacityL: 6 });
    const racked = await crew.as.hand.post(`${crew.batches}/${batch.id}/rackings`).send({
      from: [{ vesselId: vessels[0].id }],
      to: [{ vesselId: target.id, volumeL: 4.8 }],
    });
    expect(racked.status, JSON.stringify(racked.body)).toBe(201);
    const res = await crew.as.hand.post(emptying(crew, target.id)).send({ reason: 'spoiled', at: `${daysAgo(10)}T12:00:00Z` });
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('body.at');
    expect(res.body.message).toContain(target.name);
  });

  it('answers 409 for a vessel that is already empty, writing nothing', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    expect((await crew.as.hand.post(emptying(crew, vessels[0].id)).send({ reason: 'drunk' })).status).toBe(201);
    const before = await journalCount(batch.id);
    const again = await crew.as.hand.post(emptying(crew, vessels[0].id)).send({ reason: 'drunk' });
    expect(again.status).toBe(409);
    expect(again.body.message).toBe(`${vessels[0].name} is already empty; there is nothing to pour out.`);
    const never = await sanitisedVessel(ds, crew.cellar.id);
    expect((await crew.as.hand.post(emptying(crew, never.id)).send({ reason: 'drunk' })).status).toBe(409);
    expect(await journalCount(batch.id)).toBe(before);
  });

  it('answers 409 naming the vessel when the caller saw an older version', async () => {
    const { vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    const res = await crew.as.hand.post(emptying(crew, vessels[0].id)).send({ reason: 'spoiled', expectedVersion: vessels[0].version + 7 });
    expect(res.status).toBe(409);
    expect(res.body.message).toContain(vessels[0].name);
    expect((await vesselRow(ds, vessels[0].id)).volume_l).toBe(5);
  });

  it('refuses a Guest (403) and answers 404 for another cellar’s vessel, exactly like a missing one', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    expect((await crew.as.guest.post(emptying(crew, vessels[0].id)).send({ reason: 'spoiled' })).status).toBe(403);
    // Another cellar's Keeper, with the victim's vessel in its own cellar's path and in the victim's.
    const foreign = await other.as.keeper.post(emptying(other, vessels[0].id)).send({ reason: 'spoiled' });
    const missing = await other.as.keeper.post(emptying(other, '00000000-0000-4000-8000-000000000000')).send({ reason: 'spoiled' });
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
    expect((await other.as.keeper.post(emptying(crew, vessels[0].id)).send({ reason: 'spoiled' })).status).toBe(404);
    expect((await vesselRow(ds, vessels[0].id)).batch_id).toBe(batch.id);
  });

  it('answers 400 naming the field for a missing or unknown reason, and for "other" without a note', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    const url = emptying(crew, vessels[0].id);
    const none = await crew.as.hand.post(url).send({});
    expect(none.status).toBe(400);
    expect(none.body.issues[0].path).toBe('body.reason');
    const odd = await crew.as.hand.post(url).send({ reason: 'evaporated' });
    expect(odd.status).toBe(400);
    expect(odd.body.issues[0].path).toBe('body.reason');
    const unexplained = await crew.as.hand.post(url).send({ reason: 'other', note: '   ' });
    expect(unexplained.status).toBe(400);
    expect(unexplained.body.issues).toEqual([{ path: 'body.note', message: 'say why it was emptied' }]);
    expect((await vesselRow(ds, vessels[0].id)).batch_id).toBe(batch.id);
  });

  it('writes the emptying into the journal export: vessel, litres, reason and note', async () => {
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [4.5] });
    expect((await crew.as.hand.post(emptying(crew, vessels[0].id)).send({ reason: 'spilled', note: 'the tap dripped overnight' })).status).toBe(201);
    const res = await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/exports/journal?batchId=${batch.id}`);
    expect(res.status).toBe(200);
    const rows: Record<string, string>[] = parse(res.text, { columns: true });
    const row = rows.find((r) => r.kind === 'emptied')!;
    expect(row).toMatchObject({ name: vessels[0].name, 'volume (L)': '4.5', category: 'spilled', text: 'the tap dripped overnight' });
  });

  it('lets an amendment correct the reason and note, but not the litres', async () => {
    const { vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    const res = await crew.as.hand.post(emptying(crew, vessels[0].id)).send({ reason: 'spilled' });
    const url = `${crew.batches}/${res.body.batch.id}/journal/${res.body.entryId}/amendments`;
    const amended = await crew.as.hand.post(url).send({ reason: 'it had turned', changes: { reason: 'spoiled', note: 'vinegar' } });
    expect(amended.status, JSON.stringify(amended.body)).toBe(201);
    const entry = amended.body.batch.journal.find((e: { id: string }) => e.id === res.body.entryId);
    expect(entry.amendedBy).toEqual([amended.body.entryId]);
    const litres = await crew.as.hand.post(url).send({ reason: 'typo', changes: { volumeL: 2 } });
    expect(litres.status).toBe(400);
    expect(litres.body.message).toContain('only reason, note');
  });
});
