import crypto from 'node:crypto';
import type { Pool } from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import type { DataSource } from 'typeorm';

/** A limit counted in PostgreSQL (table rate_limits), shared by every app instance on the database. */
export interface SharedLimit {
  /** Seconds to wait when the key has used up its attempts, else 0. */
  blockedFor(key: string): Promise<number>;
  /** Counts one attempt against the key: 0 when it was within the limit, else seconds to wait. */
  take(key: string): Promise<number>;
  /** Forgets the key's attempts (after a successful sign-in, for example). */
  forget(key: string): Promise<void>;
}

export interface SharedLimitOptions {
  /** What is limited, e.g. 'sign-in-email'. */
  name: string;
  /** Attempts allowed per window. */
  points: number;
  windowSeconds: number;
}

/**
 * A limit in the shared store. Instances with the same name and numbers share counters; a
 * different limit (a test's stricter app) counts apart. Keys are hashed: addresses and
 * e-mails never sit in the table, and any length fits.
 */
export function sharedLimit(ds: DataSource, options: SharedLimitOptions): SharedLimit {
  const pool = (ds.driver as unknown as { master: Pool }).master;
  const limiter = new RateLimiterPostgres({
    storeClient: pool,
    storeType: 'pool',
    tableName: 'rate_limits',
    tableCreated: true,
    clearExpiredByTimeout: true,
    keyPrefix: `${options.name}:${options.points}/${options.windowSeconds}`,
    points: options.points,
    duration: options.windowSeconds,
  });
  const hashed = (key: string) => crypto.createHash('sha256').update(key).digest('base64url');
  return {
    async blockedFor(key) {
      const res = await limiter.get(hashed(key));
      return res && res.consumedPoints >= options.points ? Math.max(1, Math.ceil(res.msBeforeNext / 1000)) : 0;
    },
    async take(key) {
      try {
        await limiter.consume(hashed(key));
        return 0;
      } catch (refused) {
        // consume rejects with a RateLimiterRes when the limit is already used up.
        if (refused instanceof RateLimiterRes) return Math.max(1, Math.ceil(refused.msBeforeNext / 1000));
        throw refused;
      }
    },
    async forget(key) {
      await limiter.delete(hashed(key));
    },
  };
}
