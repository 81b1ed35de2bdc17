import type { EntityManager } from 'typeorm';

/** One device reading as it is kept (device_readings), SI units, gravity as SG. */
export interface DeviceReadingRow {
  deviceId: string;
  cellarId: string;
  batchId: string;
  takenAt: Date;
  receivedAt: Date;
  sg: number;
  temperatureC: number | null;
  batteryV: number | null;
  tiltDeg: number | null;
}

/**
 * Keeps one device reading and moves its batch's cached latest reading on from it, as
 * `appendEntry` does for a reading in the journal, in ONE statement: atomic even outside a
 * transaction, and the batch row is locked only while the statement runs, never across a round
 * trip to the app (a device batch takes thousands of posts; they must not queue on that row).
 * Only a reading at least as recent as the cached one moves the cache (a late upload of old
 * readings leaves it alone); the stage does not depend on readings. A reading this device
 * already sent for the same moment is kept once.
 * @returns false when it was a duplicate (nothing changed)
 */
export async function appendDeviceReading(db: EntityManager, r: DeviceReadingRow): Promise<boolean> {
  const [{ stored }]: { stored: boolean }[] = await db.query(
    `WITH kept AS (
       INSERT INTO device_readings (device_id, cellar_id, batch_id, taken_at, received_at, sg, temperature_c, battery_v, tilt_deg)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)
       ON CONFLICT (device_id, taken_at) DO NOTHING
       RETURNING batch_id, taken_at, sg),
     cached AS (
       UPDATE batches b SET last_reading_sg = round(kept.sg, 3), last_reading_at = kept.taken_at
         FROM kept WHERE b.id = kept.batch_id AND (b.last_reading_at IS NULL OR b.last_reading_at <= kept.taken_at)
       RETURNING b.id)
     SELECT EXISTS (SELECT 1 FROM kept) AS stored, (SELECT count(*) FROM cached) AS moved`,
    [r.deviceId, r.cellarId, r.batchId, r.takenAt, r.receivedAt, r.sg, r.temperatureC, r.batteryV, r.tiltDeg],
  );
  return stored;
}

/**
 * Moves a batch's cached latest reading on from a device reading already kept (the demo seed's
 * bulk insert): one UPDATE, only when the reading is at least as recent as the cached one.
 */
export async function followDeviceReading(db: EntityManager, batchId: string, reading: { sg: number; takenAt: Date }): Promise<void> {
  await db.query(
    `UPDATE batches SET last_reading_sg = round($2::numeric, 3), last_reading_at = $3
      WHERE id = $1 AND (last_reading_at IS NULL OR last_reading_at <= $3)`,
    [batchId, reading.sg, reading.takenAt],
  );
}

/** A batch's latest device reading (an index look-up), or null: what a corrected journal reading is weighed against. */
export async function latestDeviceReading(db: EntityManager, batchId: string): Promise<{ sg: number; at: Date } | null> {
  const [row]: { sg: number; at: Date }[] = await db.query(
    `SELECT sg::float8 AS sg, taken_at AS at FROM device_readings WHERE batch_id = $1 ORDER BY taken_at DESC LIMIT 1`,
    [batchId],
  );
  return row ?? null;
}
