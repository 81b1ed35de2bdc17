import { describe, it, expect } from 'vitest';
import {
  waterDensity,
  correctGravity,
  recordedGravity,
  celsiusFrom,
  CALIBRATION_60F_C,
  CALIBRATION_20C,
  CORRECTION_MIN_C,
  CORRECTION_MAX_C,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// Density of air-free water in g/cm³, CRC Handbook of Chemistry and Physics,
// "Properties of water in the range 0–100 °C" (5-decimal table; values from memory).
const CRC_WATER: Record<number, number> = {
  0: 0.99984,
  5: 0.99997,
  10: 0.9997,
  15: 0.9991,
  20: 0.99821,
  25: 0.99705,
  30: 0.99565,
  35: 0.99403,
  40: 0.99222,
};

describe('density of water (Tanaka et al., Metrologia 38 (2001) 301)', () => {
  it.each(Object.entries(CRC_WATER).map(([t, d]) => [Number(t), d]))('at %s °C matches the CRC table (%s g/cm³)', (t, d) => {
    // The CRC table is Kell's air-free water to 5 decimals; the Tanaka formula
    // (SMOW) agrees with it within 0.01 kg/m³ over 0–40 °C.
    expect(Math.abs(waterDensity(t) - d * 1000)).toBeLessThan(0.01);
  });

  it('is densest near 4 °C', () => {
    expect(waterDensity(4)).toBeGreaterThan(waterDensity(3));
    expect(waterDensity(4)).toBeGreaterThan(waterDensity(5));
  });
});

describe('hydrometer correction, calibration 15 °C (59 °F)', () => {
  // American Homebrewers Association wiki, "Hydrometer Temperature Adjustment
  // Table" (standardised at 59 °F / 15 °C). The table prints magnitudes; below
  // 15 °C the correction is a subtraction (cold water is denser, so the
  // hydrometer reads high), above 15 °C an addition.
  it.each([
    [5, -0.0009],
    [10, -0.0006],
    [14, -0.0001],
    [18, 0.0005],
    [20, 0.0009],
    [25, 0.0021],
    [30, 0.0035],
    [35, 0.0051],
  ])('a reading of 1.000 at %s °C corrects by %s', (t, correction) => {
    // Table printed to 4 decimals: half a unit of the last place plus rounding.
    expect(Math.abs(correctGravity(1.0, t, 15) - (1 + correction))).toBeLessThan(0.0001);
  });

  it('matches the table’s own worked example: 1.040 at 95 °F reads 1.0451', () => {
    // The table adds a constant; scaling by the density ratio gives 0.0002 more
    // at 1.040, still inside one division of a hydrometer.
    expect(Math.abs(correctGravity(1.04, celsiusFrom(95), 15) - 1.0451)).toBeLessThan(0.0003);
  });
});

// Published cubic for hydrometer correction in °F, as quoted in the
// homebrew.stackexchange.com answer "Temperature correction for specific
// gravity" (question 4137):
//   cg = mg × f(tr) / f(tc), f(T) = 1.00130346 − 0.000134722124 T
//        + 0.00000204052596 T² − 0.00000000232820948 T³
// It is a fit to the specific volume of water, independent of the formula in the code.
function publishedCorrection(mg: number, readingF: number, calibrationF: number): number {
  const f = (t: number) => 1.00130346 - 0.000134722124 * t + 0.00000204052596 * t ** 2 - 0.00000000232820948 * t ** 3;
  return (mg * f(readingF)) / f(calibrationF);
}

describe('hydrometer correction against the published °F polynomial', () => {
  const rows: [number, number, number][] = [];
  for (const calibrationF of [60, 68]) {
    for (const sampleF of [41, 50, 59, 77, 86, 95]) {
      for (const reading of [0.996, 1.05, 1.1, 1.16]) rows.push([reading, sampleF, calibrationF]);
    }
  }
  it.each(rows)('reading %s at %s °F, hydrometer calibrated at %s °F', (reading, sampleF, calibrationF) => {
    const expected = publishedCorrection(reading, sampleF, calibrationF);
    const got = correctGravity(reading, celsiusFrom(sampleF), celsiusFrom(calibrationF));
    expect(Math.abs(got - expected)).toBeLessThan(0.0002);
  });

  it('accepts the 60 °F constant as a calibration temperature', () => {
    const got = correctGravity(1.08, celsiusFrom(86), CALIBRATION_60F_C);
    expect(Math.abs(got - publishedCorrection(1.08, 86, 60))).toBeLessThan(0.0002);
  });
});

describe('hydrometer correction, calibration 20 °C, against CRC water densities', () => {
  it.each([
    [1.0, 5],
    [1.06, 10],
    [1.1, 15],
    [1.12, 25],
    [1.14, 30],
    [1.16, 35],
  ])('reading %s at %s °C', (reading, t) => {
    const expected = (reading * CRC_WATER[20]) / CRC_WATER[t];
    expect(Math.abs(correctGravity(reading, t) - expected)).toBeLessThan(0.00003);
  });

  it('raises warm readings and lowers cold ones', () => {
    expect(correctGravity(1.05, 30)).toBeGreaterThan(1.05);
    expect(correctGravity(1.05, 10)).toBeLessThan(1.05);
    expect(correctGravity(1.05, 20)).toBeCloseTo(1.05, 12);
  });
});

describe('a reading as the record keeps it', () => {
  it('is the reading itself when no sample temperature was taken', () => {
    expect(recordedGravity(1.046, null, 20)).toBe(1.046);
    expect(recordedGravity(0.994, null, CALIBRATION_60F_C)).toBe(0.994);
  });

  it('is corrected to the calibration when it was (CRC water densities, as above)', () => {
    // 1.100 read at 30 °C on a hydrometer calibrated at 20 °C: 1.100 × 0.99821 / 0.99565.
    expect(Math.abs(recordedGravity(1.1, 30, 20) - (1.1 * CRC_WATER[20]) / CRC_WATER[30])).toBeLessThan(0.00003);
    // AHA table (calibration 15 °C): 1.000 at 25 °C reads 0.0021 higher.
    expect(Math.abs(recordedGravity(1.0, 25, 15) - 1.0021)).toBeLessThan(0.0001);
  });

  it('refuses a sample temperature outside the formula’s range, naming it', () => {
    expectInputError(() => recordedGravity(1.05, 45, 20), 'sampleC');
  });
});

describe('calibration temperatures and range', () => {
  it('are 20 °C and 60 °F (15.56 °C), within the 0–40 °C of the water-density formula', () => {
    expect(CALIBRATION_20C).toBe(20);
    expect(CALIBRATION_60F_C).toBeCloseTo(15.5556, 4); // (60 − 32) / 1.8
    expect(CORRECTION_MIN_C).toBe(0);
    expect(CORRECTION_MAX_C).toBe(40);
    expect(waterDensity(0)).toBeCloseTo(999.84, 1);
    expect(waterDensity(40)).toBeCloseTo(992.22, 1);
  });
});

describe('hydrometer correction input checks', () => {
  it('rejects temperatures outside 0–40 °C and impossible readings, naming the argument', () => {
    expectInputError(() => correctGravity(1.05, 41), 'sampleC', 'Sample temperature must be between 0 and 40 °C (got 41 °C).');
    expectInputError(() => correctGravity(1.05, -1), 'sampleC');
    expectInputError(() => correctGravity(1.05, 20, 45), 'calibrationC');
    expectInputError(() => correctGravity(1.05, Number.NaN), 'sampleC');
    expectInputError(() => correctGravity(1.3, 20), 'reading');
    expectInputError(() => correctGravity(Number.POSITIVE_INFINITY, 20), 'reading');
    expectInputError(() => waterDensity(50), 'celsius');
  });
});

describe('temperature messages', () => {
  it('name the temperature and its range in °C', () => {
    expectInputError(() => waterDensity(50), 'celsius', 'Water temperature must be between 0 and 40 °C (got 50 °C).');
    expectInputError(
      () => correctGravity(1.05, 20, 45),
      'calibrationC',
      'Hydrometer calibration temperature must be between 0 and 40 °C (got 45 °C).',
    );
    expectInputError(() => correctGravity(1.3, 20), 'reading', 'Hydrometer reading must be between 0.980 and 1.200 (got 1.300).');
  });
});
