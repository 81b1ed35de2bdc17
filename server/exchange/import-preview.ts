import { IMPORT_FIELDS, type ImportPreview, type ImportTarget } from '../../shared/schemas/exchange';
import { csvRecords } from './csv-upload';
import { sniffDelimiter } from './csv-sniff';
import { detectDateFormat, formatsOf, readNumber } from './import-values';

/** Words a header may use for each field (lower case, compared without units or punctuation). */
const HEADER_WORDS: Record<string, string[]> = {
  at: ['at', 'date', 'time', 'datetime', 'timestamp', 'taken at', 'when', 'measured at'],
  sg: ['sg', 'gravity', 'specific gravity', 'corrected gravity', 'plato', 'brix'],
  temperature: ['temperature', 'temp', 'sample temperature'],
  ph: ['ph'],
  name: ['name', 'vessel', 'vessel name'],
  capacity: ['capacity', 'size', 'volume'],
  kind: ['kind', 'type'],
  material: ['material'],
  state: ['state', 'cleaning', 'cleaning state', 'status'],
  notes: ['notes', 'note', 'comment', 'comments'],
};

/** A header without its unit in brackets or punctuation: "Temperature (°F)" → "temperature". */
const bare = (header: string) =>
  header
    .toLowerCase()
    .replace(/\(.*?\)|\[.*?\]/g, '')
    .replace(/[^a-z0-9 ]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();

function suggestColumns(target: ImportTarget, headers: string[]): Record<string, string> {
  const found: Record<string, string> = {};
  for (const field of IMPORT_FIELDS[target]) {
    const header = headers.find((h) => HEADER_WORDS[field].includes(bare(h)));
    if (header !== undefined) found[field] = header;
  }
  return found;
}

const column = (headers: string[], rows: string[][], header: string | undefined) => {
  const i = header === undefined ? -1 : headers.indexOf(header);
  return i < 0 ? [] : rows.map((r) => r[i] ?? '').filter((v) => v.trim());
};

/**
 * What the mapping screen starts from: the delimiter, headers and first rows of a sample of the
 * file, the columns matched by name, and the units and date format the headers and values
 * suggest (each one the person may change).
 * @param sample - the start of the file (the client sends its first 64 KB)
 */
export async function previewOf(target: ImportTarget, sample: string): Promise<ImportPreview> {
  const delimiter = sniffDelimiter(sample);
  // A cut-off last line would read as a broken row: drop it unless the sample ends the file.
  const whole = sample.endsWith('\n') ? sample : sample.slice(0, Math.max(sample.lastIndexOf('\n') + 1, 0)) || sample;
  const records: string[][] = [];
  for await (const record of csvRecords(
    (async function* () {
      yield whole;
    })(),
    delimiter,
  )) {
    records.push(record.cells);
    if (records.length > 50) break;
  }
  const [headers = [], ...rows] = records;
  const suggestedColumns = suggestColumns(target, headers);
  // A date column named in another language: the first column whose cells read as dates.
  if (target === 'readings' && suggestedColumns.at === undefined) {
    const dated = headers.find((h) => {
      const cells = column(headers, rows, h);
      return cells.length > 0 && cells.every((c) => formatsOf(c).length > 0);
    });
    if (dated !== undefined) suggestedColumns.at = dated;
  }
  const notes: string[] = [];
  const unknown = headers.filter((h) => !Object.values(suggestedColumns).includes(h));
  if (unknown.length) notes.push(`Columns not used unless you map them: ${unknown.join(', ')}.`);

  const headerText = (field: string) => (suggestedColumns[field] ?? '').toLowerCase();
  const decimalComma = delimiter === ';' && rows.some((r) => r.some((cell) => /^\d+,\d+$/.test(cell.trim())));
  const dates = detectDateFormat(column(headers, rows, suggestedColumns.at));
  notes.push(...dates.notes);

  const temperatures = column(headers, rows, suggestedColumns.temperature).map((c) => readNumber(c, decimalComma) ?? 0);
  const temperatureUnit = /°f|\bf\b|fahrenheit/.test(headerText('temperature')) || temperatures.some((t) => t > 45) ? 'F' : 'C';

  const gravityHeader = headerText('sg');
  const gravities = column(headers, rows, suggestedColumns.sg).map((c) => readNumber(c, decimalComma) ?? 0);
  let gravityUnit: ImportPreview['gravityUnit'] = 'sg';
  if (/plato|°p\b/.test(gravityHeader)) gravityUnit = 'plato';
  else if (/brix|°bx/.test(gravityHeader)) gravityUnit = 'brix';
  else if (gravities.some((g) => g > 2))
    notes.push('Some gravities are above 2, so they are not specific gravities: choose °Plato or °Brix if that is what the file holds.');

  const volumeUnit = /us gal|gallon|\bgal\b/.test(headerText('capacity')) ? 'US gal' : /imp/.test(headerText('capacity')) ? 'imp gal' : 'L';

  return {
    delimiter,
    headers,
    rows: rows.slice(0, 10),
    suggestedColumns,
    dateFormat: dates.format,
    temperatureUnit,
    gravityUnit,
    volumeUnit,
    decimalComma,
    notes,
  };
}
