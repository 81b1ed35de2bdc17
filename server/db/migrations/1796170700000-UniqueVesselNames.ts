import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Vessel names are unique in a cellar, letter case aside (as the vessels service already
 * checks): a label or a journal line must name one vessel. Names that clash already (kept
 * before this rule) get the first 8 characters of their id appended, the oldest keeping its own.
 */
export class UniqueVesselNames1796170700000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      WITH ranked AS (
        SELECT id, row_number() OVER (PARTITION BY cellar_id, lower(name) ORDER BY created_at, id) AS n FROM vessels
      )
      UPDATE vessels v SET name = left(v.name, 50) || ' ' || left(v.id::text, 8), version = v.version + 1, updated_at = now()
        FROM ranked r WHERE r.id = v.id AND r.n > 1`);
    await q.query(`CREATE UNIQUE INDEX uq_vessels_cellar_name ON vessels (cellar_id, lower(name))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX uq_vessels_cellar_name`);
  }
}
