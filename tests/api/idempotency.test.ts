import crypto from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { batchDetailSchema } from '../../shared/schemas/batch-detail';
import { readingResultSchema } from '../../shared/schemas/journal';
import { vesselSchema } from '../../shared/schemas/vessels';
import { batchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { makeVessel } from '../helpers/vessels';
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

const newKey = () => crypto.randomUUID();
const readingsOf = (c: Crew, batchId: string) => `${c.batches}/${batchId}/readings`;

/** The readings the batch page shows, read back over the API. */
async function readingCount(c: Crew, batchId: string): Promise<number> {
  const res = await c.as.guest.get(`${c.batches}/${batchId}`);
  return batchDetailSchema.parse(res.body).readings.length;
}

describe('Idempotency-Key on cellar writes', () => {
  it('records a reading sent twice with one key once, and answers the second with the first answer', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const key = newKey();
    const first = await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.04 });
    const second = await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.04 });
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.headers['idempotent-replayed']).toBe('true');
    expect(first.headers['idempotent-replayed']).toBeUndefined();
    expect(readingResultSchema.parse(second.body).entryId).toBe(readingResultSchema.parse(first.body).entryId);
    expect(second.body).toEqual(first.body);
    expect(await readingCount(crew, result.batch.id)).toBe(1);
  });

  it('records two concurrent duplicates once', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const key = newKey();
    const send = () => crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.03 });
    const answers = await Promise.all([send(), send(), send()]);
    expect(answers.map((a) => a.status)).toEqual([201, 201, 201]);
    expect(new Set(answers.map((a) => a.body.entryId)).size).toBe(1);
    expect(answers.filter((a) => a.headers['idempotent-replayed'] === 'true')).toHaveLength(2);
    expect(await readingCount(crew, result.batch.id)).toBe(1);
  });

  it('keeps keys per cellar: the same key in another cellar is a write of its own', async () => {
    const mine = await batchInVessels(ds, crew, [20]);
    const theirs = await batchInVessels(ds, other, [20]);
    const key = newKey();
    const a = await crew.as.hand.post(readingsOf(crew, mine.result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.02 });
    const b = await other.as.hand.post(readingsOf(other, theirs.result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.02 });
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(b.headers['idempotent-replayed']).toBeUndefined();
    // The second answer is a reading of their own batch, not a replay of the first.
    expect(b.body.entryId).not.toBe(a.body.entryId);
    const [entry] = await ds.query(`SELECT batch_id AS "batchId" FROM journal_entries WHERE id = $1`, [b.body.entryId]);
    expect(entry.batchId).toBe(theirs.result.batch.id);
    expect(await readingCount(crew, mine.result.batch.id)).toBe(1);
    expect(await readingCount(other, theirs.result.batch.id)).toBe(1);
  });

  it('without the header, each request is a write of its own', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    await crew.as.hand.post(readingsOf(crew, result.batch.id)).send({ sg: 1.05 }).expect(201);
    await crew.as.hand.post(readingsOf(crew, result.batch.id)).send({ sg: 1.05 }).expect(201);
    expect(await readingCount(crew, result.batch.id)).toBe(2);
  });

  it('refuses a key reused for another request with 422 and a plain message', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const key = newKey();
    await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.05 }).expect(201);
    const reused = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/notes`)
      .set('Idempotency-Key', key)
      .send({ text: 'topped the airlock' });
    expect(reused.status).toBe(422);
    expect(reused.body.message).toMatch(/already used for another request/);
    expect(
      batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${result.batch.id}`)).body).journal.some((e) => e.payload.kind === 'note'),
    ).toBe(false);
  });

  it('refuses a malformed key with 400', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const res = await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', 'bad key!').send({ sg: 1.05 });
    expect(res.status).toBe(400);
    expect(await readingCount(crew, result.batch.id)).toBe(0);
  });

  it('does not keep a refused write: the same key goes through once the request is right', async () => {
    const v = await makeVessel(ds, crew.cellar.id, { name: 'Keyed carboy', cleaningState: 'dirty' });
    const path = `/api/cellars/${crew.cellar.id}/vessels/${v.id}/cleaning`;
    const key = newKey();
    const stale = await crew.as.hand
      .post(path)
      .set('Idempotency-Key', key)
      .send({ state: 'clean', expectedVersion: v.version - 1 });
    expect(stale.status).toBe(409);
    const fresh = await crew.as.hand.post(path).set('Idempotency-Key', key).send({ state: 'clean', expectedVersion: v.version });
    expect(fresh.status).toBe(200);
    expect(vesselSchema.parse(fresh.body)).toMatchObject({ state: 'clean', version: v.version + 1 });
    const again = await crew.as.hand.post(path).set('Idempotency-Key', key).send({ state: 'clean', expectedVersion: v.version });
    expect(again.status).toBe(200);
    expect(again.body).toEqual(fresh.body);
    const now = vesselSchema.parse((await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/vessels/${v.id}`)).body);
    expect(now.version).toBe(v.version + 1);
  });

  it('forgets a key after a week: the same key then records a new entry', async () => {
    const { result } = await batchInVessels(ds, crew, [20]);
    const key = newKey();
    await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.05 }).expect(201);
    await ds.query(`UPDATE idempotency_keys SET created_at = now() - interval '8 days' WHERE cellar_id = $1 AND key = $2`, [crew.cellar.id, key]);
    const later = await crew.as.hand.post(readingsOf(crew, result.batch.id)).set('Idempotency-Key', key).send({ sg: 1.05 });
    expect(later.status).toBe(201);
    expect(later.headers['idempotent-replayed']).toBeUndefined();
    expect(await readingCount(crew, result.batch.id)).toBe(2);
  });
});
