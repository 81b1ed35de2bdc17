import { z } from 'zod';
import { TASTING_POINTS_MAX, TASTING_POINTS_MIN } from '../domain/tasting-scale';
import { batchKindSchema, batchReadingSchema, gravitySchema, isoDateSchema, stageSchema } from './batches';
import { DATE_RANGE_MESSAGE, MIN_LITRES, MIN_LITRES_MESSAGE, yearInRange } from './value-ranges';

/** A vessel as the journal remembers it (names can change later). */
const vesselVolume = z.object({ vesselId: z.uuid(), vesselName: z.string(), volumeL: z.number() });

export const ADDITION_CATEGORIES = ['fruit', 'oak', 'spice', 'nutrient', 'stabiliser', 'sweetener', 'fining', 'acid', 'tannin', 'other'] as const;
export const additionCategorySchema = z.enum(ADDITION_CATEGORIES);

/** Tasting scores are points of Cellarwright's own scale, each with a word (shared/domain/tasting-scale.ts). */
export const TASTING_SCORE_MIN = TASTING_POINTS_MIN;
export const TASTING_SCORE_MAX = TASTING_POINTS_MAX;

/** What a vessel was topped up with: it decides how gravity and strength follow (shared/domain/top-up-figures.ts). */
export const TOP_UP_LIQUIDS = ['water', 'sugar-water', 'honey-water', 'same-batch', 'other-wine'] as const;
export const topUpLiquidSchema = z.object({
  kind: z.enum(TOP_UP_LIQUIDS),
  /** Its specific gravity, if known (water is 1.000). */
  sg: gravitySchema.nullable().default(null),
  /** For another wine or mead: its % ABV, if known. */
  abv: z.number().min(0, 'at least 0 %').max(25, 'at most 25 %').nullable().default(null),
});
export type TopUpLiquid = z.infer<typeof topUpLiquidSchema>;

/** Why a vessel was poured out (an emptying); 'other' says why in its note. */
export const EMPTYING_REASONS = ['spoiled', 'spilled', 'drunk', 'other'] as const;
export const emptyingReasonSchema = z.enum(EMPTYING_REASONS);
export type EmptyingReason = z.infer<typeof emptyingReasonSchema>;

/**
 * Every kind of journal entry and what it records. One discriminated union, stored as the
 * entry's payload and read by the client; entries are never changed after they are written.
 */
export const journalPayloadSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('started'),
    volumeL: z.number(),
    og: z.number().nullable(),
    vessels: z.array(vesselVolume),
    parents: z.array(z.object({ batchId: z.uuid(), name: z.string(), volumeL: z.number() })).default([]),
    override: z.string().nullable().default(null),
  }),
  z.object({
    kind: z.literal('reading'),
    sg: z.number(),
    temperatureC: z.number().nullable(),
    calibrationC: z.number(),
    correctedSg: z.number(),
    ph: z.number().nullable(),
    vesselId: z.uuid().nullable(),
  }),
  z.object({
    kind: z.literal('racked'),
    from: z.array(vesselVolume),
    to: z.array(vesselVolume),
    lossL: z.number(),
    override: z.string().nullable().default(null),
  }),
  z.object({
    kind: z.literal('addition'),
    category: additionCategorySchema,
    name: z.string(),
    amount: z.number(),
    unit: z.string(),
    vesselId: z.uuid().nullable(),
    /** For oak and other things that come out again. */
    removeOn: z.string().nullable(),
  }),
  z.object({ kind: z.literal('removed'), additionEntryId: z.uuid(), name: z.string() }),
  z.object({
    kind: z.literal('topped-up'),
    vesselId: z.uuid(),
    vesselName: z.string(),
    volumeL: z.number(),
    with: z.string(),
    // Entries written before the liquid was asked for have neither.
    liquid: topUpLiquidSchema.optional(),
    /** Litres of the batch before the top-up, for the mixing rule. */
    batchVolumeBeforeL: z.number().optional(),
  }),
  z.object({ kind: z.literal('degassed'), vesselId: z.uuid().nullable(), note: z.string() }),
  z.object({
    kind: z.literal('tasted'),
    appearance: z.string(),
    aroma: z.string(),
    flavour: z.string(),
    score: z.number().nullable(),
  }),
  z.object({ kind: z.literal('note'), text: z.string() }),
  z.object({ kind: z.literal('photo'), photoId: z.uuid(), caption: z.string() }),
  z.object({
    kind: z.literal('bottled'),
    lotId: z.uuid(),
    lotCode: z.string(),
    bottleCount: z.number().int(),
    bottleMl: z.number().int(),
    caseCount: z.number().int(),
    from: z.array(vesselVolume),
    lossL: z.number(),
    confirmedNotFinished: z.boolean(),
  }),
  z.object({ kind: z.literal('split'), childBatchId: z.uuid(), childName: z.string(), vessels: z.array(vesselVolume) }),
  z.object({ kind: z.literal('blended'), childBatchId: z.uuid(), childName: z.string(), volumeL: z.number() }),
  /** A vessel poured out (spoiled, spilled, drunk): the liquid leaves the batch, the vessel is left dirty. */
  z.object({
    kind: z.literal('emptied'),
    vesselId: z.uuid(),
    vesselName: z.string(),
    volumeL: z.number(),
    reason: emptyingReasonSchema,
    note: z.string().default(''),
  }),
  z.object({
    kind: z.literal('amendment'),
    reason: z.string(),
    /** The corrected fields of the amended entry (same names as in its payload). */
    changes: z.record(z.string(), z.unknown()),
  }),
]);
export type JournalPayload = z.infer<typeof journalPayloadSchema>;
export type JournalKind = JournalPayload['kind'];

export const journalEntrySchema = z.object({
  id: z.uuid(),
  batchId: z.uuid(),
  occurredAt: z.string(),
  recordedAt: z.string(),
  author: z.object({ id: z.uuid(), name: z.string() }),
  amendsEntryId: z.uuid().nullable(),
  /** Set when a later entry amends this one. */
  amendedBy: z.array(z.uuid()),
  payload: journalPayloadSchema,
});
export type JournalEntry = z.infer<typeof journalEntrySchema>;

// ---- Requests that write journal entries -------------------------------------------------

const when = z.iso.datetime({ offset: true, message: 'a date and time' }).refine(yearInRange, DATE_RANGE_MESSAGE).optional();
const vesselRef = z.object({ vesselId: z.uuid(), expectedVersion: z.number().int().optional() });
const vesselFill = vesselRef.extend({ volumeL: z.number().min(MIN_LITRES, MIN_LITRES_MESSAGE).max(20000) });

export const readingRequestSchema = z.object({
  sg: gravitySchema,
  temperatureC: z.number().min(0, 'at least 0 °C').max(40, 'at most 40 °C').nullable().default(null),
  calibrationC: z.union([z.literal(20), z.literal(15.56)]).default(20),
  ph: z.number().min(2.5, 'pH is at least 2.5').max(4.5, 'pH is at most 4.5').nullable().default(null),
  vesselId: z.uuid().nullable().default(null),
  at: when,
});
export type ReadingRequest = z.input<typeof readingRequestSchema>;

/**
 * What logging a reading answers: the reading as recorded (corrected to the hydrometer's
 * calibration) and the batch's stage after it — what the Vessel page shows, without the whole
 * batch. The Batch page, which shows the whole journal, reads its batch again.
 */
export const readingResultSchema = z.object({
  entryId: z.uuid(),
  reading: batchReadingSchema,
  stage: stageSchema,
  warnings: z.array(z.string()),
});
export type ReadingResult = z.infer<typeof readingResultSchema>;

export const rackRequestSchema = z.object({
  /** Sources are emptied completely and become dirty. */
  from: z.array(vesselRef).min(1, 'choose the vessel(s) to rack from'),
  to: z.array(vesselFill).min(1, 'choose the vessel(s) to rack into'),
  override: z.object({ reason: z.string().trim().min(3, 'say why').max(200) }).optional(),
  at: when,
});
export type RackRequest = z.input<typeof rackRequestSchema>;

export const splitRequestSchema = z.object({
  vessels: z.array(vesselRef).min(1, 'choose the vessel(s) that become the new batch'),
  name: z.string().trim().min(1, 'name the new batch').max(80),
  kind: batchKindSchema,
  at: when,
});

export const blendRequestSchema = z.object({
  from: z.array(vesselRef).min(2, 'choose vessels of at least two batches'),
  to: z.array(vesselFill).min(1, 'choose the vessel(s) to blend into'),
  name: z.string().trim().min(1, 'name the blend').max(80),
  kind: batchKindSchema,
  override: z.object({ reason: z.string().trim().min(3, 'say why').max(200) }).optional(),
  at: when,
});

export const additionRequestSchema = z.object({
  category: additionCategorySchema,
  name: z.string().trim().min(1, 'what was added?').max(80),
  amount: z.number().positive('must be more than 0').max(100000),
  unit: z.string().trim().min(1, 'unit').max(12),
  vesselId: z.uuid().nullable().default(null),
  removeOn: isoDateSchema.nullable().default(null),
  at: when,
});
export type AdditionRequest = z.input<typeof additionRequestSchema>;

export const removalRequestSchema = z.object({ additionEntryId: z.uuid(), at: when });

export const topUpRequestSchema = vesselFill.extend({
  with: z.string().trim().min(1, 'what did you top up with?').max(80),
  liquid: topUpLiquidSchema.optional(),
  at: when,
});

export const degasRequestSchema = z.object({ vesselId: z.uuid().nullable().default(null), note: z.string().max(500).default(''), at: when });

export const tasteRequestSchema = z.object({
  appearance: z.string().max(500).default(''),
  aroma: z.string().max(500).default(''),
  flavour: z.string().max(1000).default(''),
  score: z
    .number()
    .int('a whole point of the scale')
    .min(TASTING_SCORE_MIN, `at least ${TASTING_SCORE_MIN}`)
    .max(TASTING_SCORE_MAX, `at most ${TASTING_SCORE_MAX}`)
    .nullable()
    .default(null),
  at: when,
});

export const noteRequestSchema = z.object({ text: z.string().trim().min(1, 'write something').max(4000), at: when });

export const amendRequestSchema = z.object({
  reason: z.string().trim().min(3, 'say what was wrong').max(300),
  changes: z.record(z.string(), z.unknown()),
});

export const CLOSURES = ['cork', 'synthetic-cork', 'screw-cap', 'crown-cap', 'swing-top'] as const;
export const CARBONATION = ['still', 'sparkling'] as const;

export const bottleRequestSchema = z.object({
  from: z.array(vesselRef).min(1, 'choose the vessel(s) to bottle from'),
  bottleMl: z.number().int().min(50, 'at least 50 mL').max(5000, 'at most 5000 mL'),
  bottleCount: z.number().int('whole bottles').min(1, 'bottle at least one bottle').max(10000),
  perCase: z.number().int().min(1, 'at least 1 per case').max(48, 'at most 48 per case').default(12),
  closure: z.enum(CLOSURES),
  carbonation: z.enum(CARBONATION),
  sulfiteAdded: z.boolean(),
  bottledOn: isoDateSchema,
  note: z.string().max(500).default(''),
  /** Required when the fermentation does not look finished. */
  confirmNotFinished: z.boolean().default(false),
});
export type BottleRequest = z.input<typeof bottleRequestSchema>;
