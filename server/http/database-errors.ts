import { QueryFailedError } from 'typeorm';
import { AppError } from './errors';

type PgError = { code?: string; constraint?: string };

/**
 * What a refused unique rule means to the person who hit it. Keyed by the rule's name, which
 * itself never leaves the server: an answer names the thing, not the database's words for it.
 */
const UNIQUE_MESSAGES: Record<string, string> = {
  uq_users_email: 'Someone already uses that e-mail address.',
  uq_memberships_cellar_user: 'That person is already a member of this cellar.',
  uq_racks_cellar_name: 'This cellar already has a rack with that name. Choose another name.',
  uq_vessels_cellar_name: 'This cellar already has a vessel with that name. Choose another name.',
  uq_shelves_rack_number: 'That rack already has a shelf with that number.',
  uq_placements_slot: 'That slot is already taken.',
  uq_placements_vessel: 'That vessel already has a place. Move it instead.',
  uq_placements_case: 'That case already has a place. Move it instead.',
};

/** The request field a refused unique rule is about, where one field alone decides it. */
const UNIQUE_FIELDS: Record<string, string> = {
  uq_vessels_cellar_name: 'name',
  uq_racks_cellar_name: 'name',
};

/** Node's words for a connection that could not be made or was cut. */
const CONNECTION_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH']);

/**
 * True when the database could not be reached or went away mid-request (stopped, restarting,
 * the network cut): nothing the request did, and worth trying again shortly. SQLSTATE class 08
 * is a connection exception; 57P01–57P03 an administrator's or a crash's shutdown, or a
 * server still starting; pg itself says "Connection terminated" when the server hangs up.
 */
function databaseUnreachable(err: unknown): boolean {
  const cause = err instanceof QueryFailedError ? (err.driverError as unknown) : err;
  if (!(cause instanceof Error)) return false;
  const code = (cause as { code?: unknown }).code;
  if (typeof code === 'string' && (CONNECTION_CODES.has(code) || code.startsWith('08') || /^57P0[123]$/.test(code))) return true;
  return /^Connection terminated/.test(cause.message) || /timeout exceeded when trying to connect/.test(cause.message);
}

/**
 * Turns the database errors that bad input can still reach into answers a person can act on:
 * 409 for a clash with what is stored, 400 for a value the database cannot keep, 503 when the
 * database cannot be reached at all. Answers never name a constraint, a column or a type.
 * Anything else is left for the 500 answer.
 */
export function databaseErrorAnswer(err: unknown): AppError | null {
  if (databaseUnreachable(err)) {
    return new AppError(503, 'database_unavailable', 'The cellar’s database is not answering just now. Try again in a moment.');
  }
  if (!(err instanceof QueryFailedError)) return null;
  const pg = err.driverError as PgError;
  const code = pg.code ?? '';
  if (code === '23505') {
    const message = UNIQUE_MESSAGES[pg.constraint ?? ''] ?? 'Something with those details already exists.';
    const field = UNIQUE_FIELDS[pg.constraint ?? ''];
    return new AppError(409, 'conflict', message, field ? { field, issues: [{ path: `body.${field}`, message }] } : undefined);
  }
  if (code === '23503') return new AppError(409, 'conflict', 'That refers to something that does not exist (any more).');
  if (code === '23514') return new AppError(400, 'invalid_input', 'A value is outside what can be kept (too small, too large or not allowed here).');
  if (code === '23502') return new AppError(400, 'invalid_input', 'A value that is needed is missing.');
  if (code === '22021' || code === '22P05' || code === '22000') {
    return new AppError(400, 'invalid_input', 'The text contains characters that cannot be stored (such as a NUL character).');
  }
  if (code === '22007' || code === '22008') return new AppError(400, 'invalid_input', 'A date or time is not one the calendar has.');
  if (code === '22001') return new AppError(400, 'invalid_input', 'A text is too long.');
  // The rest of class 22 (data exception): wrong form, out of range, division by zero…
  if (code.startsWith('22')) return new AppError(400, 'invalid_input', 'A value has the wrong form or is out of range.');
  return null;
}
