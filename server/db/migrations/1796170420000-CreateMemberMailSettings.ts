import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each member's e-mail reminders in one cellar: at once, in a daily digest at a local hour, or
 * off, and which kinds of task. No row means the default for the member's role
 * (server/mail/reminder-settings.ts).
 */
export class CreateMemberMailSettings1796170420000 implements MigrationInterface {
  name = 'CreateMemberMailSettings1796170420000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE member_mail_settings (
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        delivery varchar(8) NOT NULL CHECK (delivery IN ('instant', 'digest', 'off')),
        digest_hour smallint NOT NULL DEFAULT 7 CHECK (digest_hour BETWEEN 0 AND 23),
        kinds text[] NOT NULL,
        updated_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (cellar_id, user_id)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE member_mail_settings`);
  }
}
