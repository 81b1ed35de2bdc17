import { describe, it, expect } from 'vitest';
import { sgToBrix, brixToSg, sgToPlato, platoToSg, gravityPoints, BRIX_MIN, BRIX_MAX, PLATO_MIN, PLATO_MAX } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// Density of water at 20 °C, 0.99820 g/cm³: CRC Handbook of Chemistry and
// Physics, "Properties of water in the range 0–100 °C" (from memory of the table).
const WATER_20C = 0.9982;

describe('°Brix ↔ specific gravity', () => {
  it('SG 1.040 (20/20 °C) is 9.99325 °Bx — worked value in the Wikipedia article "Brix" (NBS C440 basis)', () => {
    expect(Math.abs(sgToBrix(1.04) - 9.99325)).toBeLessThan(0.002);
  });

  it('40 °Bx is SG 1.17874 — upper end of the NBS-table fit, Wikipedia "Brix"', () => {
    expect(Math.abs(brixToSg(40) - 1.17874)).toBeLessThan(0.0001);
  });

  // Density (g/cm³, 20 °C) of sucrose solutions by % mass, from memory of the
  // CRC Handbook table "Concentrative properties of aqueous solutions: sucrose".
  // SG 20/20 = density / density of water at 20 °C. The table gives 4 decimals
  // and true (not apparent) density, hence the 0.0003 tolerance.
  it.each([
    [5, 1.0179],
    [10, 1.0381],
    [15, 1.0592],
    [20, 1.081],
    [25, 1.1036],
    [30, 1.127],
    [35, 1.1513],
    [40, 1.1765],
  ])('%s percent sucrose (CRC density %s g/cm³)', (brix, density) => {
    const sg = density / WATER_20C;
    expect(Math.abs(brixToSg(brix) - sg)).toBeLessThan(0.0003);
    expect(Math.abs(sgToBrix(sg) - brix)).toBeLessThan(0.08);
  });

  it('round-trips across the whole mead range', () => {
    for (let sg = 0.985; sg <= 1.2; sg += 0.005) {
      expect(brixToSg(sgToBrix(sg))).toBeCloseTo(sg, 8);
    }
  });

  it('gives negative apparent Brix below 1.000, as a hydrometer scale would', () => {
    expect(sgToBrix(0.995)).toBeLessThan(0);
    expect(sgToBrix(0.995)).toBeGreaterThan(-2);
  });
});

describe('°Plato ↔ specific gravity', () => {
  it('SG 1.040 is 9.99359 °P — worked value in the Wikipedia article "Brix"', () => {
    expect(Math.abs(sgToPlato(1.04) - 9.99359)).toBeLessThan(0.002);
  });

  it('12 °P is SG 1.0484 (from memory of the ASBC extract table)', () => {
    expect(Math.abs(platoToSg(12) - 1.0484)).toBeLessThan(0.0002);
  });

  // Wikipedia "Brix": Plato and Brix differ by "less than the precision of most
  // common instruments" — the fits should agree closely over the mead range.
  it.each([1.01, 1.04, 1.06, 1.08, 1.1, 1.12, 1.14, 1.16])('Plato and Brix agree at SG %s', (sg) => {
    const tolerance = sg <= 1.08 ? 0.02 : 0.1;
    expect(Math.abs(sgToPlato(sg) - sgToBrix(sg))).toBeLessThan(tolerance);
  });

  it('round-trips across the whole mead range', () => {
    for (let sg = 0.985; sg <= 1.2; sg += 0.005) {
      expect(platoToSg(sgToPlato(sg))).toBeCloseTo(sg, 8);
    }
  });

  it('rises as gravity rises', () => {
    let previous = -Infinity;
    for (let sg = 0.98; sg <= 1.2; sg += 0.01) {
      const p = sgToPlato(sg);
      expect(p).toBeGreaterThan(previous);
      previous = p;
    }
  });
});

describe('gravity points', () => {
  it('are (SG − 1) × 1000 (trade definition)', () => {
    expect(gravityPoints(1.085)).toBeCloseTo(85, 9);
    expect(gravityPoints(0.996)).toBeCloseTo(-4, 9);
  });
});

describe('the accepted °Brix and °Plato ranges', () => {
  // The published cubics written out here, evaluated at the gravities accepted (0.980–1.200).
  const brix = (sg: number) => 182.46007 * sg ** 3 - 775.68212 * sg ** 2 + 1262.7794 * sg - 669.56218;
  const plato = (sg: number) => -616.868 + 1111.14 * sg - 630.272 * sg ** 2 + 135.997 * sg ** 3;

  it('are the scales at 0.980 and 1.200', () => {
    expect(BRIX_MIN).toBeCloseTo(brix(0.98), 6);
    expect(BRIX_MAX).toBeCloseTo(brix(1.2), 6);
    expect(PLATO_MIN).toBeCloseTo(plato(0.98), 6);
    expect(PLATO_MAX).toBeCloseTo(plato(1.2), 6);
    expect(BRIX_MAX).toBeCloseTo(44.08, 2);
  });

  it('accept the very ends and name the range in the message', () => {
    expect(brixToSg(brix(1.2))).toBeCloseTo(1.2, 9);
    expect(platoToSg(plato(0.98))).toBeCloseTo(0.98, 9);
    expectInputError(() => brixToSg(44.2), 'brix', 'Brix must be between -5.2 and 44.0 (got 44.2).');
    expectInputError(() => platoToSg(-5.3), 'plato', 'Plato must be between -5.2 and 43.9 (got -5.3).');
  });
});

describe('gravity conversion input checks', () => {
  it('rejects impossible gravities and scale values, naming the argument', () => {
    expectInputError(() => sgToBrix(1.35), 'sg', 'Specific gravity must be between 0.980 and 1.200 (got 1.350).');
    expectInputError(() => sgToPlato(0.9), 'sg');
    expectInputError(() => sgToBrix(Number.NaN), 'sg');
    expectInputError(() => brixToSg(60), 'brix');
    expectInputError(() => brixToSg(Number.POSITIVE_INFINITY), 'brix');
    expectInputError(() => platoToSg(-20), 'plato');
    expectInputError(() => gravityPoints(2), 'sg');
  });
});
