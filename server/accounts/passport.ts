import type { IncomingMessage } from 'node:http';
import passport, { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { DataSource } from 'typeorm';
import { signInRequestSchema } from '../../shared/schemas/auth';
import { sessionPreload } from '../http/session-store';
import { authenticate, findSessionUser } from './session-user';

/**
 * A passport instance of its own per app (tests build several apps in one process).
 * The session keeps only the user id; the user is re-read on each request (with the session
 * itself, server/http/session-store.ts) so a deleted account stops working at once.
 */
export function createPassport(ds: DataSource): passport.PassportStatic {
  const instance = new Passport() as unknown as passport.PassportStatic;
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      const parsed = signInRequestSchema.safeParse({ email, password });
      if (!parsed.success) return done(null, false);
      authenticate(ds, parsed.data.email, parsed.data.password).then(
        (user) => done(null, user ?? false),
        (err) => done(err),
      );
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((req: IncomingMessage, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
    // The session store usually read the user in the same statement as the session.
    const preload = sessionPreload(req);
    if (preload && (preload.user === null || preload.user.id === id)) return done(null, preload.user ?? false);
    findSessionUser(ds, id).then((user) => done(null, user ?? false), done);
  });
  return instance;
}
