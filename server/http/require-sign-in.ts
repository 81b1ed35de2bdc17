import type { RequestHandler } from 'express';
import { UnauthorizedError } from './errors';

/** Every API route past sign-in needs a session. */
export const requireSignIn: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new UnauthorizedError();
  next();
};
