import type { Request } from 'express';
import { memberActor, type MemberActor } from '../core/actor';
import { UnauthorizedError } from './errors';

/** The member and cellar that cellarAccess checked and put on the request. */
export function actorFrom(req: Request): MemberActor {
  if (!req.user || !req.cellar) throw new UnauthorizedError();
  return memberActor(req.cellar.id, req.user.id, req.cellar.role);
}
