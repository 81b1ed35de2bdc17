import type { DataSource, EntityManager, QueryRunner } from 'typeorm';

/** A read sees one snapshot for all its statements; a write locks what it changes. */
export type WorkMode = 'read' | 'write';

/**
 * Runs one unit of work in one transaction, handed to every service it calls: an HTTP
 * request, a scheduled job or an import is one snapshot and commits or rolls back whole.
 * Reads run REPEATABLE READ (a page never mixes two moments); writes run READ COMMITTED with
 * row locks (vessel and batch rows, in that order), so concurrent writers queue, not fail.
 */
export function inTransaction<T>(ds: DataSource, mode: WorkMode, work: (tx: EntityManager) => Promise<T>): Promise<T> {
  return mode === 'read' ? inReadSnapshot(ds, work) : ds.transaction(work);
}

/**
 * A read-only REPEATABLE READ transaction opened with one statement (TypeORM's own would send
 * START TRANSACTION and SET TRANSACTION separately: a round trip more on every page). READ ONLY
 * also makes PostgreSQL refuse a write that slipped into a read.
 */
async function inReadSnapshot<T>(ds: DataSource, work: (tx: EntityManager) => Promise<T>): Promise<T> {
  const runner = ds.createQueryRunner();
  try {
    await runner.connect();
    await runner.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY');
    markTransactionOpen(runner);
    try {
      const result = await work(runner.manager);
      await runner.commitTransaction();
      return result;
    } catch (err) {
      await runner.rollbackTransaction();
      throw err;
    }
  } finally {
    await runner.release();
  }
}

/** Tells the runner its transaction is open, as its own startTransaction would have (commit, rollback and savepoints rely on it). */
function markTransactionOpen(runner: QueryRunner): void {
  Object.assign(runner, { isTransactionActive: true, transactionDepth: 1 });
}
