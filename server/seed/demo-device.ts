import type { EntityManager } from 'typeorm';
import type { Actor } from '../core/actor';
import { hashToken, tokenEnd } from '../devices/device-tokens';
import { followDeviceReading } from '../journal/device-readings';

/**
 * The demo hydrometer's token, fixed so the README's curl example works on a fresh clone.
 * Demo only, like the demo password: it is written only when the demo cellar is seeded.
 */
export const DEMO_DEVICE_TOKEN = 'demo-hydrometer-fernhollow-2026';

const READING_EVERY_MS = 15 * 60_000;
const DAYS_OF_READINGS = 4;

/**
 * A hydrometer floating in Fermenter 1 (the traditional ten days into primary), with four days
 * of readings every 15 minutes: gravity falling from about 1.058 towards 1.037 with a little
 * sensor wobble, temperature swinging a degree around 19.5 °C from day to night.
 */
export async function seedDemoDevice(tx: EntityManager, keeper: Actor, now = new Date(), token = DEMO_DEVICE_TOKEN): Promise<void> {
  const [target]: { vesselId: string; batchId: string }[] = await tx.query(
    `SELECT v.id AS "vesselId", v.batch_id AS "batchId" FROM vessels v WHERE v.cellar_id = $1 AND v.name = 'Fermenter 1' AND v.batch_id IS NOT NULL`,
    [keeper.cellarId],
  );
  if (!target) return;
  const [{ id: deviceId }]: { id: string }[] = await tx.query(
    `INSERT INTO devices (cellar_id, vessel_id, name, token_hash, token_end, created_by, created_at)
     VALUES ($1, $2, 'Fermenter 1 float', $3, $4, $5, $6) RETURNING id`,
    [
      keeper.cellarId,
      target.vesselId,
      hashToken(token),
      tokenEnd(token),
      keeper.userId,
      new Date(now.getTime() - (DAYS_OF_READINGS + 1) * 86_400_000),
    ],
  );
  const count = Math.floor((DAYS_OF_READINGS * 86_400_000) / READING_EVERY_MS);
  const last = Math.floor(now.getTime() / READING_EVERY_MS) * READING_EVERY_MS - READING_EVERY_MS;
  const readings = Array.from({ length: count }, (_, i) => {
    const share = i / (count - 1);
    const takenAt = new Date(last - (count - 1 - i) * READING_EVERY_MS);
    const sg = 1.058 - 0.021 * share + 0.0004 * Math.sin(i * 1.7);
    const hourOfDay = takenAt.getUTCHours() + takenAt.getUTCMinutes() / 60;
    const temperatureC = 19.5 + Math.sin(((hourOfDay - 9) / 24) * 2 * Math.PI);
    return { taken_at: takenAt.toISOString(), sg: sg.toFixed(4), temperature_c: temperatureC.toFixed(2), battery_v: (4.1 - share * 0.05).toFixed(2) };
  });
  await tx.query(
    `INSERT INTO device_readings (device_id, cellar_id, batch_id, taken_at, sg, temperature_c, battery_v)
     SELECT $1, $2, $3, r.taken_at, r.sg, r.temperature_c, r.battery_v
       FROM jsonb_to_recordset($4::jsonb) AS r(taken_at timestamptz, sg numeric, temperature_c numeric, battery_v numeric)`,
    [deviceId, keeper.cellarId, target.batchId, JSON.stringify(readings)],
  );
  const latest = readings[readings.length - 1]!;
  await followDeviceReading(tx, target.batchId, { sg: Number(latest.sg), takenAt: new Date(latest.taken_at) });
}
