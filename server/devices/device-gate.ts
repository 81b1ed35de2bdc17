import type { Request, RequestHandler, Response } from 'express';
import type { DataSource } from 'typeorm';
import { systemActor, type SystemActor } from '../core/actor';
import type { SharedLimit } from '../http/shared-rate-limit';
import { deviceForToken } from './device-tokens';

/** The device a request was authenticated as (set by `deviceGate`). */
interface DeviceLocals {
  deviceId: string;
  actor: SystemActor;
}

/** The token from `Authorization: Bearer <token>`, or from `X-Device-Token`. */
function tokenOf(req: Request): string {
  const bearer = /^Bearer\s+(\S+)\s*$/i.exec(req.get('authorization') ?? '')?.[1];
  return bearer ?? req.get('x-device-token')?.trim() ?? '';
}

/**
 * The door for devices: a working token makes the request the cellar's own device job, with a
 * Hand's rights; anything else answers 401 before the body is looked at.
 */
export function deviceGate(ds: DataSource): RequestHandler {
  return async (req, res, next) => {
    const device = await deviceForToken(ds, tokenOf(req));
    if (!device) {
      res
        .status(401)
        .set('WWW-Authenticate', 'Bearer realm="readings"')
        .json({ error: 'unauthorized', message: 'Unknown or revoked device token. Send it as "Authorization: Bearer <token>".' });
      return;
    }
    const locals: DeviceLocals = { deviceId: device.id, actor: systemActor(device.cellarId, 'device', 'hand') };
    res.locals.device = locals;
    next();
  };
}

/** What `deviceGate` found; only call behind it. */
export const deviceOfResponse = (res: Response): DeviceLocals => res.locals.device as DeviceLocals;

/** Counts each post against its device's limit; over it, 429 with Retry-After. */
export function limitPerDevice(limit: SharedLimit): RequestHandler {
  return async (_req, res, next) => {
    const wait = await limit.take(deviceOfResponse(res).deviceId);
    if (wait > 0) {
      res
        .status(429)
        .set('Retry-After', String(wait))
        .json({
          error: 'too_many_requests',
          message: `This device is sending readings too often. Wait ${wait} s; one reading every few minutes is plenty.`,
        });
      return;
    }
    next();
  };
}
