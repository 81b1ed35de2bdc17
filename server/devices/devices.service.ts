import type { EntityManager } from 'typeorm';
import type { Device, DeviceCreate, DeviceMove, DeviceWithToken } from '../../shared/schemas/devices';
import { recordAudit } from '../audit/audit-log';
import { requireRole, type Actor } from '../core/actor';
import { ConflictError } from '../http/errors';
import { deviceOf, devicesOf, deviceVessel } from './device-queries';
import { hashToken, newDeviceToken, tokenEnd } from './device-tokens';

/** The cellar's digital hydrometers, revoked ones last. Keepers only: it is device administration. */
export async function listDevices(actor: Actor, tx: EntityManager): Promise<Device[]> {
  requireRole(actor, 'keeper');
  return devicesOf(tx, actor.cellarId);
}

/**
 * Lets a new device in, bound to a vessel: its readings go to whatever batch is in that vessel.
 * The token is in this answer only.
 */
export async function createDevice(actor: Actor, tx: EntityManager, input: DeviceCreate): Promise<DeviceWithToken> {
  requireRole(actor, 'keeper');
  const vessel = await deviceVessel(tx, actor.cellarId, input.vesselId);
  const token = newDeviceToken();
  const [{ id }]: { id: string }[] = await tx.query(
    `INSERT INTO devices (cellar_id, vessel_id, name, token_hash, token_end, created_by) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [actor.cellarId, vessel.id, input.name, hashToken(token), tokenEnd(token), actor.userId],
  );
  await recordAudit(tx, actor, {
    kind: 'vessel',
    action: 'device added',
    vesselId: vessel.id,
    summary: `Hydrometer ${input.name} put in ${vessel.name}`,
  });
  return { device: await deviceOf(tx, actor.cellarId, id), token };
}

/** Puts a device in another vessel: from now on its readings go to that vessel's batch. */
export async function moveDevice(actor: Actor, tx: EntityManager, deviceId: string, input: DeviceMove): Promise<Device> {
  requireRole(actor, 'keeper');
  const device = await deviceOf(tx, actor.cellarId, deviceId);
  if (device.revokedAt) throw new ConflictError(`${device.name} was revoked; add it again with a new token.`);
  const vessel = await deviceVessel(tx, actor.cellarId, input.vesselId);
  await tx.query(`UPDATE devices SET vessel_id = $3 WHERE cellar_id = $1 AND id = $2`, [actor.cellarId, deviceId, vessel.id]);
  await recordAudit(tx, actor, {
    kind: 'vessel',
    action: 'device moved',
    vesselId: vessel.id,
    summary: `Hydrometer ${device.name} moved ${device.vessel ? `from ${device.vessel.name} ` : ''}to ${vessel.name}`,
  });
  return deviceOf(tx, actor.cellarId, deviceId);
}

/** Revokes a device's token at once: its posts answer 401 from now on. Its readings stay. */
export async function revokeDevice(actor: Actor, tx: EntityManager, deviceId: string): Promise<Device> {
  requireRole(actor, 'keeper');
  const device = await deviceOf(tx, actor.cellarId, deviceId);
  if (device.revokedAt) return device;
  await tx.query(`UPDATE devices SET revoked_at = now(), token_hash = NULL WHERE cellar_id = $1 AND id = $2`, [actor.cellarId, deviceId]);
  await recordAudit(tx, actor, {
    kind: 'vessel',
    action: 'device revoked',
    vesselId: device.vessel?.id,
    summary: `Hydrometer ${device.name} revoked`,
  });
  return deviceOf(tx, actor.cellarId, deviceId);
}
