import { z } from 'zod';
import { roleSchema } from '../roles';

export const UNIT_SYSTEMS = ['metric', 'us'] as const;
export const unitSystemSchema = z.enum(UNIT_SYSTEMS);

/**
 * The request header naming the units the person reads ("metric" or "us"), so that a message
 * the server words ("Demijohn 4 holds 5.55 US gal …") reads in them. A display choice, like a
 * language: a missing or unknown value is worded in metric, never refused.
 */
export const UNITS_HEADER = 'Units-Shown';

function isTimeZone(value: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: value });
    return true;
  } catch {
    return false;
  }
}

export const timeZoneSchema = z.string().min(1).max(64).refine(isTimeZone, { message: 'must be an IANA time zone such as Europe/Berlin' });

export const cellarSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  unitSystem: unitSystemSchema,
  timeZone: z.string(),
  sanitisedValidDays: z.number().int(),
  headspaceWarnPercent: z.number(),
  annualLimitL: z.number().nullable(),
  /** Bottle and case labels open a public card for anyone who scans them. */
  publicBottleCards: z.boolean(),
  role: roleSchema,
});
export type Cellar = z.infer<typeof cellarSchema>;

export const cellarUpdateSchema = z
  .object({
    name: z.string().trim().min(1, 'give the cellar a name').max(80, 'at most 80 characters'),
    unitSystem: unitSystemSchema,
    timeZone: timeZoneSchema,
    sanitisedValidDays: z.number().int('whole days').min(1, 'at least 1 day').max(90, 'at most 90 days'),
    headspaceWarnPercent: z.number().min(0, 'cannot be negative').max(50, 'at most 50 %'),
    annualLimitL: z.number().min(0.01, 'at least 0.01 L').max(100000).nullable(),
    publicBottleCards: z.boolean(),
  })
  .partial();
export type CellarUpdate = z.infer<typeof cellarUpdateSchema>;

export const memberSchema = z.object({
  id: z.uuid(),
  userId: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  since: z.string(),
});
export type Member = z.infer<typeof memberSchema>;

export const memberRoleSchema = z.object({ role: roleSchema });
