import crypto from 'node:crypto';
import type { ZodType } from 'zod';
import { brixToSg, celsiusFrom, litresFrom, platoToSg, recordedGravity } from '../../shared/calc';
import type { ImportOptions, ImportProblem } from '../../shared/schemas/exchange';
import { readingRequestSchema } from '../../shared/schemas/journal';
import { vesselCreateSchema, type VesselKind } from '../../shared/schemas/vessels';
import { localDate } from '../core/local-date';
import type { CsvRecord } from './csv-upload';
import { readMoment, readNumber } from './import-values';

/**
 * One imported row read into what the cellar stores, or the problems that stop it, each
 * named by row and by the file's own column header. Also the row's key: a hash of what it
 * says, so the same row imported again is recognised and skipped.
 */

export type RowOutcome<T> = { value: T; key: string; problems: [] } | { value: null; key: null; problems: ImportProblem[] };

/** Where each mapped field sits in the file. */
export interface ColumnMap {
  headers: string[];
  /** field → index of its column */
  index: Record<string, number>;
}

const rowKey = (...parts: unknown[]) => crypto.createHash('sha256').update(JSON.stringify(parts)).digest('hex');

class RowReader {
  readonly problems: ImportProblem[] = [];
  constructor(
    private readonly record: CsvRecord,
    private readonly columns: ColumnMap,
  ) {
    if (record.cells.length !== columns.headers.length) {
      this.problems.push({
        row: record.row,
        column: '',
        message: `has ${record.cells.length} cells where the header has ${columns.headers.length} (is the delimiter right?)`,
      });
    }
  }

  header(field: string): string {
    return this.columns.headers[this.columns.index[field]] ?? field;
  }

  /** The cell of a mapped field ('' when the field is not mapped or the cell is empty). */
  text(field: string): string {
    const i = this.columns.index[field];
    return i === undefined ? '' : (this.record.cells[i] ?? '').trim();
  }

  problem(field: string, message: string): void {
    this.problems.push({ row: this.record.row, column: this.header(field), message });
  }

  number(field: string, options: ImportOptions, required: boolean): number | null {
    const cell = this.text(field);
    if (!cell) {
      if (required) this.problem(field, 'is empty');
      return null;
    }
    const value = readNumber(cell, options.decimalComma);
    if (value === null)
      this.problem(
        field,
        `"${cell.slice(0, 40)}" is not a number${options.decimalComma ? '' : ' (a decimal comma? choose it on the mapping screen)'}`,
      );
    return value;
  }

  /** Runs the API's own schema on the converted row, naming the column of each refusal. */
  check<T>(schema: ZodType<T>, value: unknown, fieldOf: Record<string, string>): T | null {
    const result = schema.safeParse(value);
    if (result.success) return result.data;
    for (const issue of result.error.issues) this.problem(fieldOf[String(issue.path[0])] ?? String(issue.path[0]), issue.message);
    return null;
  }
}

const toSg = (value: number, unit: ImportOptions['gravityUnit']) => (unit === 'plato' ? platoToSg(value) : unit === 'brix' ? brixToSg(value) : value);

export interface ImportedReading {
  occurredAt: Date;
  sg: number;
  temperatureC: number | null;
  calibrationC: 20 | 15.56;
  correctedSg: number;
  ph: number | null;
}

/**
 * A reading from one row: the moment in the chosen date format (the cellar's local time unless
 * the cell has an offset), the gravity and temperature converted to SG and °C, then the same
 * checks as a reading logged by hand, plus: not in the future, not before the batch started.
 */
export function readingFromRow(
  record: CsvRecord,
  columns: ColumnMap,
  options: ImportOptions,
  context: { timeZone: string; startedOn: string; now: Date },
): RowOutcome<ImportedReading> {
  const row = new RowReader(record, columns);
  const atCell = row.text('at');
  const at = atCell ? readMoment(atCell, options.dateFormat, context.timeZone) : null;
  if (!atCell) row.problem('at', 'is empty');
  else if (!at) row.problem('at', `"${atCell.slice(0, 40)}" is not a date in the chosen format (${options.dateFormat.toUpperCase()})`);
  else if (at.getTime() > context.now.getTime() + 60_000) row.problem('at', 'is in the future');
  else if (localDate(at, context.timeZone) < context.startedOn) row.problem('at', `is before the batch started (${context.startedOn})`);

  const gravity = row.number('sg', options, true);
  const temperature = row.number('temperature', options, false);
  const ph = row.number('ph', options, false);
  // Every cell that reads is still checked, so one pass lists all of a row's problems.
  if (gravity === null || (temperature === null && row.text('temperature')) || (ph === null && row.text('ph'))) {
    return { value: null, key: null, problems: row.problems };
  }

  let sg: number;
  let temperatureC: number | null;
  try {
    sg = toSg(gravity, options.gravityUnit);
    temperatureC = temperature === null ? null : options.temperatureUnit === 'F' ? celsiusFrom(temperature, 'F') : temperature;
  } catch (error) {
    row.problem('sg', error instanceof Error ? error.message : 'cannot be converted');
    return { value: null, key: null, problems: row.problems };
  }
  const checked = row.check(
    readingRequestSchema,
    { sg: Math.round(sg * 10000) / 10000, temperatureC: temperatureC === null ? null : Math.round(temperatureC * 10) / 10, ph },
    { sg: 'sg', temperatureC: 'temperature', ph: 'ph' },
  );
  if (!checked || row.problems.length) return { value: null, key: null, problems: row.problems };
  const value: ImportedReading = {
    occurredAt: at!,
    sg: checked.sg,
    temperatureC: checked.temperatureC,
    calibrationC: checked.calibrationC,
    correctedSg: recordedGravity(checked.sg, checked.temperatureC, checked.calibrationC),
    ph: checked.ph,
  };
  return { value, key: rowKey(at!.toISOString(), value.sg, value.temperatureC, value.ph), problems: [] };
}

export interface ImportedVessel {
  name: string;
  kind: VesselKind;
  material: 'glass' | 'plastic' | 'stainless' | 'oak' | 'ceramic' | 'other';
  capacityL: number;
  state: 'dirty' | 'clean' | 'sanitised';
  notes: string;
}

/** A vessel from one row: capacity in the chosen volume unit; kind and material "other" when not given. */
export function vesselFromRow(record: CsvRecord, columns: ColumnMap, options: ImportOptions): RowOutcome<ImportedVessel> {
  const row = new RowReader(record, columns);
  const capacity = row.number('capacity', options, true);
  if (!row.text('name')) row.problem('name', 'is empty');
  if (row.problems.length) return { value: null, key: null, problems: row.problems };
  const lower = (field: string, fallback: string) => row.text(field).toLowerCase() || fallback;
  const checked = row.check(
    vesselCreateSchema,
    {
      name: row.text('name'),
      capacityL: Math.round(litresFrom(capacity!, options.volumeUnit) * 1000) / 1000,
      kind: lower('kind', 'other'),
      material: lower('material', 'other'),
      state: lower('state', 'dirty'),
      notes: row.text('notes'),
    },
    { name: 'name', capacityL: 'capacity', kind: 'kind', material: 'material', state: 'state', notes: 'notes' },
  );
  if (!checked) return { value: null, key: null, problems: row.problems };
  return { value: checked, key: rowKey(checked.name, checked.capacityL, checked.kind, checked.material), problems: [] };
}
