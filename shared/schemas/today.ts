import { z } from 'zod';
import { batchKindSchema, batchSummarySchema, stageSchema } from './batches';

export const fermentationStateSchema = z.enum(['active', 'slowing', 'finished', 'stuck']);

/** The Today screen: what needs a hand now, in one answer. */
export const todaySchema = z.object({
  /** Batches still fermenting (primary or secondary), with their state from shared/calc. */
  ferments: z.array(
    z.object({
      id: z.uuid(),
      name: z.string(),
      kind: batchKindSchema,
      stage: stageSchema,
      startedOn: z.string(),
      og: z.number().nullable(),
      lastReading: z.object({ sg: z.number(), at: z.string() }).nullable(),
      /** null when there is no original gravity to judge by. */
      state: fermentationStateSchema.nullable(),
      vesselNames: z.array(z.string()),
    }),
  ),
  needsRacking: z.array(batchSummarySchema),
  /** Oak and other additions due to come out within a week, or overdue. */
  additionsDue: z.array(
    z.object({ batchId: z.uuid(), batchName: z.string(), entryId: z.uuid(), name: z.string(), removeOn: z.string(), overdue: z.boolean() }),
  ),
  /** Free, sanitised (not lapsed) vessels, counted by capacity. */
  freeSanitised: z.array(z.object({ capacityL: z.number(), count: z.number().int() })),
  bottles: z.object({ lots: z.number().int(), bottlesLeft: z.number().int() }),
});
export type Today = z.infer<typeof todaySchema>;
