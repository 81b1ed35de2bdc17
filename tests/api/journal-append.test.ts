import { beforeAll, describe, expect, it } from 'vitest';
import { operationResultSchema } from '../../shared/schemas/batch-detail';
import type { JournalPayload } from '../../shared/schemas/journal';
import { Batch } from '../../server/entities/batch.entity';
import { appendEntry } from '../../server/journal/journal';
import { batchInVessels, makeBatchInVessels } from '../helpers/batches';
import { contextOf, crewWithAgents, type Crew } from '../helpers/crew';
import { reading } from '../helpers/journal';
import { countQueries } from '../helpers/query-count';
import { testApp } from '../helpers/test-app';
import { sanitisedVessel } from '../helpers/vessels';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
});

/** Adds `count` readings straight into the table, as a long history would have them. */
async function padJournal(batchId: string, count: number): Promise<void> {
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, $2, 'reading', $3::jsonb, now() - interval '400 days' + n * interval '1 hour', $4
       FROM generate_series(1, $5) AS n`,
    [crew.cellar.id, batchId, JSON.stringify(reading(1.05, null)), crew.hand.id, count],
  );
}

/** The statements one more reading costs, appended the way every operation appends. */
function statementsForOneReading(batchId: string, sg: number): Promise<number> {
  return countQueries(ds, () => ds.transaction((tx) => appendEntry(tx, contextOf(crew), batchId, reading(sg, null) as JournalPayload)));
}

describe('appending to the journal', () => {
  it('costs the same number of statements for the 10th entry as for the 1,000th', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    await padJournal(batch.id, 8);
    const tenth = await statementsForOneReading(batch.id, 1.04);
    await padJournal(batch.id, 989);
    const thousandth = await statementsForOneReading(batch.id, 1.03);
    expect(await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE batch_id = $1`, [batch.id])).toEqual([{ n: 1000 }]);
    expect(thousandth).toBe(tenth);
    // Lock and read the caches, insert, write the caches (plus the transaction's own statements).
    expect(tenth).toBeLessThanOrEqual(6);
    const row = await ds.getRepository(Batch).findOneByOrFail({ id: batch.id });
    expect(row.lastReadingSg).toBe(1.03);
  });

  it('keeps the latest reading when an earlier moment is logged later, and follows a correction of the latest', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const actor = contextOf(crew);
    const latest = await ds.transaction((tx) =>
      appendEntry(tx, actor, batch.id, reading(1.02, null) as JournalPayload, { occurredAt: new Date(Date.now() - 3_600_000) }),
    );
    await ds.transaction((tx) =>
      appendEntry(tx, actor, batch.id, reading(1.06, null) as JournalPayload, { occurredAt: new Date(Date.now() - 86_400_000) }),
    );
    expect((await ds.getRepository(Batch).findOneByOrFail({ id: batch.id })).lastReadingSg).toBe(1.02);
    await ds.transaction((tx) =>
      appendEntry(
        tx,
        actor,
        batch.id,
        { kind: 'amendment', reason: 'misread', changes: { sg: 1.018, correctedSg: 1.018 } },
        { amendsEntryId: latest.id },
      ),
    );
    expect((await ds.getRepository(Batch).findOneByOrFail({ id: batch.id })).lastReadingSg).toBe(1.018);
  });
});

describe('the stage a stabiliser leads to', () => {
  const url = (batchId: string, what: string) => `${crew.batches}/${batchId}/${what}`;
  const metabisulfite = { category: 'stabiliser', name: 'Potassium metabisulfite', amount: 1.1, unit: 'g' };

  it('moves a racked batch to bulk ageing, but leaves a must sulfited in primary in primary', async () => {
    const {
      result,
      vessels: [first],
    } = await batchInVessels(ds, crew, [20], {}, { material: 'plastic' });
    const inPrimary = operationResultSchema.parse((await crew.as.hand.post(url(result.batch.id, 'additions')).send(metabisulfite).expect(201)).body);
    expect(inPrimary.batch.stage).toBe('primary');

    const next = await sanitisedVessel(ds, crew.cellar.id, { material: 'plastic', capacityL: 19.5 });
    const racked = await crew.as.hand
      .post(url(result.batch.id, 'rackings'))
      .send({ from: [{ vesselId: first.id }], to: [{ vesselId: next.id, volumeL: 19.5 }] })
      .expect(201);
    // The sulfite before the first racking does not count as stabilising.
    expect(operationResultSchema.parse(racked.body).batch.stage).toBe('secondary');

    const stabilised = operationResultSchema.parse((await crew.as.hand.post(url(result.batch.id, 'additions')).send(metabisulfite).expect(201)).body);
    expect(stabilised.batch.stage).toBe('bulk-ageing');
  });
});
