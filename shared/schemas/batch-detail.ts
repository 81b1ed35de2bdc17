import { z } from 'zod';
import { batchReadingSchema, batchSummarySchema, batchVesselSchema, ingredientSchema, sweetnessSchema } from './batches';
import { journalEntrySchema } from './journal';

/** Everything the Batch page shows; figures (ABV, state…) are computed from it with shared/calc. */
export const batchDetailSchema = batchSummarySchema.extend({
  ingredients: z.array(ingredientSchema),
  yeastName: z.string(),
  plannedVolumeL: z.number(),
  targetSweetness: sweetnessSchema.nullable(),
  notes: z.string(),
  vessels: z.array(batchVesselSchema),
  /** Readings oldest first, with amendments applied. */
  readings: z.array(batchReadingSchema),
  /** Newest first. */
  journal: z.array(journalEntrySchema),
  parents: z.array(z.object({ id: z.uuid(), name: z.string(), volumeL: z.number() })),
  children: z.array(z.object({ id: z.uuid(), name: z.string() })),
  lots: z.array(
    z.object({
      id: z.uuid(),
      code: z.string(),
      bottledOn: z.string(),
      bottleMl: z.number().int(),
      bottleCount: z.number().int(),
      bottlesLeft: z.number().int(),
    }),
  ),
  /** For a split or blend: when it became a batch of its own (its age still counts from the must's start). */
  ownSince: z.string().nullable().optional(),
  /** Oak or other additions still in, with their planned removal date. */
  additionsIn: z.array(z.object({ entryId: z.uuid(), name: z.string(), category: z.string(), removeOn: z.string().nullable() })),
});
export type BatchDetail = z.infer<typeof batchDetailSchema>;

/** What every batch operation answers: the batch as it is now, and warnings to show. */
export const operationResultSchema = z.object({
  batch: batchDetailSchema,
  entryId: z.uuid().nullable(),
  warnings: z.array(z.string()),
});
export type OperationResult = z.infer<typeof operationResultSchema>;
