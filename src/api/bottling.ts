import { bottlingResultSchema, type BottlingResult } from '@shared/schemas/bottles';
import type { BottleRequest } from '@shared/schemas/journal';
import { ApiError, request, cellarPath } from './http';

export { bottlingResultSchema, type BottlingResult };

/** What the server says when the fermentation does not look finished (409 confirmation_required). */
export interface BottlingConfirmation {
  message: string;
  state: string | null;
  caution: string | null;
}

/** Bottles a batch into a lot of cases. */
export const bottleBatch = (cellarId: string, batchId: string, body: BottleRequest): Promise<BottlingResult> =>
  request('POST', cellarPath(cellarId, 'batches', batchId, 'bottlings'), bottlingResultSchema, body);

/** The confirmation the server asks for before bottling an unfinished fermentation, or null for any other error. */
export function confirmationRequired(err: unknown): BottlingConfirmation | null {
  if (!(err instanceof ApiError) || err.status !== 409 || err.code !== 'confirmation_required') return null;
  const text = (key: string) => (typeof err.body[key] === 'string' ? (err.body[key] as string) : null);
  return { message: err.message, state: text('state'), caution: text('caution') };
}
