// The HTTP doors: signed in, and (under /api/cellars/:cellarId) a member with the role the method needs.
import type { Request, RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { uuidSchema } from '../../shared/schemas/common';
import { memberActor, requireRole } from '../core/actor';
import { Membership } from '../entities/membership.entity';
import { BadRequestError, NotFoundError, UnauthorizedError } from './errors';
import { sessionPreload } from './session-store';

export interface CellarAccessPolicy {
  /** Least role for POST, PUT and PATCH. DELETE always needs a Keeper. */
  write: Role;
}

/** The outer door of every API route past sign-in: a session with a user. */
export const requireSignIn: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthorizedError();
  next();
};

const READ_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The least role a request needs under a given policy. */
export function neededRole(method: string, policy: CellarAccessPolicy): Role {
  if (READ_METHODS.has(method)) return 'guest';
  if (method === 'DELETE') return 'keeper';
  return policy.write;
}

/**
 * The caller's role in a cellar: from the memberships the session read brought along (same
 * request, one statement), else from the table.
 */
async function memberRole(ds: DataSource, req: Request, cellarId: string, userId: string): Promise<Role | undefined> {
  const preload = sessionPreload(req);
  if (preload?.user?.id === userId) return preload.memberships.get(cellarId);
  const membership = await ds.getRepository(Membership).findOne({ where: { cellarId, userId } });
  return membership?.role;
}

/**
 * The one gate for everything under /api/cellars/:cellarId. It loads the caller's membership
 * (a cellar they are not in answers 404, exactly like one that does not exist) and checks the
 * role the request method needs under the router's policy. Routers declare their policy once,
 * where they are mounted, never per route.
 */
export function cellarAccess(ds: DataSource, policy: CellarAccessPolicy = { write: 'hand' }): RequestHandler {
  const gate: RequestHandler = async (req, _res, next) => {
    if (!req.user) throw new UnauthorizedError();
    const id = uuidSchema.safeParse(req.params.cellarId);
    if (!id.success) throw new BadRequestError('params.cellarId: must be an id (UUID)');
    const role = await memberRole(ds, req, id.data, req.user.id);
    if (!role) throw new NotFoundError('No such cellar.');
    // The same check, and the same words, as the services' inner door.
    requireRole(memberActor(id.data, req.user.id, role), neededRole(req.method, policy));
    req.cellar = { id: id.data, role };
    next();
  };
  // The policy stays readable on the gate, for the route sweep that walks the app.
  return Object.assign(gate, { [CELLAR_POLICY]: policy });
}

/** Where `cellarAccess` leaves its policy on the gate it returns. */
export const CELLAR_POLICY = Symbol('cellarPolicy');
