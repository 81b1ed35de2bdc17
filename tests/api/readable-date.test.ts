import { beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { additionsDueOut } from '../../server/journal/journal-queries';
import { makeBatch } from '../helpers/batches';
import { makeCellarWithCrew, type CellarCrew } from '../helpers/crew';
import { addJournalEntry } from '../helpers/journal';
import { testDataSource } from '../helpers/test-app';

/**
 * `cw_readable_date` (the take-out dates of Today and the task engine): a calendar day or NULL,
 * never an error, and usable in a parallel plan.
 */
let ds: DataSource;
let crew: CellarCrew;

beforeAll(async () => {
  ds = await testDataSource();
  crew = await makeCellarWithCrew(ds);
});

const readable = async (value: string | null): Promise<string | null> => (await ds.query(`SELECT cw_readable_date($1)::text AS d`, [value]))[0].d;

describe('cw_readable_date', () => {
  it('reads real calendar days, leap days as the Gregorian calendar has them', async () => {
    // Gregorian rule (ISO 8601's calendar): a leap year is divisible by 4, except centuries not divisible by 400.
    expect(await readable('2024-02-29')).toBe('2024-02-29');
    expect(await readable('2000-02-29')).toBe('2000-02-29');
    expect(await readable('2026-12-31')).toBe('2026-12-31');
    expect(await readable('1900-01-01')).toBe('1900-01-01');
    expect(await readable('2200-12-31')).toBe('2200-12-31');
  });

  it('answers NULL for what is not a calendar day between 1900 and 2200', async () => {
    for (const value of [
      '2023-02-29',
      '1900-02-29',
      '2100-02-29',
      '2026-04-31',
      '2026-06-31',
      '2026-13-01',
      '2026-00-10',
      '2026-01-00',
      '2026-01-32',
    ]) {
      expect(await readable(value), value).toBeNull();
    }
    for (const value of ['0000-01-01', '1899-12-31', '2201-01-01', '2026-1-01', '01-02-2026', 'soon', '', null]) {
      expect(await readable(value), String(value)).toBeNull();
    }
  });

  it('runs inside a parallel worker (regression: Today answered 500 on a large cellar)', async () => {
    const batch = await makeBatch(ds, crew.cellar.id, { name: 'Parallel oak batch' });
    await addJournalEntry(ds, crew.cellar.id, batch.id, {
      kind: 'addition',
      category: 'oak',
      name: 'Oak spiral',
      amount: 1,
      unit: 'piece',
      vesselId: null,
      removeOn: '2026-03-01',
    });
    const due = await ds.transaction(async (tx) => {
      // What the planner chose for 300,000 entries, forced on a small table: the query run by workers.
      const [{ version }] = await tx.query(`SELECT current_setting('server_version_num')::int AS version`);
      await tx.query(`SET LOCAL ${version >= 160000 ? 'debug_parallel_query' : 'force_parallel_mode'} = on`);
      await tx.query(`SET LOCAL parallel_setup_cost = 0`);
      await tx.query(`SET LOCAL parallel_tuple_cost = 0`);
      await tx.query(`SET LOCAL min_parallel_table_scan_size = 0`);
      return additionsDueOut(tx, crew.cellar.id, '2026-12-31');
    });
    expect(due).toEqual([expect.objectContaining({ batchId: batch.id, name: 'Oak spiral', removeOn: '2026-03-01' })]);
  });
});
