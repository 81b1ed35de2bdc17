import { z } from 'zod';
import { DATE_RANGE_MESSAGE, yearInRange } from './value-ranges';
import { CARBONATION, CLOSURES } from './journal';
import { pageOf, slotRefSchema } from './vessels';

export const DEPARTURE_REASONS = ['drunk', 'gift', 'sold', 'competition', 'broken'] as const;
export const DEPARTURE_LABELS: Record<(typeof DEPARTURE_REASONS)[number], string> = {
  drunk: 'Drunk',
  gift: 'Given away',
  sold: 'Sold',
  competition: 'Sent to a competition',
  broken: 'Broken',
};

export const bottleCaseSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  lotId: z.uuid(),
  number: z.number().int(),
  bottlesInitial: z.number().int(),
  bottlesLeft: z.number().int(),
  place: slotRefSchema.nullable(),
  version: z.number().int(),
});
export type BottleCase = z.infer<typeof bottleCaseSchema>;

export const bottleLotSchema = z.object({
  id: z.uuid(),
  code: z.string(),
  batchId: z.uuid(),
  batchName: z.string(),
  batchKind: z.string(),
  bottledOn: z.string(),
  bottleMl: z.number().int(),
  bottleCount: z.number().int(),
  bottlesLeft: z.number().int(),
  closure: z.enum(CLOSURES),
  carbonation: z.enum(CARBONATION),
  sulfiteAdded: z.boolean(),
  abvEstimate: z.number().nullable(),
  note: z.string(),
  cases: z.array(bottleCaseSchema),
});
export type BottleLot = z.infer<typeof bottleLotSchema>;

export const drawDownRequestSchema = z.object({
  count: z.number().int('whole bottles').min(1, 'at least one bottle'),
  reason: z.enum(DEPARTURE_REASONS),
  note: z.string().max(300).default(''),
  /** When the bottles left (defaults to now): a departure is often written up later. */
  at: z.iso.datetime({ offset: true, message: 'a date and time' }).refine(yearInRange, DATE_RANGE_MESSAGE).optional(),
  expectedVersion: z.number().int().optional(),
});
export type DrawDownRequest = z.input<typeof drawDownRequestSchema>;

export const departureSchema = z.object({
  id: z.uuid(),
  caseId: z.uuid(),
  count: z.number().int(),
  reason: z.enum(DEPARTURE_REASONS),
  note: z.string(),
  occurredAt: z.string(),
  author: z.object({ id: z.uuid(), name: z.string() }),
});

export const lotListQuerySchema = z.object({
  q: z.string().trim().max(80).optional(),
  inStock: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});

// ---- Answers ----------------------------------------------------------------------------

/** What a bottling answers: the new lot, warnings about the batch, cautions for the bottles. */
export const bottlingResultSchema = z.object({
  lot: bottleLotSchema,
  warnings: z.array(z.string()),
  cautions: z.array(z.string()),
});
export type BottlingResult = z.infer<typeof bottlingResultSchema>;

/** A case with a short summary of its lot (enough to find the lot again). */
export const caseDetailSchema = bottleCaseSchema.extend({
  lot: z.object({ id: z.uuid(), batchName: z.string() }).loose(),
});
export type CaseDetail = z.infer<typeof caseDetailSchema>;

export const lotPageSchema = pageOf(bottleLotSchema);
export type LotPage = z.infer<typeof lotPageSchema>;

/** A lot with its departures, newest first, for the lot page. */
export const lotDetailSchema = bottleLotSchema.extend({ departures: z.array(departureSchema) });
export type LotDetail = z.infer<typeof lotDetailSchema>;
