import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The outbox: every mail the app sends is a row written in the same transaction as the change
 * that causes it, then delivered by a worker that claims rows with FOR UPDATE SKIP LOCKED.
 * `dedupe_key` (unique when present) makes "at most one of this mail" a database rule.
 */
export class CreateMailOutbox1796170400000 implements MigrationInterface {
  name = 'CreateMailOutbox1796170400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE mail_outbox (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid REFERENCES cellars(id) ON DELETE CASCADE,
        dedupe_key text,
        kind varchar(32) NOT NULL,
        to_address varchar(254) NOT NULL,
        subject text NOT NULL,
        text_body text NOT NULL,
        html_body text NOT NULL,
        headers jsonb NOT NULL DEFAULT '{}'::jsonb,
        message_id text NOT NULL,
        status varchar(8) NOT NULL DEFAULT 'pending' CHECK (status IN ('pending', 'sending', 'sent', 'failed')),
        attempts integer NOT NULL DEFAULT 0,
        next_attempt_at timestamptz NOT NULL DEFAULT now(),
        claimed_until timestamptz,
        last_error text,
        created_at timestamptz NOT NULL DEFAULT now(),
        sent_at timestamptz,
        CONSTRAINT uq_mail_outbox_dedupe_key UNIQUE (dedupe_key)
      )`);
    // The worker's look-up: only rows still to deliver are indexed.
    await q.query(`CREATE INDEX ix_mail_outbox_due ON mail_outbox (next_attempt_at) WHERE status IN ('pending', 'sending')`);
    await q.query(`CREATE INDEX ix_mail_outbox_cellar ON mail_outbox (cellar_id, created_at) WHERE cellar_id IS NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE mail_outbox`);
  }
}
