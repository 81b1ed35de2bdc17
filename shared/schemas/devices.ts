import { z } from 'zod';
import { PLATO_MAX, PLATO_MIN, platoToSg } from '../calc/gravity';
import { lineText } from './text-rules';

/**
 * Digital hydrometers: the Keeper's side (devices bound to vessels) and the device's side
 * (the readings it posts to /api/ingest/readings, our own format, documented in README.md).
 */

/** A device's clock may run this far ahead of ours before its reading counts as "in the future". */
export const CLOCK_SKEW_MS = 5 * 60_000;
/** Device readings are thinned for display: every reading this recent… */
export const RAW_WINDOW_HOURS = 48;
/** …hourly averages up to this old, daily averages beyond. */
export const HOURLY_WINDOW_DAYS = 14;

export const deviceNameSchema = lineText().trim().min(1, 'give the device a name').max(60, 'at most 60 characters');

export const deviceCreateSchema = z.object({
  name: deviceNameSchema,
  vesselId: z.uuid({ message: 'choose a vessel' }),
});
export type DeviceCreate = z.infer<typeof deviceCreateSchema>;

export const deviceMoveSchema = z.object({ vesselId: z.uuid({ message: 'choose a vessel' }) });
export type DeviceMove = z.infer<typeof deviceMoveSchema>;

export const deviceParamsSchema = z.object({ deviceId: z.uuid({ message: 'must be an id (UUID)' }) });

export const deviceSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  vessel: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  /** The batch in that vessel now: where its next reading goes. */
  batch: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  /** The token's last four characters, to tell tokens apart; null when it has none (restored). */
  tokenEnd: z.string().nullable(),
  createdAt: z.string(),
  revokedAt: z.string().nullable(),
  lastReadingAt: z.string().nullable(),
});
export type Device = z.infer<typeof deviceSchema>;
export const deviceListSchema = z.array(deviceSchema);

/** A new token is in this answer only: it is stored hashed and never shown again. */
export const deviceWithTokenSchema = z.object({ device: deviceSchema, token: z.string() });
export type DeviceWithToken = z.infer<typeof deviceWithTokenSchema>;

const finite = (what: string) => z.number({ message: `${what} must be a number` });

/**
 * One reading as a device posts it. Gravity as `sg` or as `plato` (exactly one); temperature
 * in `temperatureUnit` (C unless told F); `battery` in volts; `tilt` in degrees from vertical;
 * `takenAt` ISO 8601 with a zone (the time received when left out). Unknown fields are ignored,
 * so a device that sends more than this still works. The output is in SI with the gravity as SG.
 */
export const deviceReadingSchema = z
  .object({
    sg: finite('sg').min(0.98, 'a gravity is at least 0.980').max(1.2, 'a gravity is at most 1.200').optional(),
    plato: finite('plato')
      .min(Math.ceil(PLATO_MIN * 10) / 10, `°Plato is at least ${Math.ceil(PLATO_MIN * 10) / 10}`)
      .max(Math.floor(PLATO_MAX * 10) / 10, `°Plato is at most ${Math.floor(PLATO_MAX * 10) / 10}`)
      .optional(),
    temperature: finite('temperature').optional(),
    temperatureUnit: z.enum(['C', 'F'], { message: "temperatureUnit is 'C' or 'F'" }).default('C'),
    battery: finite('battery').min(0, 'battery is in volts, at least 0').max(10, 'battery is in volts, at most 10').optional(),
    tilt: finite('tilt').min(0, 'tilt is in degrees, 0 to 180').max(180, 'tilt is in degrees, 0 to 180').optional(),
    takenAt: z.iso
      .datetime({ offset: true, message: 'takenAt is an ISO 8601 moment such as 2026-03-14T08:30:00Z', abort: true })
      .refine((iso) => new Date(iso).getTime() <= Date.now() + CLOCK_SKEW_MS, 'takenAt is in the future: check the device clock')
      .optional(),
  })
  .superRefine((r, ctx) => {
    if (r.sg === undefined && r.plato === undefined) ctx.addIssue({ code: 'custom', path: ['sg'], message: 'send the gravity as sg or as plato' });
    if (r.sg !== undefined && r.plato !== undefined)
      ctx.addIssue({ code: 'custom', path: ['plato'], message: 'send the gravity as sg or as plato, not both' });
    const celsius = r.temperature === undefined ? undefined : toCelsius(r.temperature, r.temperatureUnit);
    if (celsius !== undefined && (celsius < -20 || celsius > 60)) {
      ctx.addIssue({ code: 'custom', path: ['temperature'], message: 'temperature must be between -20 and 60 °C (-4 and 140 °F)' });
    }
  })
  .transform((r) => ({
    // °Plato → SG by inverting the ASBC extract-table cubic fit (shared/calc/gravity.ts), to 4 decimals.
    sg: r.sg ?? Math.round(platoToSg(r.plato as number) * 10_000) / 10_000,
    temperatureC: r.temperature === undefined ? null : Math.round(toCelsius(r.temperature, r.temperatureUnit) * 100) / 100,
    batteryV: r.battery ?? null,
    tiltDeg: r.tilt ?? null,
    takenAt: r.takenAt === undefined ? null : new Date(r.takenAt),
  }));
export type DeviceReadingInput = z.input<typeof deviceReadingSchema>;
export type DeviceReading = z.output<typeof deviceReadingSchema>;

function toCelsius(value: number, unit: 'C' | 'F'): number {
  return unit === 'F' ? ((value - 32) * 5) / 9 : value;
}

export const ingestAnswerSchema = z.object({
  /** False when this device had already sent a reading for that moment: it is kept once. */
  stored: z.boolean(),
  duplicate: z.boolean(),
  batchId: z.uuid(),
  takenAt: z.string(),
  sg: z.number(),
});
export type IngestAnswer = z.infer<typeof ingestAnswerSchema>;

/** How much a plotted point stands for: one reading, an hour's or a day's average. */
export const devicePointResolutionSchema = z.enum(['reading', 'hour', 'day']);

export const devicePointSchema = z.object({
  at: z.string(),
  sg: z.number(),
  temperatureC: z.number().nullable(),
  /** Readings averaged into this point. */
  count: z.number().int(),
  resolution: devicePointResolutionSchema,
});
export type DevicePoint = z.infer<typeof devicePointSchema>;

/** One local day of device readings: the journal's one summary line for that day. */
export const deviceDaySchema = z.object({
  day: z.string(),
  count: z.number().int(),
  firstSg: z.number(),
  lastSg: z.number(),
  minTemperatureC: z.number().nullable(),
  maxTemperatureC: z.number().nullable(),
  /** "Hydrometer: 96 readings, 1.020 → 1.012, 18–19 °C", in the cellar's units (the page words it again in the person's). */
  line: z.string(),
});
export type DeviceDay = z.infer<typeof deviceDaySchema>;

/** A batch's device readings as the Batch page shows them: thinned points, and days newest first. */
export const deviceSeriesSchema = z.object({ points: z.array(devicePointSchema), days: z.array(deviceDaySchema) });
export type DeviceSeries = z.infer<typeof deviceSeriesSchema>;
