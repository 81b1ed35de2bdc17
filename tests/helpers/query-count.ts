import type { DataSource } from 'typeorm';
import { vi } from 'vitest';

/**
 * How many SQL statements TypeORM sends while `fn` runs (sessions aside, which use the pool directly).
 * Used to show that a list costs a fixed number of queries, not one more per row.
 */
export async function countQueries(ds: DataSource, fn: () => Promise<unknown>): Promise<number> {
  const spy = vi.spyOn(ds.logger, 'logQuery');
  try {
    await fn();
    return spy.mock.calls.length;
  } finally {
    spy.mockRestore();
  }
}
