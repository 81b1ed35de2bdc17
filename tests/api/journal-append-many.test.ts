import { beforeAll, describe, expect, it } from 'vitest';
import type { JournalPayload } from '../../shared/schemas/journal';
import { appendEntries, appendEntry } from '../../server/journal/journal';
import { makeBatchInVessels } from '../helpers/batches';
import { contextOf, makeCellarWithCrew, type CellarCrew } from '../helpers/crew';
import { testDataSource } from '../helpers/test-app';

let ds: Awaited<ReturnType<typeof testDataSource>>;
let crew: CellarCrew;

beforeAll(async () => {
  ds = await testDataSource();
  crew = await makeCellarWithCrew(ds);
});

const DAY_MS = 86_400_000;
const reading = (sg: number): JournalPayload => ({
  kind: 'reading',
  sg,
  temperatureC: null,
  calibrationC: 20,
  correctedSg: sg,
  ph: null,
  vesselId: null,
});

/** The batch's caches and its journal without ids (past the start each setup writes): what the two ways must agree on. */
async function stateOf(batchId: string) {
  const [batch] = await ds.query(
    `SELECT stage, last_reading_sg::float8 AS "lastSg", last_reading_at AS "lastAt", last_racked_at AS "lastRacked" FROM batches WHERE id = $1`,
    [batchId],
  );
  const journal = await ds.query(
    `SELECT kind, payload, occurred_at AS at, author_id AS author FROM journal_entries WHERE batch_id = $1 AND kind <> 'started' ORDER BY occurred_at, kind`,
    [batchId],
  );
  return { batch, journal };
}

describe('appendEntries (many entries at once, for imports)', () => {
  it('leaves the same journal and caches as appending the entries one by one, out of order included', async () => {
    const entries = [
      { payload: reading(1.09), occurredAt: new Date(Date.now() - 20 * DAY_MS) },
      { payload: reading(1.01), occurredAt: new Date(Date.now() - 2 * DAY_MS) },
      // Older than the latest: must not become the batch's last reading.
      { payload: reading(1.03), occurredAt: new Date(Date.now() - 8 * DAY_MS) },
      { payload: { kind: 'note', text: 'smells of honey' } as JournalPayload, occurredAt: new Date(Date.now() - DAY_MS) },
    ];
    const [one, many] = [await makeBatchInVessels(ds, crew, { volumesL: [10] }), await makeBatchInVessels(ds, crew, { volumesL: [10] })];
    for (const e of entries) await ds.transaction((tx) => appendEntry(tx, contextOf(crew), one.batch.id, e.payload, { occurredAt: e.occurredAt }));
    expect(await ds.transaction((tx) => appendEntries(tx, contextOf(crew), many.batch.id, entries))).toBe(4);

    const [a, b] = [await stateOf(one.batch.id), await stateOf(many.batch.id)];
    expect(b).toEqual(a);
    expect(b.batch.lastSg).toBe(1.01);
    expect(b.journal).toHaveLength(4);
  });
});
