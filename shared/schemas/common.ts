import { z } from 'zod';

export const uuidSchema = z.uuid({ message: 'must be an id (UUID)' });

/** The JSON body of every error answer from the API. */
export const apiErrorSchema = z.object({
  error: z.string(),
  message: z.string(),
  issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;

export const healthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.enum(['up', 'down']),
});
export type Health = z.infer<typeof healthSchema>;
