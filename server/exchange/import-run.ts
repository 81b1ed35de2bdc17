import type { EntityManager } from 'typeorm';
import { REQUIRED_FIELDS, type ImportOptions, type ImportProblem, type ImportResult, type ImportTarget } from '../../shared/schemas/exchange';
import { BadRequestError } from '../http/errors';
import { csvRecords, utf8Text, type CsvRecord, type UploadChunks } from './csv-upload';
import type { ColumnMap, RowOutcome } from './import-rows';

/** Problems listed before the import stops reading: enough to fix a file, not a flood. */
const MAX_PROBLEMS = 200;
/** Rows whose keys are checked and written together. */
const CHUNK = 500;

/** The file's headers matched to the fields the person mapped; 400 when a required one is missing. */
function columnMap(target: ImportTarget, headers: string[], mapping: Record<string, string>): ColumnMap {
  const index: Record<string, number> = {};
  const problems: ImportProblem[] = [];
  for (const [field, header] of Object.entries(mapping)) {
    const i = headers.indexOf(header);
    if (i < 0) problems.push({ row: 0, column: header, message: `is not a column of the file (mapped to ${field})` });
    else index[field] = i;
  }
  for (const field of REQUIRED_FIELDS[target]) {
    if (!(field in mapping)) problems.push({ row: 0, column: '', message: `choose the column that holds ${field}` });
  }
  if (problems.length) throw new BadRequestError('The column mapping does not fit the file.', { problems });
  return { headers, index };
}

/**
 * Reads an uploaded CSV as it arrives and writes its rows in the caller's transaction, all or
 * nothing: each row is read and checked; rows are written a chunk at a time while no problem
 * has been found; after the first problem nothing more is written, every later row is still
 * checked (up to 200 problems), and the import ends in a 400 listing them all, which rolls the
 * transaction back. A row whose key is already recorded for `target` is skipped.
 * @param keyScope - what the row keys belong to ("readings:<batch id>", "vessels")
 */
export async function runImport<T>(
  tx: EntityManager,
  cellarId: string,
  upload: UploadChunks,
  options: ImportOptions,
  job: {
    target: ImportTarget;
    keyScope: string;
    read: (record: CsvRecord, columns: ColumnMap) => RowOutcome<T>;
    write: (rows: T[]) => Promise<void>;
  },
): Promise<ImportResult> {
  const problems: ImportProblem[] = [];
  let columns: ColumnMap | null = null;
  let pending: { key: string; value: T }[] = [];
  const result = { added: 0, alreadyImported: 0, rows: 0 };

  const flush = async () => {
    const chunk = pending;
    pending = [];
    if (!chunk.length || problems.length) return;
    const fresh: { row_key: string }[] = await tx.query(
      `INSERT INTO import_row_keys (cellar_id, target, row_key) SELECT $1, $2, unnest($3::text[]) ON CONFLICT DO NOTHING RETURNING row_key`,
      [cellarId, job.keyScope, chunk.map((r) => r.key)],
    );
    const keys = new Set(fresh.map((r) => r.row_key));
    // A row repeated inside the file counts once: the first one takes the key.
    const rows = chunk.filter((r) => keys.delete(r.key)).map((r) => r.value);
    result.added += rows.length;
    result.alreadyImported += chunk.length - rows.length;
    await job.write(rows);
  };

  for await (const record of csvRecords(utf8Text(upload), options.delimiter)) {
    if (!columns) {
      columns = columnMap(job.target, record.cells, options.columns);
      continue;
    }
    result.rows++;
    // Past the limit the rest is only read through (closing the request early would lose the answer).
    if (problems.length >= MAX_PROBLEMS) continue;
    const outcome = job.read(record, columns);
    if (outcome.problems.length) {
      problems.push(...outcome.problems);
      pending = [];
    } else if (!problems.length) {
      pending.push({ key: outcome.key!, value: outcome.value! });
      if (pending.length >= CHUNK) await flush();
    }
  }
  if (!columns) throw new BadRequestError('The file is empty.', { problems: [{ row: 0, column: '', message: 'no header row' }] });
  await flush();
  if (problems.length) {
    const shown = problems.slice(0, MAX_PROBLEMS);
    throw new BadRequestError(
      `${shown.length}${problems.length >= MAX_PROBLEMS ? '+' : ''} problem${shown.length === 1 ? '' : 's'} in the file; nothing was imported.`,
      { problems: shown },
    );
  }
  return result;
}
