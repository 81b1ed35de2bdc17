import crypto from 'node:crypto';

/**
 * One-click unsubscribe links: the cellar and the member, signed with an HMAC of the app's
 * secret, so a link works without signing in and cannot be made for someone else.
 */
function signature(secret: string, cellarId: string, userId: string): string {
  return crypto.createHmac('sha256', secret).update(`unsubscribe:${cellarId}:${userId}`).digest('base64url');
}

export function unsubscribeUrl(publicUrl: string, secret: string, cellarId: string, userId: string): string {
  const params = new URLSearchParams({ c: cellarId, u: userId, s: signature(secret, cellarId, userId) });
  return `${publicUrl}/api/mail/unsubscribe?${params.toString()}`;
}

/** The member and cellar a link names, or null when its signature does not match. */
export function verifyUnsubscribe(secret: string, query: { c?: unknown; u?: unknown; s?: unknown }): { cellarId: string; userId: string } | null {
  const { c, u, s } = query;
  if (typeof c !== 'string' || typeof u !== 'string' || typeof s !== 'string') return null;
  const expected = Buffer.from(signature(secret, c, u));
  const given = Buffer.from(s);
  if (expected.length !== given.length || !crypto.timingSafeEqual(expected, given)) return null;
  return { cellarId: c, userId: u };
}
