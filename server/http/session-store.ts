import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type { Pool } from 'pg';
import type { Role } from '../../shared/roles';

/** What the session read brought along: the signed-in user as of this request, and every cellar they are in. */
export interface SessionPreload {
  user: Express.User | null;
  memberships: Map<string, Role>;
  /** When the stored row expires (ms since the epoch), to know whether a touch is due. */
  expiresAt: number;
}

/**
 * Keyed by the session's `passport` object, which express-session hands over by reference from
 * what the store read to req.session: the preload lives exactly as long as that request's session
 * data and is never written back with it.
 */
const preloads = new WeakMap<object, SessionPreload>();

/** The preload of this request's session, when its store read the user with it. */
export function sessionPreload(req: object): SessionPreload | undefined {
  const passport = (req as { session?: { passport?: object } }).session?.passport;
  return passport ? preloads.get(passport) : undefined;
}

/** The row's expiry is moved on at most this often: a touch per request would be a write per request. */
export const TOUCH_EVERY_MS = 60 * 60 * 1000;

interface SessionRow {
  sess: session.SessionData & { passport?: { user?: string } };
  expires_ms: string;
  user_id: string | null;
  email: string | null;
  display_name: string | null;
  memberships: { cellarId: string; role: Role }[];
}

/**
 * One statement reads the session, its user (a deleted account comes back without one) and
 * the user's memberships, so a request under a cellar needs no query of its own before its
 * transaction.
 */
const READ_SESSION = `
  SELECT s.sess, (extract(epoch FROM s.expire) * 1000)::bigint::text AS expires_ms,
         u.id AS user_id, u.email, u.display_name,
         COALESCE((SELECT json_agg(json_build_object('cellarId', m.cellar_id, 'role', m.role)) FROM memberships m WHERE m.user_id = u.id), '[]') AS memberships
    FROM session s
    LEFT JOIN users u ON u.id = CASE WHEN s.sess -> 'passport' ->> 'user' ~ '^[0-9a-f-]{36}$' THEN (s.sess -> 'passport' ->> 'user')::uuid END
   WHERE s.sid = $1 AND s.expire >= now()`;

/**
 * The PostgreSQL session store (connect-pg-simple on the app's pool) with two savings: the
 * read brings the user and memberships along, and the expiry is written only when it has
 * moved on by TOUCH_EVERY_MS (a session then lives at most that much less than its cookie).
 */
export function createSessionStore(pool: Pool): session.Store {
  const PgStore = connectPgSimple(session);
  class PreloadingStore extends PgStore {
    // The prune timer starts with the first write (a sign-in, a due touch), as the store's own get would start it.
    override get(sid: string, done: (err: unknown, sess?: session.SessionData | null) => void): void {
      // Named, so each connection plans it once: it runs before every signed-in request.
      pool.query<SessionRow>({ name: 'cellarwright-session-read', text: READ_SESSION, values: [sid] }).then(({ rows: [row] }) => {
        if (!row) return done(null, null);
        const { sess } = row;
        if (sess.passport) {
          const user =
            row.user_id && row.user_id === sess.passport.user ? { id: row.user_id, email: row.email!, displayName: row.display_name! } : null;
          preloads.set(sess.passport, {
            user,
            memberships: new Map(user ? row.memberships.map((m) => [m.cellarId, m.role]) : []),
            expiresAt: Number(row.expires_ms),
          });
        }
        done(null, sess);
      }, done);
    }

    override touch(sid: string, sess: session.SessionData, done?: (err?: unknown) => void): void {
      const stored = sessionPreload({ session: sess })?.expiresAt;
      const wanted = sess.cookie.expires ? new Date(sess.cookie.expires).getTime() : undefined;
      if (stored !== undefined && wanted !== undefined && wanted - stored < TOUCH_EVERY_MS) {
        done?.();
        return;
      }
      super.touch(sid, sess, done);
    }
  }
  return new PreloadingStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 60 * 15 });
}
