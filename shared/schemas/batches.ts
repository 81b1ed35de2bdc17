import { z } from 'zod';
import { DATE_RANGE_MESSAGE, MIN_LITRES, MIN_LITRES_MESSAGE, yearInRange } from './value-ranges';
import { slotRefSchema } from './vessels';

export const BATCH_KINDS = [
  'traditional-mead',
  'melomel',
  'metheglin',
  'cyser',
  'pyment',
  'braggot',
  'bochet',
  'fruit-wine',
  'cider',
  'perry',
  'other',
] as const;
export const BATCH_KIND_LABELS: Record<(typeof BATCH_KINDS)[number], string> = {
  'traditional-mead': 'Traditional mead',
  melomel: 'Melomel (fruit mead)',
  metheglin: 'Metheglin (spiced mead)',
  cyser: 'Cyser (apple mead)',
  pyment: 'Pyment (grape mead)',
  braggot: 'Braggot (malt mead)',
  bochet: 'Bochet (caramelised honey)',
  'fruit-wine': 'Fruit wine',
  cider: 'Cider',
  perry: 'Perry',
  other: 'Other',
};

/** Derived from the journal (see shared/journal/stage.ts). */
export const STAGES = ['primary', 'secondary', 'bulk-ageing', 'bottled', 'finished'] as const;
export const STAGE_LABELS: Record<(typeof STAGES)[number], string> = {
  primary: 'Primary',
  secondary: 'Secondary',
  'bulk-ageing': 'Bulk ageing',
  bottled: 'Bottled',
  finished: 'Finished',
};
export const SWEETNESS_LEVELS = ['dry', 'semi-sweet', 'sweet'] as const;
export const INGREDIENT_CATEGORIES = ['honey', 'fruit', 'juice', 'sugar', 'water', 'nutrient', 'spice', 'malt', 'other'] as const;

export const batchKindSchema = z.enum(BATCH_KINDS);
export const stageSchema = z.enum(STAGES);
export const sweetnessSchema = z.enum(SWEETNESS_LEVELS);
export type BatchKind = z.infer<typeof batchKindSchema>;
export type Stage = z.infer<typeof stageSchema>;

/** A gravity a hydrometer can show for a must, wine or mead. */
export const gravitySchema = z
  .number({ message: 'enter a gravity such as 1.105' })
  .min(0.98, 'a gravity is at least 0.980')
  .max(1.2, 'a gravity is at most 1.200');

export const isoDateSchema = z.iso.date({ message: 'a date like 2026-03-14', abort: true }).refine(yearInRange, DATE_RANGE_MESSAGE);

export const ingredientSchema = z.object({
  category: z.enum(INGREDIENT_CATEGORIES),
  name: z.string().trim().min(1, 'name the ingredient').max(80),
  amount: z.number().positive('must be more than 0').max(100000),
  unit: z.string().trim().min(1).max(12),
});
export type Ingredient = z.infer<typeof ingredientSchema>;

export const yeastSchema = z.object({
  name: z.string().trim().min(1, 'name the yeast').max(80),
  toleranceAbv: z.number().min(3, 'at least 3 %').max(22, 'at most 22 %'),
});

const fillSchema = z.object({
  vesselId: z.uuid(),
  volumeL: z.number().min(MIN_LITRES, MIN_LITRES_MESSAGE).max(20000),
  expectedVersion: z.number().int().optional(),
});

/** Lets a Hand fill a vessel that is not sanitised (or lapsed); the reason is journalled. */
export const overrideSchema = z.object({ reason: z.string().trim().min(3, 'say why').max(200) });

export const batchStartSchema = z.object({
  name: z.string().trim().min(1, 'give the batch a name').max(80, 'at most 80 characters'),
  kind: batchKindSchema,
  ingredients: z.array(ingredientSchema).max(30).default([]),
  yeast: yeastSchema,
  plannedVolumeL: z.number().min(MIN_LITRES, MIN_LITRES_MESSAGE).max(20000),
  startedOn: isoDateSchema,
  og: gravitySchema.nullable().default(null),
  targetSweetness: sweetnessSchema.nullable().default(null),
  notes: z.string().max(2000).default(''),
  vessels: z.array(fillSchema).min(1, 'choose at least one vessel').max(20),
  override: overrideSchema.optional(),
});
export type BatchStart = z.input<typeof batchStartSchema>;

export const batchUpdateSchema = z.object({
  name: z.string().trim().min(1).max(80).optional(),
  targetSweetness: sweetnessSchema.nullable().optional(),
  notes: z.string().max(2000).optional(),
});

const booleanQuery = z.enum(['true', 'false']).transform((v) => v === 'true');

export const batchListQuerySchema = z.object({
  q: z.string().trim().max(80).optional(),
  stage: stageSchema.optional(),
  kind: batchKindSchema.optional(),
  /** Started at least this many months ago. */
  agedMonths: z.coerce.number().int().min(1).max(240).optional(),
  needsRacking: booleanQuery.optional(),
  sort: z.enum(['started-desc', 'started-asc', 'name']).default('started-desc'),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type BatchListQuery = z.input<typeof batchListQuerySchema>;

export const batchSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  kind: batchKindSchema,
  stage: stageSchema,
  startedOn: z.string(),
  og: z.number().nullable(),
  volumeL: z.number(),
  vesselCount: z.number().int(),
  lastReading: z.object({ sg: z.number(), at: z.string() }).nullable(),
  lastRackedAt: z.string().nullable(),
  needsRacking: z.boolean(),
  yeastToleranceAbv: z.number(),
  /** Where the batch is: each vessel holding it and the rack slot it stands in (lists only). */
  whereabouts: z.array(z.object({ vesselName: z.string(), place: slotRefSchema.nullable() })).optional(),
});
export type BatchSummary = z.infer<typeof batchSummarySchema>;

export const batchPageSchema = z.object({
  items: z.array(batchSummarySchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

export const batchVesselSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  name: z.string(),
  capacityL: z.number(),
  volumeL: z.number(),
  filledAt: z.string(),
  place: slotRefSchema.nullable(),
  version: z.number().int(),
});

export const batchReadingSchema = z.object({
  entryId: z.uuid(),
  at: z.string(),
  sg: z.number(),
  correctedSg: z.number(),
  temperatureC: z.number().nullable(),
  ph: z.number().nullable(),
  /** Set on a split's readings taken in the batch it came from, before the split. */
  inheritedFrom: z.object({ batchId: z.uuid(), name: z.string() }).optional(),
});
export type BatchReading = z.infer<typeof batchReadingSchema>;
