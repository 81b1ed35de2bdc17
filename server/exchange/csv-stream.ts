import { stringify } from 'csv-stringify';
import { Readable, type Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { neutraliseCell, type Cell } from './csv-cells';

/** One column of an exported table: its header and how a row fills it. */
export interface CsvColumn<Row> {
  header: string;
  value: (row: Row) => Cell;
}

/**
 * Writes a table as CSV to `out`, page by page as `pages` yields them: only one page of rows is
 * in memory at a time, and a slow reader holds the next page back (the pipeline's back-pressure).
 * Every text cell is neutralised against spreadsheet formulas. Ends `out`.
 * @param bom - start with a UTF-8 byte-order mark, so spreadsheets read the accents right
 */
export async function writeCsv<Row>(out: Writable, columns: CsvColumn<Row>[], pages: AsyncIterable<Row[]>, options: { bom: boolean }): Promise<void> {
  async function* records() {
    for await (const page of pages) {
      for (const row of page) yield columns.map((c) => neutraliseCell(c.value(row)));
    }
  }
  const csv = stringify({
    bom: options.bom,
    header: true,
    columns: columns.map((c) => neutraliseCell(c.header) as string),
    record_delimiter: 'windows',
    cast: { boolean: (v) => (v ? 'yes' : 'no') },
  });
  await pipeline(Readable.from(records()), csv, out);
}

/**
 * Pages of a list read `pageSize` at a time until a short page: offsets are safe here because
 * the whole export reads one snapshot (its request's REPEATABLE READ transaction).
 */
export async function* inPages<Row>(read: (page: number, pageSize: number) => Promise<Row[]>, pageSize = 200): AsyncIterable<Row[]> {
  for (let page = 1; ; page++) {
    const rows = await read(page, pageSize);
    if (rows.length) yield rows;
    if (rows.length < pageSize) return;
  }
}
