import {
  deviceListSchema,
  deviceSchema,
  deviceSeriesSchema,
  deviceWithTokenSchema,
  type Device,
  type DeviceCreate,
  type DeviceSeries,
  type DeviceWithToken,
} from '@shared/schemas/devices';
import { request, cellarPath } from './http';

/** The cellar's digital hydrometers (Keepers). */
export const listDevices = (cellarId: string): Promise<Device[]> => request('GET', cellarPath(cellarId, 'devices'), deviceListSchema);

/** A new device in a vessel; the answer holds its token, the only time it is shown. */
export const createDevice = (cellarId: string, input: DeviceCreate): Promise<DeviceWithToken> =>
  request('POST', cellarPath(cellarId, 'devices'), deviceWithTokenSchema, input);

export const moveDevice = (cellarId: string, deviceId: string, vesselId: string): Promise<Device> =>
  request('POST', cellarPath(cellarId, 'devices', deviceId, 'move'), deviceSchema, { vesselId });

export const revokeDevice = (cellarId: string, deviceId: string): Promise<Device> =>
  request('POST', cellarPath(cellarId, 'devices', deviceId, 'revoke'), deviceSchema);

/** A batch's device readings: thinned points for the chart, one line per day for the journal. */
export const fetchDeviceSeries = (cellarId: string, batchId: string): Promise<DeviceSeries> =>
  request('GET', cellarPath(cellarId, 'batches', batchId, 'device-readings'), deviceSeriesSchema);
