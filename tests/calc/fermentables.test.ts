import { describe, it, expect } from 'vitest';
import {
  fermentableForGravity,
  gravityFromFermentable,
  sugarPerLitre,
  HONEY_MOISTURE_PERCENT,
  HONEY_MOISTURE_RANGE,
  HONEY_POINTS_PER_LB_PER_US_GAL,
  HONEY_SOLIDS_FRACTION,
  SUGAR_EQUIVALENT,
  LITRES_PER_US_GALLON,
  KILOGRAMS_PER_POUND,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';

const WATER_20C = 0.9982; // g/cm³, CRC Handbook (from memory)

describe('sucrose for a target gravity', () => {
  // From memory of the CRC Handbook table "Concentrative properties of aqueous
  // solutions: sucrose": mass % and density (g/cm³, 20 °C). Sugar in a litre is
  // mass fraction × density; the target SG is density / water density.
  it.each([
    [10, 1.0381],
    [20, 1.081],
    [25, 1.1036],
    [30, 1.127],
    [35, 1.1513],
  ])('%s percent sucrose solution (density %s)', (percent, density) => {
    const volumeL = 10;
    const expectedKg = (percent / 100) * density * volumeL;
    const got = fermentableForGravity({ volumeL, targetOg: density / WATER_20C, source: 'sucrose' });
    expect(Math.abs(got - expectedKg) / expectedKg).toBeLessThan(0.01);
    // The table's four decimals and the fit's stated 0.0009 °Bx agree with the code to 0.2 %.
    expect(Math.abs(sugarPerLitre(density / WATER_20C) - expectedKg / volumeL) / (expectedKg / volumeL)).toBeLessThan(0.002);
  });

  it('1 lb of sucrose in 1 US gallon gives about 1.046 (common practice: "46 points per pound per gallon")', () => {
    const sg = gravityFromFermentable({ volumeL: LITRES_PER_US_GALLON, kg: KILOGRAMS_PER_POUND, source: 'sucrose' });
    expect(Math.abs(sg - 1.046)).toBeLessThan(0.001);
  });
});

describe('honey for a target gravity — 35 gravity points per pound per US gallon (common practice)', () => {
  // Mead makers count honey at about 35 points per pound made up to one US gallon (common
  // practice; quoted figures run 35–40). Expected gravities below are that rule worked by
  // hand: points = 35 × pounds / gallons.
  const GALLON_L = (231 * 2.54 ** 3) / 1000; // NIST Handbook 44, Appendix C
  const POUND_KG = 0.45359237; // NIST Handbook 44, Appendix C

  it.each([
    // [pounds, US gallons, expected SG by the rule, tolerance]
    [1, 1, 1.035, 0.0002],
    [3, 1, 1.105, 0.0015], // the rule is linear; the sucrose table bends a little at strong musts
    [15, 5, 1.105, 0.0015],
    [12, 5, 1.084, 0.0015],
    [2.5, 1, 1.0875, 0.0015],
  ])('%s lb made up to %s US gal reaches about %s', (lb, gal, expected, tolerance) => {
    const sg = gravityFromFermentable({ volumeL: gal * GALLON_L, kg: lb * POUND_KG, source: 'honey' });
    expect(Math.abs(sg - expected)).toBeLessThan(tolerance);
  });

  it('asks for about 14.3 lb of honey for 5 US gal at 1.100 (100 points × 5 gal / 35)', () => {
    const kg = fermentableForGravity({ volumeL: 5 * GALLON_L, targetOg: 1.1, source: 'honey' });
    expect(Math.abs(kg / POUND_KG - (100 * 5) / 35) / ((100 * 5) / 35)).toBeLessThan(0.015);
  });

  it('pins the rule and the typical honey it is for', () => {
    expect(HONEY_POINTS_PER_LB_PER_US_GAL).toBe(35);
    expect(HONEY_MOISTURE_PERCENT).toBe(17.1); // USDA FoodData Central (SR Legacy), honey
    expect(HONEY_SOLIDS_FRACTION).toBeCloseTo(0.829, 12);
    expect(HONEY_MOISTURE_RANGE).toEqual({ min: 12, max: 25 });
    expect(SUGAR_EQUIVALENT.sucrose).toBe(1);
  });

  it('counts a honey of known moisture by its dry matter', () => {
    // A honey of 20 % water has 80 % dry matter against the typical 82.9 %: it takes
    // 82.9/80 as much for the same gravity; one of 15 % water, 82.9/85 as much.
    const typical = fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'honey' });
    const wet = fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'honey', honeyMoisturePercent: 20 });
    const dry = fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'honey', honeyMoisturePercent: 15 });
    expect(wet / typical).toBeCloseTo(82.9 / 80, 9);
    expect(dry / typical).toBeCloseTo(82.9 / 85, 9);
    expect(fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'honey', honeyMoisturePercent: 17.1 })).toBeCloseTo(typical, 12);
    // 1 lb of a 20 % honey in a gallon: 35 × 80/82.9 = 33.8 points.
    const sg = gravityFromFermentable({ volumeL: GALLON_L, kg: POUND_KG, source: 'honey', honeyMoisturePercent: 20 });
    expect(Math.abs(sg - 1.0338)).toBeLessThan(0.0002);
  });

  it('ignores a honey moisture for table sugar', () => {
    // 1 lb of sucrose per US gallon gives 1.046 (common practice, checked above): 5 lb in 5 gal.
    for (const honeyMoisturePercent of [20, 99]) {
      const sg = gravityFromFermentable({ volumeL: 5 * GALLON_L, kg: 5 * POUND_KG, source: 'sucrose', honeyMoisturePercent });
      expect(Math.abs(sg - 1.046)).toBeLessThan(0.001);
    }
  });

  it('needs 46/35 as much honey as sugar for the same gravity, as the two rules of thumb say', () => {
    const honey = fermentableForGravity({ volumeL: 20, targetOg: 1.05, source: 'honey' });
    const sucrose = fermentableForGravity({ volumeL: 20, targetOg: 1.05, source: 'sucrose' });
    expect(Math.abs(honey / sucrose - 46 / 35)).toBeLessThan(0.01);
  });

  it('counts the sugar already in the must (step feeding)', () => {
    // From 1.050 to 1.100 in 10 L is 50 points: 50/35 lb per US gal = 0.17118 kg/L, 1.71 kg.
    const second = fermentableForGravity({ volumeL: 10, targetOg: 1.1, startOg: 1.05, source: 'honey' });
    expect(Math.abs(second - 1.7118) / 1.7118).toBeLessThan(0.02);
    // 1 kg more honey in 10 L raises 1.050 by about 29 points (35 × 2.2046 lb / 2.6417 gal).
    const sg = gravityFromFermentable({ volumeL: 10, kg: 1, startOg: 1.05, source: 'honey' });
    expect(Math.abs(sg - 1.0792)).toBeLessThan(0.0015);
  });

  it('needs nothing to stay where it is, and nothing for no volume', () => {
    expect(fermentableForGravity({ volumeL: 10, targetOg: 1.05, startOg: 1.05, source: 'honey' })).toBe(0);
    expect(fermentableForGravity({ volumeL: 0, targetOg: 1.1, source: 'sucrose' })).toBe(0);
    expect(gravityFromFermentable({ volumeL: 10, kg: 0, startOg: 0.995, source: 'honey' })).toBe(0.995);
  });

  it('finds no sugar at or below 1.000', () => {
    expect(sugarPerLitre(1.0)).toBe(0);
    expect(sugarPerLitre(0.99)).toBe(0);
  });
});

describe('fermentable input checks', () => {
  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => fermentableForGravity({ volumeL: -5, targetOg: 1.1, source: 'honey' }), 'volumeL');
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.25, source: 'honey' }), 'targetOg');
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.05, startOg: 1.08, source: 'honey' }), 'targetOg', /cannot lower it/);
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.1, startOg: 0.9, source: 'honey' }), 'startOg');
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.1, source: 'maple' as never }), 'source');
    expectInputError(() => fermentableForGravity({ volumeL: Number.NaN, targetOg: 1.1, source: 'honey' }), 'volumeL');
    expectInputError(() => gravityFromFermentable({ volumeL: 0, kg: 1, source: 'honey' }), 'volumeL');
    expectInputError(() => gravityFromFermentable({ volumeL: 4, kg: -1, source: 'honey' }), 'kg');
    expectInputError(() => gravityFromFermentable({ volumeL: 4, kg: 10, source: 'sucrose' }), 'kg', /above 1.200/);
    expectInputError(() => sugarPerLitre(1.5), 'sg');
    expectInputError(
      () => fermentableForGravity({ volumeL: 5, targetOg: 1.1, source: 'honey', honeyMoisturePercent: 30 }),
      'honeyMoisturePercent',
      'Honey moisture must be between 12 and 25 % (got 30 %).',
    );
    expectInputError(() => gravityFromFermentable({ volumeL: 5, kg: 1, source: 'honey', honeyMoisturePercent: 11 }), 'honeyMoisturePercent');
    expectInputError(() => gravityFromFermentable({ volumeL: 5, kg: 1, source: 'maple' as never }), 'source');
  });
});

describe('fermentable messages', () => {
  it('name the value and its unit', () => {
    expectInputError(
      () => fermentableForGravity({ volumeL: -5, targetOg: 1.1, source: 'honey' }),
      'volumeL',
      'Must volume cannot be negative (got -5 L).',
    );
    expectInputError(() => gravityFromFermentable({ volumeL: -1, kg: 1, source: 'honey' }), 'volumeL', 'Must volume cannot be negative (got -1 L).');
    expectInputError(
      () => gravityFromFermentable({ volumeL: 0, kg: 1, source: 'honey' }),
      'volumeL',
      'Must volume must be more than zero (got 0 L).',
    );
    expectInputError(() => gravityFromFermentable({ volumeL: 4, kg: -1, source: 'honey' }), 'kg', 'Amount added cannot be negative (got -1 kg).');
    expectInputError(
      () => gravityFromFermentable({ volumeL: 4, kg: 1, startOg: 0.9, source: 'honey' }),
      'startOg',
      'Starting gravity must be between 0.980 and 1.200 (got 0.900).',
    );
    expectInputError(
      () => fermentableForGravity({ volumeL: 5, targetOg: 1.05, startOg: 1.08, source: 'honey' }),
      'targetOg',
      'Target gravity (1.050) is below the starting gravity (1.080); adding sugar cannot lower it.',
    );
    expectInputError(
      () => gravityFromFermentable({ volumeL: 4, kg: 10, source: 'sucrose' }),
      'kg',
      'That much sucrose would take the must above 1.200, beyond what yeast can ferment.',
    );
    expectInputError(
      () => fermentableForGravity({ volumeL: 5, targetOg: 1.1, source: 'maple' as never }),
      'source',
      "Fermentable must be one of 'honey', 'sucrose' (got 'maple').",
    );
  });

  it('reaches the highest gravity accepted, and no further', () => {
    const kg = fermentableForGravity({ volumeL: 10, targetOg: 1.2, source: 'sucrose' });
    expect(gravityFromFermentable({ volumeL: 10, kg, source: 'sucrose' })).toBeCloseTo(1.2, 9);
    expectInputError(() => gravityFromFermentable({ volumeL: 10, kg: kg * 1.001, source: 'sucrose' }), 'kg');
  });
});
