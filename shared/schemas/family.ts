import { z } from 'zod';
import { batchDetailSchema } from './batch-detail';

/** The most members a family shows: a parent, its splits and blends rarely come to more. */
export const FAMILY_MEMBERS_MAX = 12;

/**
 * A family of batches for side-by-side comparison: the batch asked for, its parents and
 * children, theirs in turn (splits and blends), each as the Batch page reads it.
 */
export const batchFamilySchema = z.object({
  /** The batch the family was asked for. */
  batchId: z.uuid(),
  /** Oldest start first; the batch asked for is among them. */
  members: z.array(batchDetailSchema),
  /** More batches are related than FAMILY_MEMBERS_MAX; the nearest are shown. */
  truncated: z.boolean(),
});
export type BatchFamily = z.infer<typeof batchFamilySchema>;
