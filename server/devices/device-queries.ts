import type { EntityManager } from 'typeorm';
import type { Device } from '../../shared/schemas/devices';
import { NotFoundError } from '../http/errors';

const DEVICE_COLUMNS = `
  d.id, d.name, d.created_at AS "createdAt", d.revoked_at AS "revokedAt",
  CASE WHEN d.token_hash IS NULL THEN NULL ELSE d.token_end END AS "tokenEnd",
  v.id AS "vesselId", v.name AS "vesselName", b.id AS "batchId", b.name AS "batchName",
  (SELECT max(r.taken_at) FROM device_readings r WHERE r.device_id = d.id) AS "lastReadingAt"`;

const DEVICE_FROM = `
  FROM devices d
  LEFT JOIN vessels v ON v.id = d.vessel_id
  LEFT JOIN batches b ON b.id = v.batch_id`;

interface DeviceRow {
  id: string;
  name: string;
  createdAt: Date;
  revokedAt: Date | null;
  tokenEnd: string | null;
  vesselId: string | null;
  vesselName: string | null;
  batchId: string | null;
  batchName: string | null;
  lastReadingAt: Date | null;
}

const toDevice = (r: DeviceRow): Device => ({
  id: r.id,
  name: r.name,
  vessel: r.vesselId ? { id: r.vesselId, name: r.vesselName ?? '' } : null,
  batch: r.batchId ? { id: r.batchId, name: r.batchName ?? '' } : null,
  tokenEnd: r.tokenEnd,
  createdAt: r.createdAt.toISOString(),
  revokedAt: r.revokedAt?.toISOString() ?? null,
  lastReadingAt: r.lastReadingAt?.toISOString() ?? null,
});

/** A cellar's devices, working ones first, then by name. */
export async function devicesOf(tx: EntityManager, cellarId: string): Promise<Device[]> {
  const rows: DeviceRow[] = await tx.query(
    `SELECT ${DEVICE_COLUMNS} ${DEVICE_FROM} WHERE d.cellar_id = $1 ORDER BY (d.revoked_at IS NOT NULL), d.name, d.id`,
    [cellarId],
  );
  return rows.map(toDevice);
}

/** One device of the cellar; 404 when it is another cellar's or does not exist. */
export async function deviceOf(tx: EntityManager, cellarId: string, deviceId: string): Promise<Device> {
  const [row]: DeviceRow[] = await tx.query(`SELECT ${DEVICE_COLUMNS} ${DEVICE_FROM} WHERE d.cellar_id = $1 AND d.id = $2`, [cellarId, deviceId]);
  if (!row) throw new NotFoundError('No such device in this cellar.');
  return toDevice(row);
}

/** A vessel of the cellar a device can be put in (not retired); 404 otherwise. */
export async function deviceVessel(tx: EntityManager, cellarId: string, vesselId: string): Promise<{ id: string; name: string }> {
  const [vessel]: { id: string; name: string }[] = await tx.query(
    `SELECT id, name FROM vessels WHERE cellar_id = $1 AND id = $2 AND retired_at IS NULL`,
    [cellarId, vesselId],
  );
  if (!vessel) throw new NotFoundError('No such vessel in use in this cellar.');
  return vessel;
}
