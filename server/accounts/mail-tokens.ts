import crypto from 'node:crypto';

/**
 * A token for a mail link: 32 random bytes (base64url, 43 characters). Only its SHA-256 is
 * stored: with this much randomness a plain hash cannot be reversed or guessed, and the
 * database alone never holds a usable link.
 */
export function newMailToken(): { token: string; hash: string } {
  const token = crypto.randomBytes(32).toString('base64url');
  return { token, hash: hashMailToken(token) };
}

export function hashMailToken(token: string): string {
  return crypto.createHash('sha256').update(token).digest('hex');
}
