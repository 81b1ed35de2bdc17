import { z } from 'zod';
import { EMPTYING_REASONS, emptyingReasonSchema, type EmptyingReason } from './journal';
import { DATE_RANGE_MESSAGE, yearInRange } from './value-ranges';

export const EMPTYING_REASON_LABELS: Record<EmptyingReason, string> = {
  spoiled: 'Spoiled',
  spilled: 'Spilled or leaked',
  drunk: 'Drunk or tasted it all',
  other: 'Other',
};

/** The emptying reasons in the order a form offers them ('other' asks for the note). */
export const EMPTYING_REASON_OPTIONS = EMPTYING_REASONS.map((value) => ({
  value,
  label: value === 'other' ? 'Other (say why in the note)' : EMPTYING_REASON_LABELS[value],
}));

/**
 * Emptying a vessel: everything in it leaves the batch (poured away, spilled, drunk), the
 * vessel is left dirty. A reason always; for 'other' the note says it.
 */
export const emptyVesselRequestSchema = z
  .object({
    reason: emptyingReasonSchema,
    note: z.string().trim().max(300, 'at most 300 characters').default(''),
    /** When it was poured out (defaults to now; never in the future, never before the batch began). */
    at: z.iso.datetime({ offset: true, message: 'a date and time' }).refine(yearInRange, DATE_RANGE_MESSAGE).optional(),
    expectedVersion: z.number().int().optional(),
  })
  .refine((r) => r.reason !== 'other' || r.note.length > 0, { path: ['note'], message: 'say why it was emptied' });
export type EmptyVesselRequest = z.input<typeof emptyVesselRequestSchema>;
