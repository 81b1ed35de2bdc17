import type { DataSource, EntityManager } from 'typeorm';

/** A read sees one snapshot for all its statements; a write locks what it changes. */
export type WorkMode = 'read' | 'write';

/**
 * Runs one unit of work in one transaction, handed to every service it calls: an HTTP
 * request, a scheduled job or an import is one snapshot and commits or rolls back whole.
 * Reads run REPEATABLE READ (a page never mixes two moments); writes run READ COMMITTED with
 * row locks (vessel and batch rows, in that order), so concurrent writers queue, not fail.
 */
export function inTransaction<T>(ds: DataSource, mode: WorkMode, work: (tx: EntityManager) => Promise<T>): Promise<T> {
  return mode === 'read' ? ds.transaction('REPEATABLE READ', work) : ds.transaction(work);
}
