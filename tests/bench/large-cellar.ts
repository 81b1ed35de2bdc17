/**
 * The large cellar of the speed benches (bench:api, bench:scan), made with SQL in a few
 * multi-row statements: 2,000 vessels in 2,000 shelf slots (20 racks × 10 shelves × 10 slots),
 * 1,000 batches of which those still in the cellar sit in one vessel each, and 50,000 journal
 * readings. Signs in as bench@example.test / bench-password (a Keeper).
 */
import { performance } from 'node:perf_hooks';
import type { DataSource } from 'typeorm';
import { hashPassword } from '../../server/accounts/passwords';

const RACKS = 20;
const SHELVES_PER_RACK = 10;
const SLOTS_PER_SHELF = 10;
const VESSELS = RACKS * SHELVES_PER_RACK * SLOTS_PER_SHELF;
const BATCHES = 1000;
const ENTRIES_PER_BATCH = 50;

export const BENCH_EMAIL = 'bench@example.test';
export const BENCH_PASSWORD = 'bench-password';

export interface LargeCellar {
  cellarId: string;
  /** A vessel holding a batch: its id, label code and batch. */
  vesselId: string;
  code: string;
  batchId: string;
  /** The first shelf of the first rack (ten vessels). */
  shelfId: string;
}

export async function seedLargeCellar(ds: DataSource): Promise<LargeCellar> {
  const seedStart = performance.now();
  const [{ id: userId }] = await ds.query(`INSERT INTO users (email, display_name, password_hash) VALUES ($2, 'Bench Keeper', $1) RETURNING id`, [
    await hashPassword(BENCH_PASSWORD),
    BENCH_EMAIL,
  ]);
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name) VALUES ('Large test cellar') RETURNING id`);
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, userId]);
  await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, og, stage, last_racked_at, last_reading_sg, last_reading_at)
   SELECT $1, 'Batch ' || i || CASE WHEN i % 3 = 0 THEN ' melomel' ELSE ' traditional' END,
          CASE WHEN i % 3 = 0 THEN 'melomel' ELSE 'traditional-mead' END, 'Bench yeast', 14, 20,
          (now() - (i % 900) * interval '1 day')::date, 1.100,
          (ARRAY['primary','secondary','bulk-ageing','bottled','finished'])[1 + i % 5],
          CASE WHEN i % 2 = 0 THEN now() - (i % 200) * interval '1 day' END, 1.010, now() - (i % 30) * interval '1 day'
     FROM generate_series(1, $2::int) i`,
    [cellarId, BATCHES],
  );
  await ds.query(
    `INSERT INTO vessels (cellar_id, code, name, kind, material, capacity_l, cleaning_state, sanitised_at)
   SELECT $1, translate(upper(lpad(to_hex(i), 8, '0')), '01', 'XY'), 'Vessel ' || i, 'carboy', 'glass', 4.5 + (i % 5) * 5,
          (ARRAY['dirty','clean','sanitised'])[1 + i % 3], CASE WHEN i % 3 = 2 THEN now() - (i % 14) * interval '1 day' END
     FROM generate_series(1, $2::int) i`,
    [cellarId, VESSELS],
  );
  // Every batch still in the cellar sits in one vessel.
  await ds.query(
    `WITH b AS (SELECT id, row_number() OVER (ORDER BY id) n FROM batches WHERE cellar_id = $1 AND stage IN ('primary','secondary','bulk-ageing')),
        v AS (SELECT id, row_number() OVER (ORDER BY id) n FROM vessels WHERE cellar_id = $1)
   UPDATE vessels SET batch_id = b.id, volume_l = 4, filled_at = now() FROM b JOIN v ON v.n = b.n WHERE vessels.id = v.id`,
    [cellarId],
  );
  // Racks × shelves × slots, one vessel in each slot.
  await ds.query(`INSERT INTO racks (cellar_id, name) SELECT $1, 'Rack ' || lpad(r::text, 2, '0') FROM generate_series(1, $2::int) r`, [
    cellarId,
    RACKS,
  ]);
  await ds.query(
    `INSERT INTO shelves (rack_id, number, slot_count) SELECT r.id, n, $2 FROM racks r, generate_series(1, $3::int) n WHERE r.cellar_id = $1`,
    [cellarId, SLOTS_PER_SHELF, SHELVES_PER_RACK],
  );
  await ds.query(
    `WITH slots AS (SELECT s.id AS shelf_id, k AS slot, row_number() OVER (ORDER BY s.id, k) n
                    FROM shelves s JOIN racks r ON r.id = s.rack_id, generate_series(1, s.slot_count) k WHERE r.cellar_id = $1),
        v AS (SELECT id, row_number() OVER (ORDER BY id) n FROM vessels WHERE cellar_id = $1)
   INSERT INTO placements (cellar_id, shelf_id, slot, vessel_id) SELECT $1, slots.shelf_id, slots.slot, v.id FROM slots JOIN v ON v.n = slots.n`,
    [cellarId],
  );
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
   SELECT $1, b.id, 'reading',
          jsonb_build_object('kind','reading','sg',1.1 - k * 0.0015,'temperatureC',null,'calibrationC',20,'correctedSg',1.1 - k * 0.0015,'ph',null,'vesselId',null),
          now() - ($3 - k) * interval '1 day', $2
     FROM batches b, generate_series(1, $3::int) k WHERE b.cellar_id = $1`,
    [cellarId, userId, ENTRIES_PER_BATCH],
  );
  await ds.query('ANALYZE');
  console.log(
    `Seeded ${BATCHES} batches, ${VESSELS} vessels in ${VESSELS} slots, ${BATCHES * ENTRIES_PER_BATCH} journal entries in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`,
  );

  const [{ batchId, vesselId, code }] = await ds.query(
    `SELECT v.batch_id AS "batchId", v.id AS "vesselId", v.code FROM vessels v WHERE v.cellar_id = $1 AND v.batch_id IS NOT NULL ORDER BY v.name LIMIT 1`,
    [cellarId],
  );
  const [{ shelfId }] = await ds.query(
    `SELECT s.id AS "shelfId" FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE r.cellar_id = $1 ORDER BY r.name, s.number LIMIT 1`,
    [cellarId],
  );
  return { cellarId, vesselId, code, batchId, shelfId };
}
