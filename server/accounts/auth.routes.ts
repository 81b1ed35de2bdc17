import { Router, type Request, type Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { PassportStatic } from 'passport';
import type { DataSource } from 'typeorm';
import { signInRequestSchema } from '../../shared/schemas/auth';
import { UnauthorizedError } from '../http/errors';
import { handle } from '../http/handle';
import { requireSignIn } from '../http/require-sign-in';
import { describeSessionUser } from './session-user';

export interface AuthRouteOptions {
  /** Failed sign-ins allowed per address and e-mail in 15 minutes. */
  signInAttempts: number;
}

function authenticateLocal(passport: PassportStatic, req: Request, res: Response): Promise<Express.User | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', (err: unknown, user: Express.User | false) => (err ? reject(err) : resolve(user)))(req, res, reject);
  });
}

export function authRoutes(ds: DataSource, passport: PassportStatic, options: AuthRouteOptions): Router {
  const router = Router();

  const signInLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: options.signInAttempts,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').toLowerCase()}`,
    handler: (_req, res) => {
      res.status(429).json({ error: 'too_many_attempts', message: 'Too many failed sign-ins. Wait 15 minutes and try again.' });
    },
  });

  router.post(
    '/sign-in',
    signInLimiter,
    handle({ body: signInRequestSchema }, async (_input, req, res) => {
      const user = await authenticateLocal(passport, req, res);
      if (!user) throw new UnauthorizedError('Wrong e-mail or password.');
      // passport ≥ 0.6 regenerates the session id here, so a planted id is worthless.
      await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
      return describeSessionUser(ds, user);
    }),
  );

  router.post(
    '/sign-out',
    handle({}, async (_input, req, res) => {
      await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
      await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
      res.clearCookie('cellarwright.sid');
      res.status(204).end();
    }),
  );

  router.get(
    '/me',
    requireSignIn,
    handle({}, (_input, req) => describeSessionUser(ds, req.user!)),
  );

  return router;
}
