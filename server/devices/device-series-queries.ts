import type { EntityManager } from 'typeorm';
import { HOURLY_WINDOW_DAYS, RAW_WINDOW_HOURS, type DevicePoint } from '../../shared/schemas/devices';
import type { DeviceDayFigures } from '../../shared/domain/device-day-line';

/**
 * A batch's device readings thinned in SQL, so the page gets a few hundred points however many
 * thousand readings there are: every reading of the last RAW_WINDOW_HOURS, hourly averages up
 * to HOURLY_WINDOW_DAYS, daily averages (local days of the cellar) beyond. Each point sits at
 * the mean moment of the readings it stands for. One pass over the batch's index range.
 */
export async function thinnedPoints(tx: EntityManager, cellarId: string, batchId: string, now: Date, timeZone: string): Promise<DevicePoint[]> {
  const rows: { at: Date; sg: number; temperatureC: number | null; count: number; resolution: DevicePoint['resolution'] }[] = await tx.query(
    `WITH r AS (
       SELECT taken_at, sg, temperature_c,
              CASE WHEN taken_at >= $3::timestamptz - make_interval(hours => $5) THEN 'reading'
                   WHEN taken_at >= $3::timestamptz - make_interval(days => $6) THEN 'hour'
                   ELSE 'day' END AS resolution
         FROM device_readings WHERE batch_id = $2 AND cellar_id = $1)
     SELECT resolution, to_timestamp(avg(extract(epoch FROM taken_at))) AS at,
            round(avg(sg), 4)::float8 AS sg, round(avg(temperature_c), 2)::float8 AS "temperatureC", count(*)::int AS count
       FROM r
      GROUP BY resolution,
               CASE resolution WHEN 'reading' THEN taken_at
                               WHEN 'hour' THEN date_trunc('hour', taken_at)
                               ELSE date_trunc('day', taken_at, $4) END
      ORDER BY at`,
    [cellarId, batchId, now, timeZone, RAW_WINDOW_HOURS, HOURLY_WINDOW_DAYS],
  );
  return rows.map((r) => ({ at: r.at.toISOString(), sg: r.sg, temperatureC: r.temperatureC, count: r.count, resolution: r.resolution }));
}

/** A batch's device readings by local day of the cellar, newest day first: count, first and last gravity, temperature range. */
export async function deviceDays(tx: EntityManager, cellarId: string, batchId: string, timeZone: string): Promise<DeviceDayFigures[]> {
  return tx.query(
    `SELECT (taken_at AT TIME ZONE $3)::date::text AS day, count(*)::int AS count,
            ((array_agg(sg ORDER BY taken_at))[1])::float8 AS "firstSg",
            ((array_agg(sg ORDER BY taken_at DESC))[1])::float8 AS "lastSg",
            min(temperature_c)::float8 AS "minTemperatureC", max(temperature_c)::float8 AS "maxTemperatureC"
       FROM device_readings WHERE batch_id = $2 AND cellar_id = $1
      GROUP BY 1 ORDER BY 1 DESC`,
    [cellarId, batchId, timeZone],
  );
}
