import crypto from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';

/**
 * Device tokens: 32 random bytes, shown once; only their SHA-256 is kept. A token is a long
 * random key, not a password a person chose, so a fast hash is enough: nobody can guess one
 * from its hash, and a database copy cannot be used to post readings.
 */

export const hashToken = (token: string) => crypto.createHash('sha256').update(token).digest();

/** A new token: `cwd_` and 43 URL-safe characters. */
export const newDeviceToken = () => `cwd_${crypto.randomBytes(32).toString('base64url')}`;

/** Its last four characters, kept in clear so a Keeper can tell tokens apart. */
export const tokenEnd = (token: string) => token.slice(-4);

/** Tokens we ever issue (and the demo's) fit this; anything else is refused without a query. */
const TOKEN_SHAPE = /^[A-Za-z0-9_.-]{20,200}$/;

/** The device a token belongs to, or null (unknown, revoked, or not a token at all). */
export async function deviceForToken(db: DataSource | EntityManager, token: string): Promise<{ id: string; cellarId: string } | null> {
  if (!TOKEN_SHAPE.test(token)) return null;
  const [row]: { id: string; cellarId: string }[] = await db.query(
    `SELECT id, cellar_id AS "cellarId" FROM devices WHERE token_hash = $1 AND revoked_at IS NULL`,
    [hashToken(token)],
  );
  return row ?? null;
}
