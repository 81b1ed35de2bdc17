import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * `idempotency_keys`: the answer to each keyed write, per cellar, so a request a phone sends
 * twice (queued offline, resent on reconnecting) is recorded once and answered the same.
 * `status` and `body` are filled in the same transaction as the write, before it commits.
 * Rows older than a week are removed as later keyed writes pass (server/http/idempotency.ts).
 */
export class CreateIdempotencyKeys1796170900000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE idempotency_keys (
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        key varchar(200) NOT NULL,
        request varchar(500) NOT NULL,
        status smallint,
        body jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (cellar_id, key)
      )`);
    await q.query(`CREATE INDEX ix_idempotency_keys_cellar_created ON idempotency_keys (cellar_id, created_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE idempotency_keys`);
  }
}
