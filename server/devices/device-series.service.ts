import type { EntityManager } from 'typeorm';
import { deviceDayLine } from '../../shared/domain/device-day-line';
import type { DeviceSeries } from '../../shared/schemas/devices';
import { findBatch } from '../batches/batch-lookup';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { deviceDays, thinnedPoints } from './device-series-queries';

/**
 * A batch's device readings for its page: the thinned series for the gravity chart and one
 * summary per local day for the journal. Read fresh on every request (no cache), so a reading
 * shows on the very next GET.
 */
export async function getDeviceSeries(actor: Actor, tx: EntityManager, batchId: string, now: Date = new Date()): Promise<DeviceSeries> {
  requireRole(actor, 'guest');
  await findBatch(tx, actor.cellarId, batchId);
  const cellar = await loadCellar(tx, actor.cellarId);
  const [points, days] = [
    await thinnedPoints(tx, actor.cellarId, batchId, now, cellar.timeZone),
    await deviceDays(tx, actor.cellarId, batchId, cellar.timeZone),
  ];
  return { points, days: days.map((d) => ({ ...d, line: deviceDayLine(d, cellar.unitSystem) })) };
}
