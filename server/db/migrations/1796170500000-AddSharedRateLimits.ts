import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Counters of the rate limits (sign-in, label look-ups), kept in PostgreSQL so every app
 * instance on the same database counts together. The shape is the one rate-limiter-flexible's
 * PostgreSQL store reads and writes; keys are hashes, so no e-mail address is stored here.
 */
export class AddSharedRateLimits1796170500000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE rate_limits (
        key varchar(255) PRIMARY KEY,
        points integer NOT NULL DEFAULT 0,
        expire bigint
      )`);
    await q.query(`CREATE INDEX ix_rate_limits_expire ON rate_limits (expire)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE rate_limits`);
  }
}
