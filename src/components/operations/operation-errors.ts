import type { ApiError } from '@/api/http';

/** The server refused to fill a vessel that is not (or no longer) sanitised; a Hand may override with a reason. */
export function isSanitiseRefusal(err: ApiError | null): boolean {
  return !!err && err.status === 409 && err.body.overrideAllowed === true;
}

/** Someone else changed the batch or a vessel in the meantime: the message says what; reloading helps. */
export function isStale(err: ApiError | null): boolean {
  return !!err && err.status === 409 && !isSanitiseRefusal(err) && err.code !== 'confirmation_required';
}
