import { ABV_FORMULA_LABELS, abvBy, DEFAULT_ABV_FORMULA, formatVolume, type UnitSystem } from '../../shared/calc';
import { dayMonthYear } from '../../shared/date-words';
import { BATCH_KIND_LABELS } from '../../shared/schemas/batches';
import type { LabelItem } from './types';

/** The printed ABV: always marked as an estimate; "—" when unknown. */
export function abvText(abv: number | null): string {
  return abv === null || !Number.isFinite(abv) ? 'ABV —' : `ABV ≈ ${abv.toFixed(1)} % (est., ${ABV_FORMULA_LABELS[DEFAULT_ABV_FORMULA]})`;
}

/**
 * Current ABV estimate by the default formula (shared/calc DEFAULT_ABV_FORMULA), from the original gravity and the latest
 * (temperature-corrected) reading; null when either is missing or the pair is impossible.
 */
export function currentAbv(og: number | null, latestSg: number | null): number | null {
  if (og === null || latestSg === null || latestSg > og) return null;
  try {
    return Math.round(abvBy(og, latestSg) * 10) / 10;
  } catch {
    return null;
  }
}

const kindLabel = (kind: string | null) => (kind ? ((BATCH_KIND_LABELS as Record<string, string>)[kind] ?? kind) : '');
const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
const bottleSize = (ml: number) => formatVolume(ml / 1000, 'metric');

export interface VesselLabelRow {
  id: string;
  code: string;
  name: string;
  vesselKind: string;
  capacityL: number;
  batchName: string | null;
  batchKind: string | null;
  startedOn: string | null;
  og: number | null;
  lastSg: number | null;
  unitSystem: UnitSystem;
  /** The cellar's local date of printing, YYYY-MM-DD (today in UTC when not given). */
  printedOn?: string;
}

/**
 * A vessel's label carries what does not change — its name, kind and capacity, and its code.
 * What it holds changes with every racking, so contents are printed only with the day the label
 * was printed ("Contents on 3 Dec 2026"), and an empty vessel's label says nothing about them.
 */
export function vesselLabel(row: VesselLabelRow): LabelItem {
  const printedOn = row.printedOn ?? new Date().toISOString().slice(0, 10);
  const holding = row.batchName !== null;
  return {
    kind: 'vessel',
    id: row.id,
    code: row.code,
    texts: {
      name: row.name,
      code: row.code,
      capacity: `${capitalised(row.vesselKind)} · ${formatVolume(row.capacityL, row.unitSystem)}`,
      batch: holding ? row.batchName! : '',
      kind: holding ? kindLabel(row.batchKind) : '',
      started: holding && row.startedOn ? `Started ${dayMonthYear(row.startedOn)}` : '',
      og: holding ? `OG ${row.og === null ? '—' : row.og.toFixed(3)}` : '',
      abv: holding ? abvText(currentAbv(row.og, row.lastSg)) : '',
      printed: holding ? `Contents on ${dayMonthYear(printedOn)}` : '',
    },
  };
}

export interface BottleLabelRow {
  id: string;
  code: string;
  batchName: string;
  batchKind: string;
  bottledOn: string;
  bottleMl: number;
  carbonation: string;
  sulfiteAdded: boolean;
  /** The lot's estimate at bottling, else one from the batch's gravities. */
  abv: number | null;
}

function bottleTexts(row: BottleLabelRow, contents: string): LabelItem['texts'] {
  return {
    batch: row.batchName,
    code: row.code,
    kind: kindLabel(row.batchKind) + (row.carbonation === 'sparkling' ? ' · sparkling' : ''),
    bottled: `Bottled ${dayMonthYear(row.bottledOn)}`,
    contents,
    abv: abvText(row.abv),
    sulfites: row.sulfiteAdded ? 'Contains sulfites' : '',
  };
}

/** A case's label: batch, bottling date, bottles in the case, ABV, sulfite line. */
export function caseLabel(row: BottleLabelRow & { number: number; bottlesInitial: number }): LabelItem {
  const contents = `Case ${row.number} · ${row.bottlesInitial} × ${bottleSize(row.bottleMl)}`;
  return { kind: 'case', id: row.id, code: row.code, texts: bottleTexts(row, contents) };
}

/** A lot's own label: batch, bottling date, how many bottles the run made. */
export function lotLabel(row: BottleLabelRow & { bottleCount: number }): LabelItem {
  const contents = `Lot · ${row.bottleCount} × ${bottleSize(row.bottleMl)}`;
  return { kind: 'lot', id: row.id, code: row.code, texts: bottleTexts(row, contents) };
}
