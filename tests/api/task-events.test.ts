import { beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { inTransaction } from '../../server/core/unit-of-work';
import { taskEvents } from '../../server/journal/journal-queries';
import { makeBatch } from '../helpers/batches';
import { makeCellarWithCrew, type CellarCrew } from '../helpers/crew';
import { addJournalEntry, reading } from '../helpers/journal';
import { testDataSource } from '../helpers/test-app';

/**
 * What the task engine reads of the journal (`taskEvents`): per batch, in the journal's order
 * (when it happened, then when it was recorded), corrections applied, each entry on its local
 * date in the cellar's time zone, and only the kinds plans count from or complete.
 */
let ds: DataSource;
let crew: CellarCrew;

beforeAll(async () => {
  ds = await testDataSource();
  crew = await makeCellarWithCrew(ds);
});

const at = (iso: string) => new Date(iso);
const read = (batchIds: string[], timeZone: string) => inTransaction(ds, 'read', (tx) => taskEvents(tx, batchIds, timeZone));

describe('taskEvents', () => {
  it('gives each batch its entries in the journal order, ties broken by when they were recorded', async () => {
    const batch = await makeBatch(ds, crew.cellar.id);
    const other = await makeBatch(ds, crew.cellar.id);
    const same = at('2026-03-10T10:00:00Z');
    const late = await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.02, null), {
      occurredAt: same,
      recordedAt: at('2026-03-12T08:00:00Z'),
    });
    const early = await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.03, null), {
      occurredAt: same,
      recordedAt: at('2026-03-11T08:00:00Z'),
    });
    const racked = await addJournalEntry(
      ds,
      crew.cellar.id,
      batch.id,
      { kind: 'racked', from: [], to: [], lossL: 0.5, override: null },
      { occurredAt: at('2026-03-09T09:00:00Z') },
    );
    await addJournalEntry(ds, crew.cellar.id, batch.id, { kind: 'note', text: 'smells of pear' }, { occurredAt: at('2026-03-08T09:00:00Z') });
    const elsewhere = await addJournalEntry(ds, crew.cellar.id, other.id, reading(1.05, null), { occurredAt: at('2026-03-01T09:00:00Z') });

    const events = await read([batch.id, other.id], 'UTC');
    // A note neither anchors nor completes a task: it is left out.
    expect(events.get(batch.id)!.map((e) => e.id)).toEqual([racked, early, late]);
    expect(events.get(other.id)!.map((e) => e.id)).toEqual([elsewhere]);
    expect(events.get(batch.id)![1]).toMatchObject({ batchId: batch.id, localOn: '2026-03-10', payload: { kind: 'reading', correctedSg: 1.03 } });
  });

  it('applies corrections oldest first, the later one winning, and leaves the amendments out', async () => {
    const batch = await makeBatch(ds, crew.cellar.id);
    const entry = await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.04, null), { occurredAt: at('2026-04-01T09:00:00Z') });
    const amend = (changes: Record<string, unknown>, recordedAt: string) =>
      addJournalEntry(
        ds,
        crew.cellar.id,
        batch.id,
        { kind: 'amendment', reason: 'misread', changes },
        { amendsEntryId: entry, recordedAt: at(recordedAt) },
      );
    // Recorded out of order on purpose: the one recorded last wins whatever order the rows were written in.
    await amend({ correctedSg: 1.012 }, '2026-04-03T09:00:00Z');
    await amend({ correctedSg: 1.011, ph: 3.4 }, '2026-04-02T09:00:00Z');

    const [only, ...rest] = (await read([batch.id], 'UTC')).get(batch.id)!;
    expect(rest).toEqual([]);
    expect(only).toMatchObject({ id: entry, payload: { kind: 'reading', sg: 1.04, correctedSg: 1.012, ph: 3.4 } });
  });

  it('dates each entry by the cellar’s clock', async () => {
    const batch = await makeBatch(ds, crew.cellar.id);
    // 02:00 UTC on 11 March 2026 (IANA tz database): 15:00 on 11 March in Auckland (NZDT, UTC+13, until the first
    // Sunday of April) and 21:00 on 10 March in Chicago (CDT, UTC-5, from the second Sunday of March, 8 March 2026).
    await addJournalEntry(ds, crew.cellar.id, batch.id, reading(1.03, null), { occurredAt: at('2026-03-11T02:00:00Z') });
    expect((await read([batch.id], 'Pacific/Auckland')).get(batch.id)![0]!.localOn).toBe('2026-03-11');
    expect((await read([batch.id], 'America/Chicago')).get(batch.id)![0]!.localOn).toBe('2026-03-10');
    expect((await read([batch.id], 'UTC')).get(batch.id)![0]!.localOn).toBe('2026-03-11');
  });

  it('answers nothing for a batch without such entries, or for no batches', async () => {
    const batch = await makeBatch(ds, crew.cellar.id);
    expect((await read([batch.id], 'UTC')).has(batch.id)).toBe(false);
    expect((await read([], 'UTC')).size).toBe(0);
  });
});
