import type { ReadingView } from '../../shared/domain/journal';
import type { BatchSummary } from '../../shared/schemas/batches';
import type { BottleCase, BottleLot } from '../../shared/schemas/bottles';
import type { Vessel } from '../../shared/schemas/vessels';
import type { ExportedEntry } from '../journal/journal-export';
import { isoInZone } from '../core/local-date';
import { unitWriter, type Cell, type UnitSystem } from './csv-cells';
import type { CsvColumn } from './csv-stream';

/** A reading with the batch it belongs to. */
export type ReadingRow = ReadingView & { batchId: string; batchName: string };
/** A case with what a spreadsheet needs of its lot. */
export type CaseRow = BottleCase & { lotCode: string; batchName: string };
/** A bottle departure with its case and lot. */
export interface DepartureRow {
  id: string;
  caseCode: string;
  lotCode: string;
  batchName: string;
  count: number;
  reason: string;
  note: string;
  occurredAt: Date;
  authorName: string | null;
}

/** How a file is written: units as the person works, moments in the cellar's time zone. */
export interface ExportStyle {
  units: UnitSystem;
  timeZone: string;
}

const place = (p: Vessel['place']) => (p ? `${p.rackName} / shelf ${p.shelfNumber} / slot ${p.slot}` : null);

export function batchColumns({ units, timeZone }: ExportStyle): CsvColumn<BatchSummary>[] {
  const u = unitWriter(units);
  return [
    { header: 'batch id', value: (b) => b.id },
    { header: 'name', value: (b) => b.name },
    { header: 'kind', value: (b) => b.kind },
    { header: 'stage', value: (b) => b.stage },
    { header: 'started on', value: (b) => b.startedOn },
    { header: 'original gravity (SG)', value: (b) => b.og },
    { header: `volume in vessels (${u.volumeHeader})`, value: (b) => u.volume(b.volumeL) },
    { header: 'vessels', value: (b) => b.vesselCount },
    { header: 'last reading (SG)', value: (b) => b.lastReading?.sg },
    { header: 'last reading at', value: (b) => isoInZone(b.lastReading?.at ?? null, timeZone) },
    { header: 'last racked at', value: (b) => isoInZone(b.lastRackedAt, timeZone) },
    { header: 'needs racking', value: (b) => b.needsRacking },
    { header: 'yeast tolerance (% ABV)', value: (b) => b.yeastToleranceAbv },
  ];
}

/** A payload field, whichever kind of entry has it. */
const field = (e: ExportedEntry, name: string): unknown => (e.payload as Record<string, unknown>)[name];
const num = (v: unknown): number | null => (typeof v === 'number' ? v : null);
const text = (v: unknown): Cell => (typeof v === 'string' ? v : null);
const vesselList = (v: unknown, volume: (l: number) => number | null): Cell =>
  Array.isArray(v)
    ? v
        .map((x: { vesselName?: string; vesselId?: string; volumeL?: number }) => `${x.vesselName ?? x.vesselId}: ${volume(x.volumeL ?? 0)}`)
        .join('; ')
    : null;

/** One row per journal entry; each field any kind of entry has is a column (empty where it has none). */
export function journalColumns({ units, timeZone }: ExportStyle): CsvColumn<ExportedEntry>[] {
  const u = unitWriter(units);
  const volume = (l: number) => u.volume(l);
  return [
    { header: 'entry id', value: (e) => e.id },
    { header: 'batch id', value: (e) => e.batchId },
    { header: 'batch', value: (e) => e.batchName },
    { header: 'kind', value: (e) => e.kind },
    { header: 'occurred at', value: (e) => isoInZone(e.occurredAt, timeZone) },
    { header: 'recorded at', value: (e) => isoInZone(e.recordedAt, timeZone) },
    { header: 'by', value: (e) => e.authorName ?? (e.authorId === null ? 'the cellar' : 'a former member') },
    { header: 'corrects entry', value: (e) => e.amendsEntryId },
    { header: 'gravity (SG)', value: (e) => num(field(e, 'sg')) },
    { header: 'corrected gravity (SG)', value: (e) => num(field(e, 'correctedSg')) },
    { header: `temperature (${u.temperatureHeader})`, value: (e) => u.temperature(num(field(e, 'temperatureC'))) },
    { header: `hydrometer calibration (${u.temperatureHeader})`, value: (e) => u.temperature(num(field(e, 'calibrationC'))) },
    { header: 'pH', value: (e) => num(field(e, 'ph')) },
    { header: 'original gravity (SG)', value: (e) => num(field(e, 'og')) },
    { header: `volume (${u.volumeHeader})`, value: (e) => u.volume(num(field(e, 'volumeL'))) },
    { header: `loss (${u.volumeHeader})`, value: (e) => u.volume(num(field(e, 'lossL'))) },
    { header: `from vessels (${u.volumeHeader})`, value: (e) => vesselList(field(e, 'from'), volume) },
    { header: `to vessels (${u.volumeHeader})`, value: (e) => vesselList(field(e, 'to') ?? field(e, 'vessels'), volume) },
    // An emptying's reason (spoiled, spilled…) is its category; its `reason` field is not an amendment's reason.
    { header: 'category', value: (e) => text(field(e, 'category')) ?? (e.kind === 'emptied' ? text(field(e, 'reason')) : null) },
    { header: 'name', value: (e) => text(field(e, 'name')) ?? text(field(e, 'childName')) ?? text(field(e, 'vesselName')) },
    { header: 'amount', value: (e) => num(field(e, 'amount')) },
    { header: 'amount unit', value: (e) => text(field(e, 'unit')) },
    { header: 'take out on', value: (e) => text(field(e, 'removeOn')) },
    { header: 'with', value: (e) => text(field(e, 'with')) },
    { header: 'appearance', value: (e) => text(field(e, 'appearance')) },
    { header: 'aroma', value: (e) => text(field(e, 'aroma')) },
    { header: 'flavour', value: (e) => text(field(e, 'flavour')) },
    { header: 'score', value: (e) => num(field(e, 'score')) },
    { header: 'lot', value: (e) => text(field(e, 'lotCode')) },
    { header: 'bottles', value: (e) => num(field(e, 'bottleCount')) },
    { header: 'bottle size (mL)', value: (e) => num(field(e, 'bottleMl')) },
    { header: 'text', value: (e) => text(field(e, 'text')) ?? text(field(e, 'note')) ?? text(field(e, 'caption')) ?? text(field(e, 'reason')) },
    { header: 'corrected fields', value: (e) => (e.kind === 'amendment' ? JSON.stringify(field(e, 'changes')) : null) },
  ];
}

export function readingColumns({ units, timeZone }: ExportStyle): CsvColumn<ReadingRow>[] {
  const u = unitWriter(units);
  return [
    { header: 'entry id', value: (r) => r.entryId },
    { header: 'batch id', value: (r) => r.batchId },
    { header: 'batch', value: (r) => r.batchName },
    { header: 'taken at', value: (r) => isoInZone(r.at, timeZone) },
    { header: 'gravity (SG)', value: (r) => r.sg },
    { header: 'corrected gravity (SG)', value: (r) => r.correctedSg },
    { header: `temperature (${u.temperatureHeader})`, value: (r) => u.temperature(r.temperatureC) },
    { header: 'pH', value: (r) => r.ph },
  ];
}

export function vesselColumns({ units, timeZone }: ExportStyle): CsvColumn<Vessel>[] {
  const u = unitWriter(units);
  return [
    { header: 'vessel id', value: (v) => v.id },
    { header: 'label code', value: (v) => v.code },
    { header: 'name', value: (v) => v.name },
    { header: 'kind', value: (v) => v.kind },
    { header: 'material', value: (v) => v.material },
    { header: `capacity (${u.volumeHeader})`, value: (v) => u.volume(v.capacityL) },
    { header: 'state', value: (v) => v.state },
    { header: 'sanitised at', value: (v) => isoInZone(v.sanitisedAt, timeZone) },
    { header: 'batch', value: (v) => v.batch?.name },
    { header: `volume held (${u.volumeHeader})`, value: (v) => u.volume(v.volumeL) },
    { header: 'filled at', value: (v) => isoInZone(v.filledAt, timeZone) },
    { header: 'place', value: (v) => place(v.place) },
    { header: 'notes', value: (v) => v.notes },
  ];
}

export function lotColumns(): CsvColumn<BottleLot>[] {
  return [
    { header: 'lot id', value: (l) => l.id },
    { header: 'lot code', value: (l) => l.code },
    { header: 'batch', value: (l) => l.batchName },
    { header: 'bottled on', value: (l) => l.bottledOn },
    { header: 'bottle size (mL)', value: (l) => l.bottleMl },
    { header: 'bottles', value: (l) => l.bottleCount },
    { header: 'bottles left', value: (l) => l.bottlesLeft },
    { header: 'closure', value: (l) => l.closure },
    { header: 'carbonation', value: (l) => l.carbonation },
    { header: 'sulfite added', value: (l) => l.sulfiteAdded },
    { header: 'estimated ABV (%)', value: (l) => l.abvEstimate },
    { header: 'cases', value: (l) => l.cases.length },
    { header: 'note', value: (l) => l.note },
  ];
}

export function caseColumns(): CsvColumn<CaseRow>[] {
  return [
    { header: 'case id', value: (c) => c.id },
    { header: 'label code', value: (c) => c.code },
    { header: 'lot code', value: (c) => c.lotCode },
    { header: 'batch', value: (c) => c.batchName },
    { header: 'case number', value: (c) => c.number },
    { header: 'bottles packed', value: (c) => c.bottlesInitial },
    { header: 'bottles left', value: (c) => c.bottlesLeft },
    { header: 'place', value: (c) => place(c.place) },
  ];
}

export function departureColumns({ timeZone }: ExportStyle): CsvColumn<DepartureRow>[] {
  return [
    { header: 'departure id', value: (d) => d.id },
    { header: 'case code', value: (d) => d.caseCode },
    { header: 'lot code', value: (d) => d.lotCode },
    { header: 'batch', value: (d) => d.batchName },
    { header: 'bottles', value: (d) => d.count },
    { header: 'reason', value: (d) => d.reason },
    { header: 'note', value: (d) => d.note },
    { header: 'left at', value: (d) => isoInZone(d.occurredAt, timeZone) },
    { header: 'by', value: (d) => d.authorName },
  ];
}
