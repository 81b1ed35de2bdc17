import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each batch's computed tasks, kept for the day they were worked out on, so the Tasks list of a
 * large cellar is one sorted SQL page instead of every batch's journal through the rule engine.
 *
 * They are a cache and never the record. With every change to what a batch's tasks are computed
 * from (its journal, stage, start, kind and plan; the cellar's plans and time zone; what people
 * did to its tasks; its one-off tasks) the triggers below, in the same transaction, raise its
 * `inputs_version` and clear `computed_for`, so no service can forget to. A snapshot counts only
 * while `computed_for` is the cellar's today; a refresh stores one only if `inputs_version` is
 * still the one it read before computing. A whole-cellar archive leaves them out, and a restore
 * makes them again.
 */
export class CreateTaskSnapshots1796171500000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE task_snapshots (
        batch_id uuid PRIMARY KEY REFERENCES batches(id) ON DELETE CASCADE,
        inputs_version bigint NOT NULL DEFAULT 1,
        computed_for date,
        -- Its overdue and today's tasks, for a list's count without reading every row.
        overdue_count integer NOT NULL DEFAULT 0,
        today_count integer NOT NULL DEFAULT 0
      )`);
    // What a list filters, sorts and counts on, worked out for the snapshot's day (bucket: 0
    // overdue, 1 today, 2 upcoming, 3 done; closed_order: when it was closed, for done work;
    // sort_on: the day it is due or snoozed to), kept narrow so a page reads little. The tasks on
    // a page are then worked out again for their few batches, as the list sends them.
    await q.query(`
      CREATE TABLE snapshot_tasks (
        batch_id uuid NOT NULL REFERENCES task_snapshots(batch_id) ON DELETE CASCADE,
        cellar_id uuid NOT NULL,
        task_key varchar(200) COLLATE "C" NOT NULL,
        bucket smallint NOT NULL,
        closed_order text COLLATE "C",
        sort_on date NOT NULL,
        due_on date NOT NULL,
        repeats boolean NOT NULL,
        PRIMARY KEY (batch_id, task_key)
      )`);
    // A page walks one bucket of one cellar in the list's order and stops when it is full.
    await q.query(`CREATE INDEX ix_snapshot_tasks_page ON snapshot_tasks (cellar_id, bucket, closed_order DESC NULLS LAST, sort_on, task_key)`);
    // Marks the batches' snapshots out of date (creating the row for a batch that has none), in
    // batch order so two writers touching several batches lock them in the same order.
    await q.query(`
      CREATE FUNCTION cw_task_inputs_changed(batch_ids uuid[]) RETURNS void LANGUAGE sql AS $$
        INSERT INTO task_snapshots (batch_id)
        SELECT b.id FROM batches b WHERE b.id = ANY(batch_ids) ORDER BY b.id
        ON CONFLICT (batch_id) DO UPDATE SET inputs_version = task_snapshots.inputs_version + 1, computed_for = NULL
      $$`);
    // Tables with a batch_id: one call per statement, whatever the number of rows (an import).
    await q.query(`
      CREATE FUNCTION cw_task_rows_changed() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM cw_task_inputs_changed(ARRAY(SELECT DISTINCT batch_id FROM changed_rows WHERE batch_id IS NOT NULL));
        RETURN NULL;
      END $$`);
    for (const table of ['journal_entries', 'task_states', 'one_off_tasks']) {
      for (const [event, rows] of [
        ['INSERT', 'NEW'],
        ['UPDATE', 'NEW'],
        ['DELETE', 'OLD'],
      ] as const) {
        await q.query(
          `CREATE TRIGGER tr_${table}_tasks_${event.toLowerCase()} AFTER ${event} ON ${table}
             REFERENCING ${rows} TABLE AS changed_rows FOR EACH STATEMENT EXECUTE FUNCTION cw_task_rows_changed()`,
        );
      }
    }
    await q.query(`
      CREATE FUNCTION cw_task_batch_changed() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM cw_task_inputs_changed(ARRAY[NEW.id]);
        RETURN NULL;
      END $$`);
    // A new batch gets its row at once, so the refresh only ever updates rows (never inserts).
    await q.query(`CREATE TRIGGER tr_batches_tasks_insert AFTER INSERT ON batches FOR EACH ROW EXECUTE FUNCTION cw_task_batch_changed()`);
    await q.query(`INSERT INTO task_snapshots (batch_id) SELECT id FROM batches ORDER BY id`);
    await q.query(`
      CREATE TRIGGER tr_batches_tasks AFTER UPDATE ON batches FOR EACH ROW
        WHEN (OLD.stage IS DISTINCT FROM NEW.stage OR OLD.started_on IS DISTINCT FROM NEW.started_on
              OR OLD.kind IS DISTINCT FROM NEW.kind OR OLD.plan_id IS DISTINCT FROM NEW.plan_id)
        EXECUTE FUNCTION cw_task_batch_changed()`);
    // A plan or the time zone changes the tasks of every batch of the cellar.
    await q.query(`
      CREATE FUNCTION cw_task_cellar_changed() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE
        cellar uuid;
      BEGIN
        IF TG_TABLE_NAME = 'cellars' THEN cellar := NEW.id;
        ELSIF TG_OP = 'DELETE' THEN cellar := OLD.cellar_id;
        ELSE cellar := NEW.cellar_id;
        END IF;
        PERFORM cw_task_inputs_changed(ARRAY(SELECT id FROM batches WHERE cellar_id = cellar));
        RETURN NULL;
      END $$`);
    await q.query(`CREATE TRIGGER tr_plans_tasks AFTER INSERT OR UPDATE OR DELETE ON plans FOR EACH ROW EXECUTE FUNCTION cw_task_cellar_changed()`);
    await q.query(`
      CREATE TRIGGER tr_cellars_tasks AFTER UPDATE ON cellars FOR EACH ROW
        WHEN (OLD.time_zone IS DISTINCT FROM NEW.time_zone) EXECUTE FUNCTION cw_task_cellar_changed()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER tr_cellars_tasks ON cellars`);
    await q.query(`DROP TRIGGER tr_plans_tasks ON plans`);
    await q.query(`DROP TRIGGER tr_batches_tasks ON batches`);
    await q.query(`DROP TRIGGER tr_batches_tasks_insert ON batches`);
    for (const table of ['journal_entries', 'task_states', 'one_off_tasks']) {
      for (const event of ['insert', 'update', 'delete']) await q.query(`DROP TRIGGER tr_${table}_tasks_${event} ON ${table}`);
    }
    await q.query(`DROP FUNCTION cw_task_cellar_changed()`);
    await q.query(`DROP FUNCTION cw_task_batch_changed()`);
    await q.query(`DROP FUNCTION cw_task_rows_changed()`);
    await q.query(`DROP FUNCTION cw_task_inputs_changed(uuid[])`);
    await q.query(`DROP TABLE snapshot_tasks`);
    await q.query(`DROP TABLE task_snapshots`);
  }
}
