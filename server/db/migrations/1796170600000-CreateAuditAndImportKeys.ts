import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * `audit_events`: who changed what and when, for changes the journal does not already hold
 * (vessel cleaning, retiring and moves, imports). Append-only like the journal: a trigger
 * refuses every UPDATE except the one a deleted account causes (its id set to NULL).
 *
 * `import_row_keys`: one key per imported CSV row, so importing the same file twice adds
 * nothing the second time.
 */
export class CreateAuditAndImportKeys1796170600000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE audit_events (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
        kind varchar(16) NOT NULL,
        action varchar(40) NOT NULL,
        vessel_id uuid,
        batch_id uuid,
        summary varchar(300) NOT NULL,
        recorded_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX ix_audit_events_cellar_time ON audit_events (cellar_id, recorded_at DESC)`);
    await q.query(`
      CREATE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.actor_id IS NULL AND (to_jsonb(NEW) - 'actor_id') = (to_jsonb(OLD) - 'actor_id') THEN
          RETURN NEW;
        END IF;
        RAISE EXCEPTION 'audit events are append-only';
      END $$`);
    await q.query(`
      CREATE TRIGGER tr_audit_events_append_only BEFORE UPDATE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_append_only()`);
    await q.query(`
      CREATE TABLE import_row_keys (
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        target varchar(60) NOT NULL,
        row_key char(64) NOT NULL,
        imported_at timestamptz NOT NULL DEFAULT now(),
        PRIMARY KEY (cellar_id, target, row_key)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE import_row_keys`);
    await q.query(`DROP TRIGGER tr_audit_events_append_only ON audit_events`);
    await q.query(`DROP FUNCTION audit_events_append_only()`);
    await q.query(`DROP TABLE audit_events`);
  }
}
