import { z } from 'zod';
import { CORRECTABLE_FIELDS, correctableFieldNames, isCorrectable, type CorrectableKind } from '@shared/domain/journal';
import type { JournalKind } from '@shared/schemas/journal';
import { EMPTYING_REASON_OPTIONS } from '@shared/schemas/vessel-emptying';

/**
 * How the correction form shows each correctable field. Which fields may be corrected, and
 * the rules they must meet, live in shared/domain/journal.ts (the server checks the same);
 * only labels and input types are the client's.
 */
export type AmendFieldType = 'number' | 'temperature' | 'volume' | 'text' | 'longtext' | 'date' | 'choice';
export interface AmendField {
  key: string;
  label: string;
  type: AmendFieldType;
  /** The values a 'choice' field offers. */
  options?: readonly { value: string; label: string }[];
}

/** A label and input for every correctable field of every kind: a field without one does not compile. */
type AmendPresentation = {
  [K in CorrectableKind]: Record<keyof (typeof CORRECTABLE_FIELDS)[K], Omit<AmendField, 'key'>>;
};

const PRESENTATION: AmendPresentation = {
  reading: {
    sg: { label: 'Gravity (as read)', type: 'number' },
    temperatureC: { label: 'Sample temperature', type: 'temperature' },
    ph: { label: 'pH', type: 'number' },
  },
  addition: {
    name: { label: 'What was added', type: 'text' },
    amount: { label: 'Amount', type: 'number' },
    unit: { label: 'Unit', type: 'text' },
    removeOn: { label: 'Take out on', type: 'date' },
  },
  tasted: {
    appearance: { label: 'Appearance', type: 'longtext' },
    aroma: { label: 'Aroma', type: 'longtext' },
    flavour: { label: 'Flavour and finish', type: 'longtext' },
    score: { label: 'Score', type: 'number' },
  },
  note: { text: { label: 'Note', type: 'longtext' } },
  started: {
    og: { label: 'Original gravity', type: 'number' },
    startedOn: { label: 'Started on', type: 'date' },
    volumeL: { label: 'Volume', type: 'volume' },
    yeastName: { label: 'Yeast', type: 'text' },
    yeastToleranceAbv: { label: 'Yeast alcohol tolerance (% ABV)', type: 'number' },
  },
  emptied: {
    reason: { label: 'Why it was emptied', type: 'choice', options: EMPTYING_REASON_OPTIONS },
    note: { label: 'Note', type: 'longtext' },
  },
};

/** The fields a correction of an entry of `kind` may change, in the shared order ([] when none). */
export function amendableFields(kind: JournalKind): AmendField[] {
  if (!isCorrectable(kind)) return [];
  const shown: Record<string, Omit<AmendField, 'key'>> = PRESENTATION[kind];
  return correctableFieldNames(kind).map((key) => ({ key, ...shown[key] }));
}

/**
 * The rules for the `changes` of a correction of `kind`: each correctable field's shared rule,
 * each optional. "At least one change" is left to the dialog, which says so under the reason.
 */
export function changesSchemaFor(kind: JournalKind | undefined) {
  return kind && isCorrectable(kind) ? z.object(CORRECTABLE_FIELDS[kind]).partial() : z.object({});
}
