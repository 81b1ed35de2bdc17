import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';

/**
 * Calendar feed tokens: 32 random bytes in the URL, only their SHA-256 kept, so a database
 * copy cannot be used to read anyone's tasks. One feed per person, across their cellars.
 */

const hash = (token: string) => crypto.createHash('sha256').update(token).digest();

/** The path of a feed for a token (the client puts its own origin in front). */
export const feedPath = (token: string) => `/calendar/${token}.ics`;

/** A new token for the user, replacing any earlier one (which stops working at once). */
export async function issueFeedToken(tx: EntityManager, userId: string): Promise<string> {
  const token = crypto.randomBytes(32).toString('base64url');
  await tx.query(
    `INSERT INTO calendar_feeds (user_id, token_hash) VALUES ($1, $2)
     ON CONFLICT (user_id) DO UPDATE SET token_hash = EXCLUDED.token_hash, created_at = now()`,
    [userId, hash(token)],
  );
  return token;
}

export async function revokeFeedToken(tx: EntityManager, userId: string): Promise<void> {
  await tx.query(`DELETE FROM calendar_feeds WHERE user_id = $1`, [userId]);
}

/** When the user's feed was turned on, or null when it is off. */
export async function feedCreatedAt(tx: EntityManager, userId: string): Promise<Date | null> {
  const [row]: { created_at: Date }[] = await tx.query(`SELECT created_at FROM calendar_feeds WHERE user_id = $1`, [userId]);
  return row?.created_at ?? null;
}

/** The user a token belongs to, or null (unknown, revoked or regenerated). */
export async function feedOwner(tx: EntityManager, token: string): Promise<string | null> {
  if (!/^[A-Za-z0-9_-]{43}$/.test(token)) return null;
  const [row]: { user_id: string }[] = await tx.query(`SELECT user_id FROM calendar_feeds WHERE token_hash = $1`, [hash(token)]);
  return row?.user_id ?? null;
}
