import { parse, type CsvError } from 'csv-parse';
import { Readable } from 'node:stream';
import { AppError, BadRequestError } from '../http/errors';

/** The largest file an import reads: past it the upload is refused, whatever has arrived. */
export const MAX_IMPORT_BYTES = 50 * 1024 * 1024;

export class UploadTooLargeError extends AppError {
  constructor(maxBytes: number) {
    super(413, 'too_large', `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB. Split it into smaller files and import each.`);
  }
}

/** An upload as it arrives: the request stream, or chunks already in hand (a test, a script). */
export type UploadChunks = AsyncIterable<Buffer | string> | Iterable<Buffer | string>;

/**
 * The uploaded bytes as UTF-8 text, chunk by chunk (a byte-order mark dropped): refused past
 * `maxBytes`, and refused with the line where it happens when a byte is not UTF-8 (a file
 * saved in a spreadsheet's older "CSV" encoding, or two encodings pasted together).
 */
export async function* utf8Text(source: UploadChunks, maxBytes = MAX_IMPORT_BYTES): AsyncGenerator<string> {
  const decoder = new TextDecoder('utf-8', { fatal: true });
  let bytes = 0;
  let line = 1;
  for await (const raw of source) {
    const chunk = typeof raw === 'string' ? Buffer.from(raw) : raw;
    bytes += chunk.length;
    if (bytes > maxBytes) throw new UploadTooLargeError(maxBytes);
    let text: string;
    try {
      text = decoder.decode(chunk, { stream: true });
    } catch {
      const lenient = chunk.toString('utf8');
      const at = line + (lenient.slice(0, Math.max(0, lenient.indexOf('\uFFFD'))).match(/\n/g)?.length ?? 0);
      throw new BadRequestError(`Line ${at} of the file is not UTF-8 text. Save the file as "CSV UTF-8" and import it again.`, {
        problems: [{ row: at - 1, column: '', message: 'not UTF-8 text' }],
      });
    }
    line += text.match(/\n/g)?.length ?? 0;
    yield text;
  }
  const rest = decoder.decode();
  if (rest) yield rest;
}

/** One record of the file: its cells and its row number (1 = the first after the header). */
export interface CsvRecord {
  row: number;
  cells: string[];
}

/**
 * The records of a CSV text stream, parsed as they arrive. A broken quote stops the file (no
 * later row can be trusted) with the line it is on.
 */
export async function* csvRecords(text: AsyncIterable<string>, delimiter: string): AsyncGenerator<CsvRecord> {
  const parser = parse({ delimiter, relax_column_count: true, skip_empty_lines: true, trim: false, bom: true, max_record_size: 64 * 1024 });
  // pipe() does not pass errors on: a refusal of the text (encoding, size) must end the parse.
  Readable.from(text)
    .on('error', (error) => parser.destroy(error))
    .pipe(parser);
  let row = 0;
  try {
    for await (const cells of parser as AsyncIterable<string[]>) {
      yield { row: row++, cells };
    }
  } catch (error) {
    if (error instanceof AppError) throw error;
    const csv = error as CsvError & { lines?: number };
    throw new BadRequestError(`The file cannot be read as CSV near line ${csv.lines ?? '?'}: ${plainCsvMessage(csv)}`, {
      problems: [{ row: Math.max(0, (csv.lines ?? 1) - 1), column: '', message: plainCsvMessage(csv) }],
    });
  }
}

function plainCsvMessage(error: CsvError): string {
  switch (error.code) {
    case 'CSV_INVALID_CLOSING_QUOTE':
    case 'CSV_QUOTE_NOT_CLOSED':
      return 'a quoted cell is not closed properly (a stray " inside a cell?)';
    case 'CSV_MAX_RECORD_SIZE':
      return 'a row is longer than 64 KB (is the delimiter right?)';
    default:
      return 'the text is not well-formed CSV';
  }
}
