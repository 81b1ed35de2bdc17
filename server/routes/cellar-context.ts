import type { Request } from 'express';
import { UnauthorizedError } from '../errors';
import type { CellarContext } from '../services/cellar.service';

/** The checked cellar and caller that cellarAccess put on the request. */
export function cellarContext(req: Request): CellarContext {
  if (!req.user || !req.cellar) throw new UnauthorizedError();
  return { cellarId: req.cellar.id, role: req.cellar.role, userId: req.user.id };
}
