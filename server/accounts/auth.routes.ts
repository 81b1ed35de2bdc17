import { Router, type Request, type Response } from 'express';
import type { PassportStatic } from 'passport';
import type { DataSource } from 'typeorm';
import { signInRequestSchema } from '../../shared/schemas/auth';
import { AppError, UnauthorizedError } from '../http/errors';
import { handle } from '../http/handle';
import { requireSignIn } from '../http/access';
import { sharedLimit } from '../http/shared-rate-limit';
import { describeSessionUser } from './session-user';

export interface AuthRouteOptions {
  /** Failed sign-ins allowed per e-mail address in 15 minutes. */
  signInAttempts: number;
  /** Failed sign-ins allowed per client (network) address in 15 minutes, over all e-mails. */
  signInAttemptsPerClient: number;
}

const SIGN_IN_WINDOW_SECONDS = 15 * 60;

function authenticateLocal(passport: PassportStatic, req: Request, res: Response): Promise<Express.User | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', (err: unknown, user: Express.User | false) => (err ? reject(err) : resolve(user)))(req, res, reject);
  });
}

export function authRoutes(ds: DataSource, passport: PassportStatic, options: AuthRouteOptions): Router {
  const router = Router();

  // Counted in PostgreSQL so every instance of the app sees the same failures.
  const perEmail = sharedLimit(ds, { name: 'sign-in-email', points: options.signInAttempts, windowSeconds: SIGN_IN_WINDOW_SECONDS });
  const perClient = sharedLimit(ds, { name: 'sign-in-client', points: options.signInAttemptsPerClient, windowSeconds: SIGN_IN_WINDOW_SECONDS });
  const tooMany = (seconds: number) => {
    const minutes = Math.max(1, Math.ceil(seconds / 60));
    return new AppError(429, 'too_many_attempts', `Too many failed sign-ins. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`);
  };

  router.post(
    '/sign-in',
    handle({ body: signInRequestSchema }, async ({ body }, req, res) => {
      // The schema has normalised the address (trim, NFKC, lower case): the limit counts the
      // very address sign-in looks up, so padding or case cannot start a fresh count.
      const emailKey = body.email;
      const clientKey = req.ip ?? 'unknown';
      const wait = Math.max(await perEmail.blockedFor(emailKey), await perClient.blockedFor(clientKey));
      if (wait > 0) {
        res.set('Retry-After', String(wait));
        throw tooMany(wait);
      }
      const user = await authenticateLocal(passport, req, res);
      if (!user) {
        await Promise.all([perEmail.take(emailKey), perClient.take(clientKey)]);
        throw new UnauthorizedError('Wrong e-mail or password.');
      }
      await perEmail.forget(emailKey);
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
