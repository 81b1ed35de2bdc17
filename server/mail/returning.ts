/** Anything that runs SQL: a transaction's manager or the DataSource. */
interface Runs {
  query(sql: string, params?: unknown[]): Promise<unknown>;
}

/**
 * Runs a statement and returns its rows. TypeORM answers UPDATE and DELETE with
 * `[rows, rowCount]` and other statements with the rows; this hides the difference, so
 * `UPDATE … RETURNING` reads like a SELECT.
 */
export async function returningRows<T>(runner: Runs, sql: string, params: unknown[] = []): Promise<T[]> {
  const result = (await runner.query(sql, params)) as unknown[];
  if (result.length === 2 && Array.isArray(result[0]) && typeof result[1] === 'number') return result[0] as T[];
  return result as T[];
}
