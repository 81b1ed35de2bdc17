import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { deviceReadingSchema } from '../../shared/schemas/devices';
import { handle } from '../http/handle';
import { sharedLimit } from '../http/shared-rate-limit';
import { deviceGate, deviceOfResponse, limitPerDevice } from './device-gate';
import { recordDeviceReading } from './ingest.service';

/** How often one device may post: `burst` readings per `windowSeconds`, counted in PostgreSQL. */
export interface DeviceReadingLimit {
  burst: number;
  windowSeconds: number;
}

/**
 * 20 a minute: a burst of a device catching up after a lost connection gets through, and
 * over the minute that is one every 3 s, far more than a hydrometer needs (most post every
 * few minutes). 1,000 a minute is refused after the first 20.
 */
export const DEFAULT_DEVICE_READING_LIMIT: DeviceReadingLimit = { burst: 20, windowSeconds: 60 };

/**
 * POST /api/ingest/readings — digital hydrometers post one reading each (our own format,
 * shared/schemas/devices.ts and README.md), with their token as a bearer token. 201 for a new
 * reading, 200 with `duplicate: true` for a moment this device already sent.
 */
export function ingestRoutes(ds: DataSource, limit: DeviceReadingLimit = DEFAULT_DEVICE_READING_LIMIT): Router {
  const router = Router();
  const perDevice = sharedLimit(ds, { name: 'device-readings', points: limit.burst, windowSeconds: limit.windowSeconds });
  router.post(
    '/readings',
    deviceGate(ds),
    limitPerDevice(perDevice),
    handle({ body: deviceReadingSchema }, async ({ body }, _req, res) => {
      const { deviceId, actor } = deviceOfResponse(res);
      const receivedAt = new Date();
      // No transaction held open: the reading and the batch's cache move in one statement, so
      // thousands of posts to one batch never queue on its row across round trips.
      const answer = await recordDeviceReading(actor, ds.manager, deviceId, body, receivedAt);
      res.status(answer.stored ? 201 : 200);
      return answer;
    }),
  );
  return router;
}
