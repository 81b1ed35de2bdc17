import { z } from 'zod';
import type { JournalKind } from '@shared/schemas/journal';
import { additionRequestSchema, noteRequestSchema, readingRequestSchema, tasteRequestSchema } from '@shared/schemas/journal';

export type AmendFieldType = 'number' | 'temperature' | 'text' | 'longtext' | 'date';
export interface AmendField {
  key: string;
  label: string;
  type: AmendFieldType;
}

/**
 * The fields a later correction may change, per entry kind (the server accepts these and no
 * others; volumes and vessel moves are corrected by a new operation instead).
 */
export const AMENDABLE_FIELDS: Partial<Record<JournalKind, AmendField[]>> = {
  reading: [
    { key: 'sg', label: 'Gravity (as read)', type: 'number' },
    { key: 'temperatureC', label: 'Sample temperature', type: 'temperature' },
    { key: 'ph', label: 'pH', type: 'number' },
  ],
  addition: [
    { key: 'name', label: 'What was added', type: 'text' },
    { key: 'amount', label: 'Amount', type: 'number' },
    { key: 'unit', label: 'Unit', type: 'text' },
    { key: 'removeOn', label: 'Take out on', type: 'date' },
  ],
  tasted: [
    { key: 'appearance', label: 'Appearance', type: 'longtext' },
    { key: 'aroma', label: 'Aroma', type: 'longtext' },
    { key: 'flavour', label: 'Flavour and finish', type: 'longtext' },
    { key: 'score', label: 'Score', type: 'number' },
  ],
  note: [{ key: 'text', label: 'Note', type: 'longtext' }],
};

/** The request schema whose rules a corrected field must still meet. */
const RULES: Partial<Record<JournalKind, z.ZodObject>> = {
  reading: readingRequestSchema,
  addition: additionRequestSchema,
  tasted: tasteRequestSchema,
  note: noteRequestSchema,
};

export const isAmendable = (kind: JournalKind): boolean => kind in AMENDABLE_FIELDS;

/** The schema for the `changes` of an amendment of this kind: the kind's own field rules, each optional. */
export function changesSchemaFor(kind: JournalKind) {
  const rules = RULES[kind];
  const keys = (AMENDABLE_FIELDS[kind] ?? []).map((f) => f.key);
  if (!rules) return z.object({});
  const shape = Object.fromEntries(keys.map((k) => [k, (rules.shape as Record<string, z.ZodType>)[k].optional()]));
  return z.object(shape);
}
