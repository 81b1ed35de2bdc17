import { z } from 'zod';
import { CARBONATION, CLOSURES } from './journal';
import { slotRefSchema } from './vessels';

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
  inStock: z.enum(['true', 'false']).transform((v) => v === 'true').optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
