import { z } from 'zod';
import { MIN_LITRES, MIN_LITRES_MESSAGE } from './value-ranges';

export const VESSEL_KINDS = ['carboy', 'demijohn', 'jug', 'bucket', 'keg', 'barrel', 'tank', 'other'] as const;
export const VESSEL_MATERIALS = ['glass', 'plastic', 'stainless', 'oak', 'ceramic', 'other'] as const;
/** What a vessel is doing now. `sanitised` lapses to `clean` after the cellar's set days. */
export const VESSEL_STATES = ['holding', 'dirty', 'clean', 'sanitised', 'retired'] as const;
/** States a Hand can set on an empty vessel. */
export const CLEANING_STATES = ['dirty', 'clean', 'sanitised'] as const;

export const vesselKindSchema = z.enum(VESSEL_KINDS);
export const vesselMaterialSchema = z.enum(VESSEL_MATERIALS);
export const vesselStateSchema = z.enum(VESSEL_STATES);
export const cleaningStateSchema = z.enum(CLEANING_STATES);
export type VesselKind = z.infer<typeof vesselKindSchema>;
export type VesselState = z.infer<typeof vesselStateSchema>;
export type CleaningState = z.infer<typeof cleaningStateSchema>;

/** Label codes: 8 characters from 32 that cannot be mistaken for each other (40 bits). */
export const CODE_ALPHABET = '23456789ABCDEFGHJKLMNPQRSTUVWXYZ';
export const CODE_LENGTH = 8;
export const labelCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[2-9A-HJ-NP-Z]{8}$/, 'a label code is 8 letters and digits');

export const slotRefSchema = z.object({
  rackId: z.uuid(),
  rackName: z.string(),
  shelfId: z.uuid(),
  shelfNumber: z.number().int(),
  slot: z.number().int(),
});
export type SlotRef = z.infer<typeof slotRefSchema>;

/** Where a thing sits, as a screen words it (the client's placeText): data, so the wording lives in one place. */
export const placeWordsSchema = slotRefSchema.pick({ rackName: true, shelfNumber: true, slot: true });

export const vesselSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  name: z.string(),
  kind: vesselKindSchema,
  material: vesselMaterialSchema,
  capacityL: z.number(),
  state: vesselStateSchema,
  /** When it was last sanitised (meaningful while empty). */
  sanitisedAt: z.string().nullable(),
  batch: z
    // `stage` decides whether headspace is warned about (shared/domain/headspace-rule.ts).
    .object({ id: z.uuid(), name: z.string(), kind: z.string(), stage: z.string().optional() })
    .nullable(),
  volumeL: z.number().nullable(),
  filledAt: z.string().nullable(),
  place: slotRefSchema.nullable(),
  notes: z.string(),
  version: z.number().int(),
});
export type Vessel = z.infer<typeof vesselSchema>;

const name = z.string().trim().min(1, 'give it a name').max(60, 'at most 60 characters');
const capacity = z.number({ message: 'enter the capacity in litres' }).min(MIN_LITRES, MIN_LITRES_MESSAGE).max(20000, 'at most 20 000 L');

export const vesselCreateSchema = z.object({
  name,
  kind: vesselKindSchema,
  material: vesselMaterialSchema,
  capacityL: capacity,
  state: cleaningStateSchema.default('dirty'),
  notes: z.string().max(500).default(''),
});
export type VesselCreate = z.input<typeof vesselCreateSchema>;

export const vesselUpdateSchema = z.object({
  name: name.optional(),
  kind: vesselKindSchema.optional(),
  material: vesselMaterialSchema.optional(),
  capacityL: capacity.optional(),
  notes: z.string().max(500).optional(),
  expectedVersion: z.number().int().optional(),
});

export const vesselCleaningSchema = z.object({
  state: cleaningStateSchema,
  expectedVersion: z.number().int().optional(),
});

export const vesselRetireSchema = z.object({
  retired: z.boolean(),
  expectedVersion: z.number().int().optional(),
});

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

export const vesselListQuerySchema = z.object({
  q: z.string().trim().max(60).optional(),
  state: vesselStateSchema.optional(),
  /** Empty, sanitised (not lapsed) and not retired. */
  freeAndSanitised: booleanQuery.optional(),
  minCapacityL: z.coerce.number().min(0).max(20000).optional(),
  /** Exactly this capacity (Today's size tiles). */
  capacityL: z.coerce.number().min(0).max(20000).optional(),
  rackId: z.uuid().optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});
export type VesselListQuery = z.input<typeof vesselListQuerySchema>;

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({ items: z.array(item), total: z.number().int(), page: z.number().int(), pageSize: z.number().int() });
}
export const vesselPageSchema = pageOf(vesselSchema);

/** The Vessel page: the vessel, and what the batch in it looks like now. */
export const vesselDetailSchema = vesselSchema.extend({
  headspace: z.object({ litres: z.number(), percent: z.number() }).nullable(),
  batchStartedOn: z.string().nullable(),
  /** The batch's original gravity (the reading form's ABV so far). */
  batchOg: z.number().nullable(),
  lastReading: z.object({ sg: z.number(), correctedSg: z.number(), at: z.string() }).nullable(),
  sanitisedUntil: z.string().nullable(),
});
export type VesselDetail = z.infer<typeof vesselDetailSchema>;

/** The best free sanitised vessel for a racking, as proposed by the rack-out dialog. */
export const rackTargetSuggestionSchema = z.object({
  suggestion: vesselSchema.nullable(),
  expectedLossL: z.number(),
  volumeAfterLossL: z.number(),
});

export const rackTargetQuerySchema = z.object({
  volumeL: z.coerce.number().min(MIN_LITRES, MIN_LITRES_MESSAGE).max(20000, 'at most 20 000 L'),
  stage: z.enum(['primary', 'secondary', 'ageing']).default('secondary'),
  exclude: z.string().optional(),
});
