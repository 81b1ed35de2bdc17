import type { Request, Response } from 'express';
import type { EntityManager } from 'typeorm';
import type { Actor } from '../core/actor';
import { AppError, BadRequestError } from './errors';

/** The header a client sends to make a write safe to repeat (a phone resending what it queued offline). */
export const IDEMPOTENCY_HEADER = 'idempotency-key';
/** Set on an answer that repeats the first answer to the same key. */
export const REPLAYED_HEADER = 'idempotent-replayed';
/** How long a key is remembered: far longer than a phone stays without signal in a cellar. */
export const KEY_LIFETIME_DAYS = 7;
/** Expired keys removed per keyed write (skipping rows another request holds). */
const PURGE_BATCH = 100;

const KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,200}$/;

type CellarWork<I> = (input: I, actor: Actor, tx: EntityManager, req: Request, res: Response) => Promise<unknown> | unknown;

interface StoredAnswer {
  request: string;
  status: number;
  body: unknown;
}

/** The request a key was first used for: method and path, without the query. */
function requestLine(req: Request): string {
  return `${req.method} ${req.originalUrl.split('?')[0]}`;
}

function keyFrom(req: Request): string | null {
  const raw = req.get(IDEMPOTENCY_HEADER);
  if (raw === undefined) return null;
  if (!KEY_PATTERN.test(raw)) {
    throw new BadRequestError('The Idempotency-Key header must be 8 to 200 letters, digits or . _ : - characters.');
  }
  return raw;
}

/**
 * Makes a cellar write repeatable: with an `Idempotency-Key` header, the first request runs
 * and its answer is kept under the key in the same transaction as the write; a repeat gets
 * that answer (same status and body) and changes nothing. The key row is inserted before the
 * work, so a concurrent duplicate waits on it and then finds the first answer; a write that
 * fails rolls its key back, and a retry runs afresh. Keys are per cellar and expire after
 * KEY_LIFETIME_DAYS. Without the header the write runs as usual.
 */
export function idempotent<I>(work: CellarWork<I>): CellarWork<I> {
  return async (input, actor, tx, req, res) => {
    const key = keyFrom(req);
    if (key === null) return work(input, actor, tx, req, res);
    const line = requestLine(req);
    await forgetExpired(tx, actor.cellarId);
    const claimed: unknown[] = await tx.query(
      `INSERT INTO idempotency_keys (cellar_id, key, request) VALUES ($1, $2, $3)
       ON CONFLICT (cellar_id, key) DO NOTHING RETURNING key`,
      [actor.cellarId, key, line],
    );
    if (claimed.length === 0) return replay(await storedAnswer(tx, actor.cellarId, key), line, res);

    const result = await work(input, actor, tx, req, res);
    const status = result === undefined ? 204 : res.statusCode;
    await tx.query(`UPDATE idempotency_keys SET status = $3, body = $4::jsonb WHERE cellar_id = $1 AND key = $2`, [
      actor.cellarId,
      key,
      status,
      result === undefined ? null : JSON.stringify(result),
    ]);
    return result;
  };
}

/** Forgets a few expired keys of the cellar (rows another request holds are skipped, never waited for). */
async function forgetExpired(tx: EntityManager, cellarId: string): Promise<void> {
  await tx.query(
    `DELETE FROM idempotency_keys WHERE ctid IN (
       SELECT ctid FROM idempotency_keys
        WHERE cellar_id = $1 AND created_at < now() - make_interval(days => $2)
        LIMIT $3 FOR UPDATE SKIP LOCKED)`,
    [cellarId, KEY_LIFETIME_DAYS, PURGE_BATCH],
  );
}

async function storedAnswer(tx: EntityManager, cellarId: string, key: string): Promise<StoredAnswer> {
  const rows: StoredAnswer[] = await tx.query(`SELECT request, status, body FROM idempotency_keys WHERE cellar_id = $1 AND key = $2`, [
    cellarId,
    key,
  ]);
  // The row was there when the insert met it; it cannot go before this transaction ends.
  if (!rows[0]) throw new AppError(409, 'conflict', 'This request is being handled already. Try again in a moment.');
  return rows[0];
}

function replay(stored: StoredAnswer, line: string, res: Response): unknown {
  if (stored.request !== line) {
    throw new AppError(422, 'idempotency_key_reused', 'This Idempotency-Key was already used for another request. Send a new key.');
  }
  res.status(stored.status);
  res.setHeader(REPLAYED_HEADER, 'true');
  return stored.body === null ? undefined : stored.body;
}
