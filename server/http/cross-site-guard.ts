import type { RequestHandler } from 'express';
import { ForbiddenError } from './errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses state-changing requests that a browser says come from another site, so a page
 * elsewhere cannot use a member's cookie (SameSite=Lax alone lets some through, and a
 * multipart form needs no preflight). Browsers send `Sec-Fetch-Site`; older ones send only
 * `Origin`, which must then name this app (its own host, or PUBLIC_URL). Requests with
 * neither header (curl, scripts, the tests) are not from a browser page and pass.
 * @param publicUrl - the address printed on labels; an Origin naming it is ours too
 */
export function crossSiteGuard(publicUrl?: string): RequestHandler {
  const publicOrigin = originOf(publicUrl);
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    // A browser that sends Sec-Fetch-Site knows best (a dev proxy rewrites Host, not this).
    const fetchSite = req.get('sec-fetch-site');
    if (fetchSite === 'cross-site') throw refusal();
    const origin = req.get('origin');
    if (fetchSite === undefined && origin !== undefined) {
      const host = req.get('host');
      const from = originOf(origin);
      // "null" (a sandboxed frame, a file) or anything unreadable is not this app.
      if (from === null) throw refusal();
      const sameHost = host !== undefined && new URL(from).host === host;
      if (!sameHost && from !== publicOrigin) throw refusal();
    }
    next();
  };
}

function refusal(): ForbiddenError {
  return new ForbiddenError('This change came from another web site, so it was refused. Open Cellarwright itself and try again.');
}

/** `scheme://host[:port]` of a URL, or null for anything that is not one (including "null"). */
function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    const parsed = new URL(url);
    return parsed.protocol === 'http:' || parsed.protocol === 'https:' ? parsed.origin : null;
  } catch {
    return null;
  }
}
