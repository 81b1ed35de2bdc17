import { z } from 'zod';
import { batchStartSchema, gravitySchema } from '../schemas/batches';
import {
  additionRequestSchema,
  noteRequestSchema,
  readingRequestSchema,
  tasteRequestSchema,
  type JournalKind,
  type JournalPayload,
} from '../schemas/journal';
import { emptyVesselRequestSchema } from '../schemas/vessel-emptying';

/**
 * The journal's rules, for both sides: the one order of entries, how amendments merge into
 * the entries they correct, the readings view, and which fields of which kinds may be
 * corrected. The server's journal module and the client's Batch page both use these.
 */

/** The least an entry needs for these rules; server rows and client entries both fit. */
export interface JournalRecord {
  id: string;
  occurredAt: Date | string;
  recordedAt: Date | string;
  amendsEntryId: string | null;
  payload: JournalPayload;
}

const time = (value: Date | string): number => (value instanceof Date ? value.getTime() : Date.parse(value));

/**
 * The journal's order: by when it happened in the cellar, then when it was recorded, then by
 * id, so entries with equal timestamps come out the same way every time.
 */
export function compareEntries(a: JournalRecord, b: JournalRecord): number {
  return time(a.occurredAt) - time(b.occurredAt) || time(a.recordedAt) - time(b.recordedAt) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** The order amendments are applied in: as recorded, then by id. A later correction wins. */
function compareAmendments(a: JournalRecord, b: JournalRecord): number {
  return time(a.recordedAt) - time(b.recordedAt) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/** The changes all amendments make to each amended entry, merged oldest first. */
export function mergedChanges(entries: readonly JournalRecord[]): Map<string, Record<string, unknown>> {
  const changes = new Map<string, Record<string, unknown>>();
  const amendments = entries.filter((e) => e.amendsEntryId && e.payload.kind === 'amendment').sort(compareAmendments);
  for (const a of amendments) {
    const target = a.amendsEntryId as string;
    if (a.payload.kind === 'amendment') changes.set(target, { ...changes.get(target), ...a.payload.changes });
  }
  return changes;
}

/** An entry's payload with the merged changes of its amendments applied (unchanged without any). */
export function withChanges(entry: JournalRecord, changes: ReadonlyMap<string, Record<string, unknown>>): JournalPayload {
  const own = changes.get(entry.id);
  return (own ? { ...entry.payload, ...own } : entry.payload) as JournalPayload;
}

/** Every entry's payload as corrected by its amendments (entries without any unchanged). */
export function amendedPayloads(entries: readonly JournalRecord[]): Map<string, JournalPayload> {
  const changes = mergedChanges(entries);
  return new Map(entries.map((e) => [e.id, withChanges(e, changes)]));
}

/**
 * One entry's payload with its amendments applied.
 * @param journal - the batch's entries (any order); only amendments of `entry` matter
 */
export function effectivePayload(entry: JournalRecord, journal: readonly JournalRecord[]): JournalPayload {
  return withChanges(entry, mergedChanges(journal.filter((e) => e.amendsEntryId === entry.id)));
}

/** A gravity reading as the Batch page, the chart and the fermentation state read it. */
export interface ReadingView {
  entryId: string;
  at: string;
  sg: number;
  correctedSg: number;
  temperatureC: number | null;
  ph: number | null;
}

/** The batch's readings, corrections applied, in the journal's order (oldest first). */
export function readingsView(entries: readonly JournalRecord[]): ReadingView[] {
  const amended = amendedPayloads(entries);
  return entries
    .filter((e) => e.payload.kind === 'reading')
    .sort(compareEntries)
    .map((e) => {
      const p = amended.get(e.id) as Extract<JournalPayload, { kind: 'reading' }>;
      const at = e.occurredAt instanceof Date ? e.occurredAt.toISOString() : e.occurredAt;
      return { entryId: e.id, at, sg: Number(p.sg), correctedSg: Number(p.correctedSg), temperatureC: p.temperatureC, ph: p.ph };
    });
}

// ---- What a correction may change ----------------------------------------------------------

const reading = readingRequestSchema.shape;
const tasting = tasteRequestSchema.shape;
const addition = additionRequestSchema.shape;
const start = batchStartSchema.shape;

/** Per entry kind, the fields a later correction may change, each with the rule it must meet. */
export const CORRECTABLE_FIELDS = {
  reading: { sg: gravitySchema, temperatureC: reading.temperatureC.unwrap(), ph: reading.ph.unwrap() },
  tasted: {
    appearance: tasting.appearance.unwrap(),
    aroma: tasting.aroma.unwrap(),
    flavour: tasting.flavour.unwrap(),
    score: tasting.score.unwrap(),
  },
  note: { text: noteRequestSchema.shape.text },
  addition: { name: addition.name, amount: addition.amount, unit: addition.unit, removeOn: addition.removeOn.unwrap() },
  /** The start's figures: the batch's own record follows a correction of them. */
  started: {
    og: start.og.unwrap().unwrap(),
    startedOn: start.startedOn,
    volumeL: start.plannedVolumeL,
    yeastName: start.yeast.shape.name,
    yeastToleranceAbv: start.yeast.shape.toleranceAbv,
  },
  /** Why a vessel was poured out; the litres and the vessel are what happened and stay. */
  emptied: { reason: emptyVesselRequestSchema.shape.reason, note: emptyVesselRequestSchema.shape.note },
} satisfies Partial<Record<JournalKind, z.ZodRawShape>>;

export type CorrectableKind = keyof typeof CORRECTABLE_FIELDS;

/** Kinds whose entries move liquid: corrected by a new operation, never by an amendment. */
export const VOLUME_KINDS: readonly JournalKind[] = ['started', 'racked', 'topped-up', 'bottled', 'split', 'blended'];

export const isCorrectable = (kind: JournalKind): kind is CorrectableKind => kind in CORRECTABLE_FIELDS;

/** The names of the fields of `kind` that may be corrected ([] when none). */
export function correctableFieldNames(kind: JournalKind): string[] {
  return isCorrectable(kind) ? Object.keys(CORRECTABLE_FIELDS[kind]) : [];
}

/** How a refusal names an entry of each kind ("a reading" for those not listed). */
const CORRECTION_LABELS: Partial<Record<CorrectableKind, string>> = {
  tasted: 'a tasting',
  addition: 'an addition',
  started: 'the start',
  emptied: 'an emptying',
};

/**
 * The strict schema for an amendment's `changes` to an entry of `kind`: only its correctable
 * fields, each optional, at least one of them.
 */
export function correctionSchema(kind: CorrectableKind) {
  const shape = CORRECTABLE_FIELDS[kind];
  const fields = Object.keys(shape).join(', ');
  const label = CORRECTION_LABELS[kind] ?? `a ${kind}`;
  return z
    .strictObject(shape, {
      error: (issue) =>
        issue.code === 'unrecognized_keys' ? `${label} has no field ${issue.keys.join(', ')} that can be corrected (only ${fields})` : undefined,
    })
    .partial()
    .refine((changes) => Object.keys(changes).length > 0, `say which of ${fields} to correct`);
}
