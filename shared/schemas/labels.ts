import { z } from 'zod';
import { labelCodeSchema, placeWordsSchema } from './vessels';

/** What a label can be printed for; each has its own layout in a template. */
export const LABEL_KINDS = ['vessel', 'case', 'lot'] as const;
export const labelKindSchema = z.enum(LABEL_KINDS);
export type LabelKind = z.infer<typeof labelKindSchema>;

/** A label template as the API lists it (the full layout stays on the server). */
export const labelTemplateSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  kind: z.enum(['sheet', 'roll']),
  /** Page (sheet) or one roll piece, in millimetres. */
  pageSize: z.object({ widthMm: z.number(), heightMm: z.number() }),
  labelSize: z.object({ widthMm: z.number(), heightMm: z.number() }),
  /** Labels across and down a sheet (1 × 1 for a roll). */
  grid: z.object({ columns: z.number().int(), rows: z.number().int() }),
  labelsPerPage: z.number().int(),
});
export type LabelTemplateSummary = z.infer<typeof labelTemplateSummarySchema>;

/** "id,id,id" in a query string → a list of ids (empty items ignored). */
const idList = z
  .string()
  .max(20000)
  .transform((s) =>
    s
      .split(',')
      .map((p) => p.trim())
      .filter(Boolean),
  )
  .pipe(z.array(z.uuid({ message: 'must be a list of ids (UUIDs) separated by commas' })).max(1000, 'at most 1000 at once'));

/** What to print: any mix of the selections; all of them are limited to the cellar. */
export const labelSelectionSchema = z.object({
  vessels: idList.optional(),
  cases: idList.optional(),
  /** Labels for the lots themselves (one per lot). */
  lots: idList.optional(),
  /** Everything on one shelf, by slot. */
  shelf: z.uuid().optional(),
  /** Every case of one lot. */
  lotCases: z.uuid().optional(),
  /** Every vessel holding one batch. */
  batch: z.uuid().optional(),
});
export type LabelSelection = z.output<typeof labelSelectionSchema>;

export const labelPdfQuerySchema = labelSelectionSchema.extend({
  template: z.string().trim().min(1, 'choose a label template').max(60),
  /** Labels already used on the first sheet. */
  skip: z.coerce.number().int('whole labels').min(0, 'cannot be negative').max(500).default(0),
  /** Answer as an attachment (download) instead of inline (preview). */
  download: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .default(false),
});
export type LabelPdfQuery = z.input<typeof labelPdfQuerySchema>;

/** Search text for the pickers on the Labels page. */
export const labelChoicesQuerySchema = z.object({ q: z.string().trim().max(80).optional() });

/** What the Labels page can offer to print. */
export const labelChoicesSchema = z.object({
  vessels: z.array(
    z.object({ id: z.uuid(), code: z.string(), name: z.string(), batchName: z.string().nullable(), place: placeWordsSchema.nullable() }),
  ),
  lots: z.array(
    z.object({
      id: z.uuid(),
      code: z.string(),
      batchName: z.string(),
      bottledOn: z.string(),
      bottleMl: z.number().int(),
      cases: z.array(z.object({ id: z.uuid(), code: z.string(), number: z.number().int(), bottlesLeft: z.number().int() })),
    }),
  ),
  batches: z.array(z.object({ id: z.uuid(), name: z.string(), vesselIds: z.array(z.uuid()) })),
});
export type LabelChoices = z.infer<typeof labelChoicesSchema>;

/** Racks and their shelves, for the rack → shelf pickers. */
export const shelfDirectorySchema = z.array(
  z.object({
    id: z.uuid(),
    name: z.string(),
    shelves: z.array(z.object({ id: z.uuid(), number: z.number().int(), slotCount: z.number().int(), used: z.number().int() })),
  }),
);
export type ShelfDirectory = z.infer<typeof shelfDirectorySchema>;

/** One thing on a shelf (or scanned), with the code on its label. */
export const shelfThingSchema = z.object({
  kind: z.enum(['vessel', 'case']),
  id: z.uuid(),
  code: z.string(),
  label: z.string(),
});
export type ShelfThing = z.infer<typeof shelfThingSchema>;

export const shelfInfoSchema = z.object({
  id: z.uuid(),
  number: z.number().int(),
  slotCount: z.number().int(),
  rackId: z.uuid(),
  rackName: z.string(),
});

/** What the record says sits on a shelf. */
export const shelfContentsSchema = z.object({
  shelf: shelfInfoSchema,
  items: z.array(shelfThingSchema.extend({ slot: z.number().int() })),
});
export type ShelfContents = z.infer<typeof shelfContentsSchema>;

/** The codes scanned on a shelf, "A,B,C". */
export const shelfCheckQuerySchema = z.object({
  codes: z
    .string()
    .max(5000)
    .default('')
    .transform((s) =>
      s
        .split(',')
        .map((p) => p.trim())
        .filter(Boolean),
    )
    .pipe(z.array(labelCodeSchema).max(200, 'at most 200 codes at once')),
});

/** A shelf check: what was expected, what was scanned, and the differences. */
export const shelfCheckSchema = z.object({
  shelf: shelfInfoSchema,
  /** Expected and scanned. */
  present: z.array(shelfThingSchema.extend({ slot: z.number().int() })),
  /** Expected but not scanned. */
  missing: z.array(shelfThingSchema.extend({ slot: z.number().int() })),
  /** Scanned here but recorded elsewhere (or nowhere). */
  misplaced: z.array(shelfThingSchema.extend({ recordedAt: placeWordsSchema.nullable(), version: z.number().int() })),
  /** Scanned codes that are not a vessel or case of this cellar. */
  unknown: z.array(z.string()),
  /** Free slots of this shelf, lowest first. */
  freeSlots: z.array(z.number().int()),
});
export type ShelfCheck = z.infer<typeof shelfCheckSchema>;
