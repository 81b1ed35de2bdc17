import { z } from 'zod';
import { bottleLotSchema } from '@shared/schemas/bottles';
import type { BottleRequest } from '@shared/schemas/journal';
import { ApiError, request } from './http';

export const bottlingResultSchema = z.object({
  lot: bottleLotSchema,
  warnings: z.array(z.string()),
  cautions: z.array(z.string()),
});
export type BottlingResult = z.infer<typeof bottlingResultSchema>;

/** What the server says when the fermentation does not look finished (409 confirmation_required). */
export interface BottlingConfirmation {
  message: string;
  state: string | null;
  caution: string | null;
}

/** Bottles a batch into a lot of cases. */
export const bottleBatch = (cellarId: string, batchId: string, body: BottleRequest): Promise<BottlingResult> =>
  request(
    'POST',
    `/api/cellars/${encodeURIComponent(cellarId)}/batches/${encodeURIComponent(batchId)}/bottlings`,
    bottlingResultSchema,
    body,
  );

/** The confirmation the server asks for before bottling an unfinished fermentation, or null for any other error. */
export function confirmationRequired(err: unknown): BottlingConfirmation | null {
  if (!(err instanceof ApiError) || err.status !== 409 || err.code !== 'confirmation_required') return null;
  const text = (key: string) => (typeof err.body[key] === 'string' ? (err.body[key] as string) : null);
  return { message: err.message, state: text('state'), caution: text('caution') };
}
