import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Ageing plans and dated tasks. Tasks are computed from a batch's plan and journal on read;
 * only what people do to a task is stored (done, snoozed, dismissed, keyed by the task's
 * stable key), plus one-off tasks added by hand. A member's calendar feed is a hashed token.
 */
export class CreatePlansAndTasks1796170300000 implements MigrationInterface {
  name = 'CreatePlansAndTasks1796170300000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE plans (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        name varchar(80) NOT NULL,
        default_for text[] NOT NULL DEFAULT '{}',
        rules jsonb NOT NULL CHECK (jsonb_typeof(rules) = 'array'),
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_plans_cellar_name UNIQUE (cellar_id, name)
      )`);
    // A cellar's default plans are written once; deleting them later does not bring them back.
    await q.query(`
      CREATE TABLE plan_seedings (
        cellar_id uuid PRIMARY KEY REFERENCES cellars(id) ON DELETE CASCADE,
        seeded_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`ALTER TABLE batches ADD COLUMN plan_id uuid REFERENCES plans(id) ON DELETE SET NULL`);
    await q.query(`
      CREATE TABLE one_off_tasks (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        title varchar(80) NOT NULL,
        due_on date NOT NULL,
        show_days_ahead integer NOT NULL DEFAULT 3 CHECK (show_days_ahead BETWEEN 0 AND 90),
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX ix_one_off_tasks_batch ON one_off_tasks (batch_id)`);
    await q.query(`CREATE INDEX ix_one_off_tasks_cellar ON one_off_tasks (cellar_id, due_on)`);
    await q.query(`
      CREATE TABLE task_states (
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        task_key varchar(200) NOT NULL,
        status varchar(12) NOT NULL CHECK (status IN ('done', 'snoozed', 'dismissed')),
        snoozed_until date,
        reason varchar(200) NOT NULL DEFAULT '',
        by_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
        at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (cellar_id, task_key),
        CONSTRAINT ck_task_states_snooze CHECK ((status = 'snoozed') = (snoozed_until IS NOT NULL))
      )`);
    await q.query(`CREATE INDEX ix_task_states_batch ON task_states (batch_id)`);
    await q.query(`
      CREATE TABLE calendar_feeds (
        user_id uuid PRIMARY KEY REFERENCES users(id) ON DELETE CASCADE,
        token_hash bytea NOT NULL UNIQUE,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE calendar_feeds`);
    await q.query(`DROP TABLE task_states`);
    await q.query(`DROP TABLE one_off_tasks`);
    await q.query(`ALTER TABLE batches DROP COLUMN plan_id`);
    await q.query(`DROP TABLE plan_seedings`);
    await q.query(`DROP TABLE plans`);
  }
}
