import { describe, it, expect } from 'vitest';
import {
  fermentableForGravity,
  gravityFromFermentable,
  sugarPerLitre,
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
    expect(Math.abs(sugarPerLitre(density / WATER_20C) - expectedKg / volumeL) / (expectedKg / volumeL)).toBeLessThan(0.01);
  });

  it('1 lb of sucrose in 1 US gallon gives about 1.046 (common practice: "46 points per pound per gallon")', () => {
    const sg = gravityFromFermentable({ volumeL: LITRES_PER_US_GALLON, kg: KILOGRAMS_PER_POUND, source: 'sucrose' });
    expect(Math.abs(sg - 1.046)).toBeLessThan(0.001);
  });
});

describe('honey for a target gravity', () => {
  // Common practice, no single published source: 1 lb of honey made up to one
  // US gallon adds 35 points (a widely repeated mead rule, e.g. the
  // blackfriarsmonastery.blogspot.com "Honey" page) to 40 points (the rule of
  // thumb attributed to Schramm, The Compleat Meadmaker (2003), in a
  // winemakingtalk.com thread). The code's figure should sit in that range.
  it('1 lb per US gallon lands between the 35- and 40-point rules of thumb', () => {
    const sg = gravityFromFermentable({ volumeL: LITRES_PER_US_GALLON, kg: KILOGRAMS_PER_POUND, source: 'honey' });
    const points = (sg - 1) * 1000;
    expect(points).toBeGreaterThanOrEqual(35);
    expect(points).toBeLessThanOrEqual(40);
  });

  it('3.5 lb of clover honey in 1 US gallon measured 1.130 (winemakingtalk.com thread, practitioner reading)', () => {
    const sg = gravityFromFermentable({ volumeL: LITRES_PER_US_GALLON, kg: 3.5 * KILOGRAMS_PER_POUND, source: 'honey' });
    expect(Math.abs(sg - 1.13)).toBeLessThan(0.005);
  });

  it('needs 1/0.829 as much honey as sucrose (USDA FoodData Central, honey: 17.1 g water per 100 g)', () => {
    const honey = fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'honey' });
    const sucrose = fermentableForGravity({ volumeL: 20, targetOg: 1.11, source: 'sucrose' });
    expect(honey * (1 - 0.171)).toBeCloseTo(sucrose, 9);
  });

  it.each([1.06, 1.08, 1.1, 1.12, 1.14, 1.16])('finds its own way back from the kilograms it gives (OG %s)', (og) => {
    const kg = fermentableForGravity({ volumeL: 19, targetOg: og, source: 'honey' });
    expect(gravityFromFermentable({ volumeL: 19, kg, source: 'honey' })).toBeCloseTo(og, 6);
  });

  it('counts the sugar already in the must (step feeding)', () => {
    const whole = fermentableForGravity({ volumeL: 10, targetOg: 1.1, source: 'honey' });
    const first = fermentableForGravity({ volumeL: 10, targetOg: 1.05, source: 'honey' });
    const second = fermentableForGravity({ volumeL: 10, targetOg: 1.1, startOg: 1.05, source: 'honey' });
    expect(second).toBeLessThan(whole);
    expect(first + second).toBeCloseTo(whole, 9);
  });

  it('needs nothing to stay where it is, and nothing for no volume', () => {
    expect(fermentableForGravity({ volumeL: 10, targetOg: 1.05, startOg: 1.05, source: 'honey' })).toBe(0);
    expect(fermentableForGravity({ volumeL: 0, targetOg: 1.1, source: 'sucrose' })).toBe(0);
  });
});

describe('fermentable input checks', () => {
  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => fermentableForGravity({ volumeL: -5, targetOg: 1.1, source: 'honey' }), 'volumeL');
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.25, source: 'honey' }), 'targetOg');
    expectInputError(
      () => fermentableForGravity({ volumeL: 5, targetOg: 1.05, startOg: 1.08, source: 'honey' }),
      'targetOg',
      /cannot lower it/,
    );
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.1, startOg: 0.9, source: 'honey' }), 'startOg');
    expectInputError(() => fermentableForGravity({ volumeL: 5, targetOg: 1.1, source: 'maple' as never }), 'source');
    expectInputError(() => fermentableForGravity({ volumeL: Number.NaN, targetOg: 1.1, source: 'honey' }), 'volumeL');
    expectInputError(() => gravityFromFermentable({ volumeL: 0, kg: 1, source: 'honey' }), 'volumeL');
    expectInputError(() => gravityFromFermentable({ volumeL: 4, kg: -1, source: 'honey' }), 'kg');
    expectInputError(() => gravityFromFermentable({ volumeL: 4, kg: 10, source: 'sucrose' }), 'kg', /above 1.200/);
    expectInputError(() => sugarPerLitre(1.5), 'sg');
  });
});
