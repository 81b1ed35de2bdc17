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

/** "plannedVolumeL" → "Planned volume", "vessels.0.volumeL" → "Volume": a field's name in words. */
export function fieldWords(path: string): string {
  const last =
    fieldKey(path)
      .split('.')
      .filter((part) => !/^\d+$/.test(part))
      .pop() ?? '';
  const words = last
    .replace(/(L|C|Ml|Abv|Id)$/, '')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .trim();
  const plain: Record<string, string> = { og: 'original gravity', sg: 'gravity', ph: 'pH', 'started on': 'start date', 'remove on': 'take-out date' };
  const text = plain[words] ?? words;
  return text ? text.charAt(0).toUpperCase() + text.slice(1) : 'A value';
}

/**
 * A message from the server in plain words: zod's stock phrases ("Too small: expected number
 * to be >=0") said as a person would, and the request path in front of it ("body.startedOn: …")
 * replaced by the field's name, or by `label` when the form knows it.
 */
export function plainMessage(message: string, label?: string): string {
  const prefixed = /^(?:body|query|params)\.([\w.[\]]+): (.*)$/s.exec(message);
  const [path, text] = prefixed ? [prefixed[1], prefixed[2]] : ['', message];
  const said = text
    .replace(/^Too small: expected number to be >=?\s*(-?[\d.]+)$/, 'must be at least $1')
    .replace(/^Too small: expected number to be >\s*(-?[\d.]+)$/, 'must be more than $1')
    .replace(/^Too big: expected number to be <=?\s*(-?[\d.]+)$/, 'must be at most $1')
    .replace(/^Too small: expected string to have >=1 characters?$/, 'fill this in')
    .replace(/^Too big: expected string to have <=(\d+) characters?$/, 'at most $1 characters')
    .replace(/^Invalid input: expected number, received \w+$/, 'enter a number')
    .replace(/^Invalid input: expected \w+, received \w+$/, 'fill this in');
  if (!path) return said;
  return `${label ?? fieldWords(path)}: ${said}`;
}

/** The value at a field key (`to.0.volumeL`) of a form or request; undefined when there is none. */
export function valueAt(value: unknown, key: string): unknown {
  return key
    .split('.')
    .reduce<unknown>((at, part) => (at !== null && typeof at === 'object' ? (at as Record<string, unknown>)[part] : undefined), value);
}
