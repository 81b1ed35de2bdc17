import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Places, vessels, batches with their append-only journal, photos, bottle lots and cases.
 * Rules that must hold whatever the code does are constraints here: one thing per slot,
 * one slot per thing, bottle counts never below zero, journal entries never rewritten.
 */
export class CreateCellarRecords1796170100000 implements MigrationInterface {
  name = 'CreateCellarRecords1796170100000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE racks (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        name varchar(60) NOT NULL,
        description varchar(200) NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_racks_cellar_name UNIQUE (cellar_id, name)
      )`);
    await q.query(`
      CREATE TABLE shelves (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        rack_id uuid NOT NULL REFERENCES racks(id) ON DELETE CASCADE,
        number integer NOT NULL CHECK (number >= 1),
        slot_count integer NOT NULL CHECK (slot_count BETWEEN 1 AND 60),
        CONSTRAINT uq_shelves_rack_number UNIQUE (rack_id, number)
      )`);
    await q.query(`
      CREATE TABLE batches (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        name varchar(80) NOT NULL,
        kind varchar(24) NOT NULL,
        ingredients jsonb NOT NULL DEFAULT '[]',
        yeast_name varchar(80) NOT NULL,
        yeast_tolerance_abv numeric(4,1) NOT NULL CHECK (yeast_tolerance_abv BETWEEN 3 AND 22),
        planned_volume_l numeric(10,3) NOT NULL CHECK (planned_volume_l > 0),
        started_on date NOT NULL,
        og numeric(5,3) CHECK (og BETWEEN 0.980 AND 1.200),
        target_sweetness varchar(12),
        notes text NOT NULL DEFAULT '',
        stage varchar(12) NOT NULL DEFAULT 'primary'
          CHECK (stage IN ('primary', 'secondary', 'bulk-ageing', 'bottled', 'finished')),
        last_racked_at timestamptz,
        last_reading_sg numeric(5,3),
        last_reading_at timestamptz,
        created_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX ix_batches_cellar_started ON batches (cellar_id, started_on DESC)`);
    await q.query(`CREATE INDEX ix_batches_cellar_stage ON batches (cellar_id, stage)`);
    await q.query(`
      CREATE TABLE batch_parents (
        child_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        parent_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        volume_l numeric(10,3) NOT NULL CHECK (volume_l > 0),
        PRIMARY KEY (child_id, parent_id),
        CHECK (child_id <> parent_id)
      )`);
    await q.query(`CREATE INDEX ix_batch_parents_parent ON batch_parents (parent_id)`);
    await q.query(`
      CREATE TABLE vessels (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        code varchar(8) NOT NULL,
        name varchar(60) NOT NULL,
        kind varchar(12) NOT NULL,
        material varchar(12) NOT NULL,
        capacity_l numeric(10,3) NOT NULL CHECK (capacity_l > 0),
        cleaning_state varchar(10) NOT NULL DEFAULT 'dirty' CHECK (cleaning_state IN ('dirty', 'clean', 'sanitised')),
        sanitised_at timestamptz,
        retired_at timestamptz,
        batch_id uuid REFERENCES batches(id) ON DELETE SET NULL,
        volume_l numeric(10,3),
        filled_at timestamptz,
        notes varchar(500) NOT NULL DEFAULT '',
        version integer NOT NULL DEFAULT 1,
        created_at timestamptz NOT NULL DEFAULT now(),
        updated_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_vessels_code UNIQUE (code),
        CONSTRAINT ck_vessels_contents CHECK ((batch_id IS NULL) = (volume_l IS NULL) AND (batch_id IS NULL) = (filled_at IS NULL)),
        CONSTRAINT ck_vessels_volume CHECK (volume_l IS NULL OR (volume_l > 0 AND volume_l <= capacity_l)),
        CONSTRAINT ck_vessels_retired_empty CHECK (retired_at IS NULL OR batch_id IS NULL)
      )`);
    await q.query(`CREATE INDEX ix_vessels_cellar ON vessels (cellar_id, name)`);
    await q.query(`CREATE INDEX ix_vessels_batch ON vessels (batch_id) WHERE batch_id IS NOT NULL`);
    await q.query(`
      CREATE TABLE journal_entries (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        kind varchar(16) NOT NULL,
        payload jsonb NOT NULL,
        occurred_at timestamptz NOT NULL,
        recorded_at timestamptz NOT NULL DEFAULT now(),
        author_id uuid REFERENCES users(id) ON DELETE SET NULL,
        amends_entry_id uuid REFERENCES journal_entries(id) ON DELETE CASCADE
      )`);
    await q.query(`CREATE INDEX ix_journal_batch_time ON journal_entries (batch_id, occurred_at, recorded_at)`);
    await q.query(`CREATE INDEX ix_journal_amends ON journal_entries (amends_entry_id) WHERE amends_entry_id IS NOT NULL`);
    // Append-only: a correction is a new entry, never an UPDATE.
    await q.query(`
      CREATE FUNCTION journal_entries_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        RAISE EXCEPTION 'journal entries are append-only; add an amendment instead';
      END $$`);
    await q.query(`
      CREATE TRIGGER tr_journal_entries_append_only BEFORE UPDATE ON journal_entries
      FOR EACH ROW EXECUTE FUNCTION journal_entries_append_only()`);
    await q.query(`
      CREATE TABLE photos (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        mime_type varchar(16) NOT NULL CHECK (mime_type IN ('image/jpeg', 'image/png', 'image/webp')),
        byte_size integer NOT NULL CHECK (byte_size > 0 AND byte_size <= 10485760),
        data bytea NOT NULL,
        thumbnail bytea NOT NULL,
        uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
    await q.query(`CREATE INDEX ix_photos_batch ON photos (batch_id)`);
    await q.query(`
      CREATE TABLE bottle_lots (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        batch_id uuid NOT NULL REFERENCES batches(id) ON DELETE CASCADE,
        code varchar(8) NOT NULL,
        bottled_on date NOT NULL,
        bottle_ml integer NOT NULL CHECK (bottle_ml BETWEEN 50 AND 5000),
        bottle_count integer NOT NULL CHECK (bottle_count > 0),
        closure varchar(16) NOT NULL,
        carbonation varchar(10) NOT NULL CHECK (carbonation IN ('still', 'sparkling')),
        sulfite_added boolean NOT NULL,
        abv_estimate numeric(4,1),
        note varchar(500) NOT NULL DEFAULT '',
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_bottle_lots_code UNIQUE (code)
      )`);
    await q.query(`CREATE INDEX ix_bottle_lots_cellar ON bottle_lots (cellar_id, bottled_on DESC)`);
    await q.query(`
      CREATE TABLE bottle_cases (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        lot_id uuid NOT NULL REFERENCES bottle_lots(id) ON DELETE CASCADE,
        code varchar(8) NOT NULL,
        number integer NOT NULL CHECK (number >= 1),
        bottles_initial integer NOT NULL CHECK (bottles_initial > 0),
        bottles_left integer NOT NULL CHECK (bottles_left >= 0 AND bottles_left <= bottles_initial),
        version integer NOT NULL DEFAULT 1,
        CONSTRAINT uq_bottle_cases_code UNIQUE (code),
        CONSTRAINT uq_bottle_cases_lot_number UNIQUE (lot_id, number)
      )`);
    await q.query(`
      CREATE TABLE bottle_departures (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        case_id uuid NOT NULL REFERENCES bottle_cases(id) ON DELETE CASCADE,
        count integer NOT NULL CHECK (count > 0),
        reason varchar(12) NOT NULL CHECK (reason IN ('drunk', 'gift', 'sold', 'competition', 'broken')),
        note varchar(300) NOT NULL DEFAULT '',
        occurred_at timestamptz NOT NULL DEFAULT now(),
        author_id uuid REFERENCES users(id) ON DELETE SET NULL
      )`);
    await q.query(`CREATE INDEX ix_bottle_departures_case ON bottle_departures (case_id, occurred_at)`);
    // One thing per slot and one slot per thing, whatever the code does.
    await q.query(`
      CREATE TABLE placements (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        cellar_id uuid NOT NULL REFERENCES cellars(id) ON DELETE CASCADE,
        shelf_id uuid NOT NULL REFERENCES shelves(id) ON DELETE CASCADE,
        slot integer NOT NULL CHECK (slot >= 1),
        vessel_id uuid REFERENCES vessels(id) ON DELETE CASCADE,
        case_id uuid REFERENCES bottle_cases(id) ON DELETE CASCADE,
        placed_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT uq_placements_slot UNIQUE (shelf_id, slot),
        CONSTRAINT uq_placements_vessel UNIQUE (vessel_id),
        CONSTRAINT uq_placements_case UNIQUE (case_id),
        CONSTRAINT ck_placements_one_thing CHECK (num_nonnulls(vessel_id, case_id) = 1)
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE placements`);
    await q.query(`DROP TABLE bottle_departures`);
    await q.query(`DROP TABLE bottle_cases`);
    await q.query(`DROP TABLE bottle_lots`);
    await q.query(`DROP TABLE photos`);
    await q.query(`DROP TABLE journal_entries`);
    await q.query(`DROP FUNCTION journal_entries_append_only()`);
    await q.query(`DROP TABLE vessels`);
    await q.query(`DROP TABLE batch_parents`);
    await q.query(`DROP TABLE batches`);
    await q.query(`DROP TABLE shelves`);
    await q.query(`DROP TABLE racks`);
  }
}
