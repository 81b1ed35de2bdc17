import type { core } from 'zod';
import type { ApiError } from '@/api/http';

/**
 * What a failed check or request means for an operation dialog: which field a message goes
 * under, in plain words, and which failures the dialog answers itself.
 */

/** A field path as the client keys its messages: `to.0.volumeL`. */
export function fieldKey(path: string): string {
  return path.replace(/^body\./, '').replace(/\[(\d+)\]/g, '.$1');
}

/**
 * The schema's own words where it has them; plain ones instead of zod's defaults
 * ("Invalid input: expected number, received null") for empty fields and unchosen options.
 */
export function friendlyMessage(issue: core.$ZodIssue): string {
  if (!issue.message.startsWith('Invalid')) return issue.message;
  if (issue.code === 'invalid_type') return issue.expected === 'number' ? 'enter a number' : 'fill this in';
  if (issue.code === 'invalid_format' && issue.format === 'uuid') return 'choose one';
  if (issue.code === 'invalid_value') return 'choose one of the options';
  return issue.message;
}

/** The server refused to fill a vessel that is not (or no longer) sanitised; a Hand may override with a reason. */
export function isSanitiseRefusal(err: ApiError | null): boolean {
  return !!err && err.status === 409 && err.body.overrideAllowed === true;
}

/** Someone else changed the batch or a vessel in the meantime: the message says what; reloading helps. */
export function isStale(err: ApiError | null): boolean {
  return !!err && err.status === 409 && !isSanitiseRefusal(err) && err.code !== 'confirmation_required';
}
