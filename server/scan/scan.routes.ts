import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { DataSource } from 'typeorm';
import { scanCodeParamsSchema } from '../../shared/schemas/scan';
import { NotFoundError } from '../http/errors';
import { handle } from '../http/handle';
import { requireSignIn } from '../http/access';
import { sharedLimit } from '../http/shared-rate-limit';
import { bottleCard, resolveCode, scanDestination } from './code-lookup';

export interface ScanRouteOptions {
  /** Code look-ups allowed per address per minute, over /s, /api/scan and /api/cards together. */
  lookupsPerMinute?: number;
}

const TOO_MANY = 'Too many label look-ups from this address. Wait a minute, then try again.';

const TOO_MANY_PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Slow down · Cellarwright</title></head>
<body style="font-family: system-ui, sans-serif; max-width: 32rem; margin: 15vh auto; padding: 0 1rem; color: #232134">
<h1 style="font-size: 1.4rem">Slow down a little</h1>
<p>${TOO_MANY}</p></body></html>`;

function tooMany(req: Request, res: Response): void {
  if (req.originalUrl.startsWith('/api/')) {
    res.status(429).json({ error: 'too_many_requests', message: TOO_MANY });
  } else {
    res.status(429).type('html').send(TOO_MANY_PAGE);
  }
}

/**
 * Printed label URLs and code look-ups, mounted at the app root:
 * GET /s/:code (phones open it; redirects), GET /api/scan/:code (signed in),
 * GET /api/cards/:code (public bottle cards). Look-ups that could be guesses are rate-limited per address.
 */
export function scanRoutes(ds: DataSource, options: ScanRouteOptions = {}): Router {
  const router = Router();
  // Counted in PostgreSQL, so several instances share one count per address.
  const lookups = sharedLimit(ds, { name: 'scan-lookups', points: options.lookupsPerMinute ?? 60, windowSeconds: 60 });
  /** Counts one look-up of this address; false (and the 429 already sent) when it is over the limit. */
  const counted = async (req: Request, res: Response): Promise<boolean> => {
    const wait = await lookups.take(req.ip ?? 'unknown');
    if (wait === 0) return true;
    res.set('Retry-After', String(wait));
    tooMany(req, res);
    return false;
  };
  const limiter: RequestHandler = async (req, res, next) => {
    if (await counted(req, res)) next();
  };
  // Each look-up is ONE statement, and one statement is already one snapshot: no BEGIN/COMMIT
  // round trips around it (a scan is the app's most frequent request, made standing in the cellar).
  // The limit is against guessing codes: a member opening their own cellar's label is not
  // counted (no write on every scan), every other look-up is — unknown codes, other cellars'
  // codes, and everything a signed-out visitor opens.
  router.get(
    '/s/:code',
    (req, res, next) => (req.user ? next() : limiter(req, res, next)),
    handle({}, async (_input, req, res) => {
      const target = await scanDestination(ds.manager, req.user?.id, String(req.params.code ?? ''));
      if (req.user && !target.startsWith('/c/') && !(await counted(req, res))) return;
      res.set('Cache-Control', 'no-store').redirect(302, target);
    }),
  );
  router.get(
    '/api/scan/:code',
    requireSignIn,
    handle({ params: scanCodeParamsSchema }, async ({ params }, req, res) => {
      try {
        return await resolveCode(ds.manager, req.user!.id, params.code);
      } catch (err) {
        if (err instanceof NotFoundError && !(await counted(req, res))) return undefined;
        throw err;
      }
    }),
  );
  router.get(
    '/api/cards/:code',
    limiter,
    handle({ params: scanCodeParamsSchema }, ({ params }) => bottleCard(ds.manager, params.code)),
  );
  return router;
}
