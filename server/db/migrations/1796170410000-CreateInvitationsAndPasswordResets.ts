import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Invitations to a cellar and password-reset requests. Both keep only the SHA-256 of their
 * random token (the link in the mail is the only copy), are used once and expire.
 */
export class CreateInvitationsAndPasswordResets1796170410000 implements MigrationInterface {
  name = 'CreateInvitationsAndPasswordResets1796170410000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE invitations (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        email varchar(254) NOT NULL CHECK (email = lower(email)),
        role varchar(8) NOT NULL CHECK (role IN ('keeper', 'hand', 'guest')),
        token_hash char(64) NOT NULL,
        invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        expires_at timestamptz NOT NULL,
        accepted_at timestamptz,
        accepted_by uuid REFERENCES users(id) ON DELETE SET NULL,
        revoked_at timestamptz,
        CONSTRAINT uq_invitations_token_hash UNIQUE (token_hash)
      )`);
    // One open invitation per address and cellar (a second one while one is pending is refused).
    await q.query(`
      CREATE UNIQUE INDEX uq_invitations_open ON invitations (cellar_id, email)
        WHERE accepted_at IS NULL AND revoked_at IS NULL`);
    await q.query(`
      CREATE TABLE password_resets (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        token_hash char(64) NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        CONSTRAINT uq_password_resets_token_hash UNIQUE (token_hash)
      )`);
    await q.query(`CREATE INDEX ix_password_resets_user ON password_resets (user_id)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE password_resets`);
    await q.query(`DROP TABLE invitations`);
  }
}
