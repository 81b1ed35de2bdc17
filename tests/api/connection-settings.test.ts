import { beforeAll, describe, expect, it } from 'vitest';
import type { DataSource, EntityManager } from 'typeorm';
import { additionsDueOut } from '../../server/journal/journal-queries';
import { makeCellarWithCrew, type CellarCrew } from '../helpers/crew';
import { testDataSource } from '../helpers/test-app';

/**
 * What the app asks of PostgreSQL beyond its queries: the settings of every connection, and the
 * indexes that keep Today's take-out list from reading the whole journal.
 */
let ds: DataSource;
let crew: CellarCrew;

beforeAll(async () => {
  ds = await testDataSource();
  crew = await makeCellarWithCrew(ds);
});

describe('connection settings', () => {
  it('runs every connection of the pool with JIT compilation off', async () => {
    // Several at once, so the pool opens more than one connection.
    const answers = await Promise.all(Array.from({ length: 4 }, () => ds.transaction((tx) => tx.query(`SHOW jit`))));
    expect(answers.map(([row]) => row.jit)).toEqual(['off', 'off', 'off', 'off']);
  });
});

describe('indexes', () => {
  it('lets the take-out list find a cellar’s additions and their removals by index', async () => {
    const plan = await ds.transaction(async (tx) => {
      // With sequential scans priced out, the planner shows which indexes can answer the query as written.
      await tx.query(`SET LOCAL enable_seqscan = off`);
      let lines: string[] = [];
      const explaining = {
        query: async (sql: string, params: unknown[]) => {
          lines = (await tx.query(`EXPLAIN ${sql}`, params)).map((row: Record<string, string>) => row['QUERY PLAN']);
          return [];
        },
      } as unknown as EntityManager;
      await additionsDueOut(explaining, crew.cellar.id, '2026-12-31');
      return lines.join('\n');
    });
    expect(plan).toContain('ix_journal_additions');
    expect(plan).toContain('ix_journal_removals');
  });
});
