import type { EntityManager } from 'typeorm';
import type { DeviceReading, IngestAnswer } from '../../shared/schemas/devices';
import { requireRole, type Actor } from '../core/actor';
import { BadRequestError, ConflictError, NotFoundError } from '../http/errors';
import { appendDeviceReading } from '../journal/device-readings';

interface Target {
  deviceName: string;
  vesselName: string | null;
  batchId: string | null;
  batchStart: Date | null;
}

/** Where a device's reading goes now: the batch in its vessel, and when that batch started (local midnight). */
async function targetOf(tx: EntityManager, cellarId: string, deviceId: string): Promise<Target> {
  const [row]: Target[] = await tx.query(
    `SELECT d.name AS "deviceName", v.name AS "vesselName", b.id AS "batchId",
            (b.started_on::timestamp AT TIME ZONE c.time_zone) AS "batchStart"
       FROM devices d JOIN cellars c ON c.id = d.cellar_id
       LEFT JOIN vessels v ON v.id = d.vessel_id
       LEFT JOIN batches b ON b.id = v.batch_id
      WHERE d.cellar_id = $1 AND d.id = $2 AND d.revoked_at IS NULL`,
    [cellarId, deviceId],
  );
  if (!row) throw new NotFoundError('No such device in this cellar.');
  return row;
}

/**
 * Keeps one reading a device posted, on the batch in the device's vessel, and moves that
 * batch's latest gravity on. A reading this device already sent for the same moment is kept
 * once (the answer says `duplicate`). Runs as the cellar's own device job (a Hand's rights).
 * @param tx - the request's transaction, or (the ingest route) the data source's manager: each statement its own
 * @param receivedAt - when the post arrived: the reading's moment when the device sent none
 */
export async function recordDeviceReading(
  actor: Actor,
  tx: EntityManager,
  deviceId: string,
  reading: DeviceReading,
  receivedAt: Date = new Date(),
): Promise<IngestAnswer> {
  requireRole(actor, 'hand');
  const target = await targetOf(tx, actor.cellarId, deviceId);
  if (!target.batchId || !target.batchStart) {
    const where = target.vesselName ? `${target.vesselName} is empty` : `${target.deviceName} is not in a vessel`;
    throw new ConflictError(`${where}, so there is no batch to give this reading to. Move the device to a vessel with a batch in it.`);
  }
  const takenAt = reading.takenAt ?? receivedAt;
  if (takenAt < target.batchStart) {
    throw new BadRequestError('body.takenAt: the reading is from before the batch in this vessel started', {
      issues: [{ path: 'body.takenAt', message: 'the reading is from before the batch in this vessel started' }],
    });
  }
  const stored = await appendDeviceReading(tx, {
    deviceId,
    cellarId: actor.cellarId,
    batchId: target.batchId,
    takenAt,
    receivedAt,
    sg: reading.sg,
    temperatureC: reading.temperatureC,
    batteryV: reading.batteryV,
    tiltDeg: reading.tiltDeg,
  });
  return { stored, duplicate: !stored, batchId: target.batchId, takenAt: takenAt.toISOString(), sg: reading.sg };
}
