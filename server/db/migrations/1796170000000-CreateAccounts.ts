import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Users, cellars, memberships (role per cellar) and the session store's table. */
export class CreateAccounts1796170000000 implements MigrationInterface {
  name = 'CreateAccounts1796170000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE EXTENSION IF NOT EXISTS pgcrypto`);
    await q.query(`
      CREATE TABLE users (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        email varchar(254) NOT NULL,
        display_name varchar(80) NOT NULL,
        password_hash text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_users_email UNIQUE (email),
        CONSTRAINT ck_users_email_lower CHECK (email = lower(email))
      )`);
    await q.query(`
      CREATE TABLE cellars (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        name varchar(80) NOT NULL,
        unit_system varchar(8) NOT NULL DEFAULT 'metric' CHECK (unit_system IN ('metric', 'us')),
        time_zone varchar(64) NOT NULL DEFAULT 'UTC',
        sanitised_valid_days integer NOT NULL DEFAULT 7 CHECK (sanitised_valid_days BETWEEN 1 AND 90),
        headspace_warn_percent numeric(5,2) NOT NULL DEFAULT 5 CHECK (headspace_warn_percent BETWEEN 0 AND 50),
        annual_limit_l numeric(10,2) CHECK (annual_limit_l > 0),
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`
      CREATE TABLE memberships (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
        role varchar(8) NOT NULL CHECK (role IN ('keeper', 'hand', 'guest')),
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_memberships_cellar_user UNIQUE (cellar_id, user_id)
      )`);
    await q.query(`CREATE INDEX ix_memberships_user ON memberships (user_id)`);
    // The table connect-pg-simple expects (its table.sql), made here so the schema has one owner.
    await q.query(`
      CREATE TABLE session (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      )`);
    await q.query(`CREATE INDEX ix_session_expire ON session (expire)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE session`);
    await q.query(`DROP TABLE memberships`);
    await q.query(`DROP TABLE cellars`);
    await q.query(`DROP TABLE users`);
  }
}
