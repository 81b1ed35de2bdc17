import { fahrenheitFrom, type UnitSystem } from '../calc';
import type { DeviceDay } from '../schemas/devices';

/** What a day of device readings comes to, before it is put into words. */
export type DeviceDayFigures = Omit<DeviceDay, 'line'>;

const gravity = (sg: number) => sg.toFixed(3);

function temperatureRange(min: number | null, max: number | null, unitSystem: UnitSystem): string | null {
  if (min === null || max === null) return null;
  const [unit, low, high] = unitSystem === 'us' ? ['°F', fahrenheitFrom(min), fahrenheitFrom(max)] : ['°C', min, max];
  const [a, b] = [Math.round(low as number), Math.round(high as number)];
  return a === b ? `${a} ${unit}` : `${a}–${b} ${unit}`;
}

/**
 * The journal's one line for a day of device readings, worked out when the journal is read
 * (never stored): "Hydrometer: 96 readings, 1.020 → 1.012, 18–19 °C". The server's answer
 * carries it in the cellar's units; the page words it again in the units the person chose.
 */
export function deviceDayLine(day: DeviceDayFigures, unitSystem: UnitSystem): string {
  const readings = day.count === 1 ? '1 reading' : `${day.count} readings`;
  const gravities = day.count === 1 ? gravity(day.firstSg) : `${gravity(day.firstSg)} → ${gravity(day.lastSg)}`;
  const temperature = temperatureRange(day.minTemperatureC, day.maxTemperatureC, unitSystem);
  return `Hydrometer: ${[readings, gravities, temperature].filter(Boolean).join(', ')}`;
}
