import { describe, expect, it } from 'vitest';
import { deviceDayLine } from '../../../shared/domain/device-day-line';

const day = { day: '2026-11-05', count: 96, firstSg: 1.02, lastSg: 1.012, minTemperatureC: 18, maxTemperatureC: 19 };

describe('deviceDayLine', () => {
  it('sums a day up in °C for metric', () => {
    expect(deviceDayLine(day, 'metric')).toBe('Hydrometer: 96 readings, 1.020 → 1.012, 18–19 °C');
  });

  // NIST SP 811 (2008), B.9: t/°F = 1.8 · t/°C + 32, so 18 °C = 64.4 °F and 19 °C = 66.2 °F.
  it('gives the temperature range in °F, whole degrees, for US units', () => {
    expect(deviceDayLine(day, 'us')).toBe('Hydrometer: 96 readings, 1.020 → 1.012, 64–66 °F');
  });

  it('names one reading, one temperature, or none', () => {
    expect(deviceDayLine({ ...day, count: 1, lastSg: 1.02, maxTemperatureC: 18 }, 'metric')).toBe('Hydrometer: 1 reading, 1.020, 18 °C');
    // 20 °C = 68 °F exactly (NIST SP 811, B.9).
    expect(deviceDayLine({ ...day, minTemperatureC: 20, maxTemperatureC: 20 }, 'us')).toBe('Hydrometer: 96 readings, 1.020 → 1.012, 68 °F');
    expect(deviceDayLine({ ...day, minTemperatureC: null, maxTemperatureC: null }, 'us')).toBe('Hydrometer: 96 readings, 1.020 → 1.012');
    // Half a range is no range: said without a temperature rather than as "0–19 °C".
    expect(deviceDayLine({ ...day, minTemperatureC: null }, 'metric')).toBe('Hydrometer: 96 readings, 1.020 → 1.012');
    expect(deviceDayLine({ ...day, maxTemperatureC: null }, 'metric')).toBe('Hydrometer: 96 readings, 1.020 → 1.012');
  });
});
