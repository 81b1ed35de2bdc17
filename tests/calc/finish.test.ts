import { describe, it, expect } from 'vitest';
import {
  predictFinish,
  fgAtAbv,
  sweetnessOf,
  strengthOf,
  DRY_FINISH_SG,
  MAX_TOLERANCE_ABV,
  SEMI_SWEET_FROM_FG,
  SWEET_FROM_FG,
  STANDARD_FROM_ABV,
  SACK_FROM_ABV,
} from '../../shared/calc';
import { ballingReferenceFg } from './reference-abv';
import { expectInputError } from './expect-input-error';

describe('the band edges', () => {
  it('are the published and common-practice figures', () => {
    expect(STANDARD_FROM_ABV).toBe(7.5); // BJCP 2015
    expect(SACK_FROM_ABV).toBe(14); // BJCP 2015
    expect(SEMI_SWEET_FROM_FG).toBe(1.01); // common practice
    expect(SWEET_FROM_FG).toBe(1.025); // common practice
  });
});

describe('strengthOf — BJCP 2015 Mead Style Guidelines, Introduction: hydromel 3.5–7.5 %, standard 7.5–14 %, sack 14–18 % ABV', () => {
  it.each([
    [2, 'hydromel'],
    [3.5, 'hydromel'],
    [7.4, 'hydromel'],
    [7.5, 'standard'],
    [12, 'standard'],
    [13.9, 'standard'],
    [14, 'sack'],
    [18, 'sack'],
    [20, 'sack'],
  ] as const)('%s percent ABV is %s', (abv, strength) => {
    expect(strengthOf(abv)).toBe(strength);
  });

  it('rejects impossible strengths', () => {
    expectInputError(() => strengthOf(-1), 'abv');
    expectInputError(() => strengthOf(101), 'abv');
    expectInputError(() => strengthOf(Number.NaN), 'abv');
  });
});

describe('sweetnessOf — gravity bands quoted as BJCP mead guidance (common practice)', () => {
  // "Dry is 0.990–1.010, semi-sweet 1.010–1.025, sweet 1.025–1.050", quoted as
  // the BJCP guidelines in gotmead.com forum threads 15375 (2009) and 20710 (2012).
  it.each([
    [0.99, 'dry'],
    [0.996, 'dry'],
    [1.005, 'dry'],
    [1.009, 'dry'],
    [1.01, 'semi-sweet'],
    [1.018, 'semi-sweet'],
    [1.024, 'semi-sweet'],
    [1.025, 'sweet'],
    [1.04, 'sweet'],
    [1.05, 'sweet'],
  ] as const)('FG %s is %s', (fg, sweetness) => {
    expect(sweetnessOf(fg)).toBe(sweetness);
  });

  it('puts a computed gravity that lands on a band edge on the expected side', () => {
    expect(sweetnessOf(1.005 + 0.02)).toBe('sweet'); // 1.0250000000000001 or 1.0249999999999999
    expect(sweetnessOf(1.03 - 0.02)).toBe('semi-sweet');
  });

  it('rejects impossible gravities', () => {
    expectInputError(() => sweetnessOf(1.3), 'fg');
  });
});

describe('predictFinish', () => {
  it('pins the dry finish and the highest tolerance accepted', () => {
    expect(DRY_FINISH_SG).toBe(0.996); // fully fermented wines and meads end 0.990–1.000 (common practice)
    expect(MAX_TOLERANCE_ABV).toBe(25);
  });

  it('matches a forum worked example with the simple formula: OG 1.115 and a 14 % yeast stop at 1.008', () => {
    // gotmead.com forum thread 21487: "16 lbs in 5 gal ... 1.115 SG and would
    // hit 14% ABV at SG 1.008" (1.115 − 14/131.25 = 1.00833).
    const p = predictFinish({ og: 1.115, toleranceAbv: 14, formula: 'simple' });
    expect(Math.abs(p.fg - 1.008)).toBeLessThan(0.0005);
    expect(p.abv).toBeCloseTo(14, 9);
    expect(p.limitedBy).toBe('tolerance');
    expect(p.sweetness).toBe('dry');
  });

  it('with the high-gravity fit, OG 1.120 and a 14 % yeast stop at 1.0268 (Hall 1995, solved by hand)', () => {
    // ABV = k (OG·FG − FG²), k = 76.08 / ((1.775 − 1.120) × 0.794) = 146.29
    // FG² − 1.120 FG + 14/146.29 = 0 → FG = (1.120 + √(1.2544 − 0.38280)) / 2 = 1.02680
    const p = predictFinish({ og: 1.12, toleranceAbv: 14, formula: 'high-gravity' });
    expect(Math.abs(p.fg - 1.0268)).toBeLessThan(0.0002);
    expect(p.abv).toBeCloseTo(14, 9);
    expect(p.sweetness).toBe('sweet');
    expect(p.strength).toBe('sack');
    expect(p.limitedBy).toBe('tolerance');
  });

  it('by default (Balling), OG 1.120 and a 14 % yeast stop at 1.0181, the reference solved in the test', () => {
    const p = predictFinish({ og: 1.12, toleranceAbv: 14 });
    expect(Math.abs(p.fg - 1.01811)).toBeLessThan(0.00005);
    expect(Math.abs(p.fg - ballingReferenceFg(1.12, 14))).toBeLessThan(0.00001);
    expect(p.abv).toBeCloseTo(14, 9);
    expect(p.sweetness).toBe('semi-sweet');
    expect(p.limitedBy).toBe('tolerance');
  });

  it('ends at the dry finish when the sugar runs out before the yeast tires', () => {
    // Dry finish 0.996 is common practice (fully fermented wines end 0.990–1.000).
    // Balling by hand: OE 19.3310, AE −1.0409, RE 2.6423, ABW 8.9708 → 11.3006 % ABV.
    const p = predictFinish({ og: 1.08, toleranceAbv: 18 });
    expect(p.fg).toBe(0.996);
    expect(p.abv).toBeCloseTo(11.3006, 3);
    expect(p.sweetness).toBe('dry');
    expect(p.strength).toBe('standard');
    expect(p.limitedBy).toBe('sugar');
  });

  it('takes the dry finish it is given', () => {
    const p = predictFinish({ og: 1.05, toleranceAbv: 18, dryFg: 1.0, formula: 'simple' });
    expect(p.fg).toBe(1.0);
    expect(p.abv).toBeCloseTo(6.5625, 9); // 0.050 × 131.25
  });

  it.each([
    // [og, FG at 12 % by the Balling relations, solved in Python from the same relations]
    [1.09, 1.00127],
    [1.1, 1.01179],
    [1.11, 1.0223],
    [1.12, 1.0328],
    [1.13, 1.04329],
    [1.14, 1.05377],
    [1.15, 1.06424],
    [1.16, 1.07471],
  ])('a 12 percent yeast in OG %s stops at %s by the Balling relations', (og, fg) => {
    const p = predictFinish({ og, toleranceAbv: 12 });
    expect(Math.abs(p.fg - fg)).toBeLessThan(0.00002);
    expect(Math.abs(p.fg - ballingReferenceFg(og, 12))).toBeLessThan(0.00001);
    expect(p.limitedBy).toBe('tolerance');
  });

  it.each([1.128, 1.14, 1.16])('predicts a 14 percent yeast in OG %s to stop 0.008–0.017 below where the high-gravity fit says', (og) => {
    // The fit solved by hand in the test, as above: FG = (OG + √(OG² − 4·14/k)) / 2.
    const k = 76.08 / ((1.775 - og) * 0.794);
    const fitFg = (og + Math.sqrt(og * og - (4 * 14) / k)) / 2;
    const ballingFg = ballingReferenceFg(og, 14);
    expect(Math.abs(predictFinish({ og, toleranceAbv: 14, formula: 'high-gravity' }).fg - fitFg)).toBeLessThan(1e-9);
    expect(Math.abs(predictFinish({ og, toleranceAbv: 14 }).fg - ballingFg)).toBeLessThan(1e-5);
    expect(fitFg - ballingFg).toBeGreaterThan(0.008);
    expect(fitFg - ballingFg).toBeLessThan(0.017);
  });

  it('leaves an unfermentable must where it is', () => {
    const p = predictFinish({ og: 0.995, toleranceAbv: 14 });
    expect(p.fg).toBe(0.995);
    expect(p.abv).toBe(0);
    expect(p.limitedBy).toBe('sugar');
    expect(predictFinish({ og: 0.996, toleranceAbv: 14 }).abv).toBe(0);
  });

  it('fgAtAbv solves each formula for the final gravity', () => {
    expect(fgAtAbv(1.1, 13.125, 'simple')).toBeCloseTo(1.0, 12);
    expect(fgAtAbv(1.1, 0)).toBeCloseTo(1.1, 9);
    expect(Math.abs(fgAtAbv(1.128, 14) - 1.02657)).toBeLessThan(0.00002);
    expect(Math.abs(fgAtAbv(1.12, 14, 'high-gravity') - 1.0268)).toBeLessThan(0.0002);
  });

  it('fgAtAbv rejects an ABV the must cannot reach', () => {
    expectInputError(() => fgAtAbv(1.02, 30, 'simple'), 'abv', '30.0 % ABV cannot be reached from an original gravity of 1.020.');
    expectInputError(() => fgAtAbv(1.02, 90, 'high-gravity'), 'abv');
    expectInputError(() => fgAtAbv(1.02, 9), 'abv');
    expectInputError(() => fgAtAbv(1.1, 101), 'abv');
    expectInputError(() => fgAtAbv(1.1, 10, 'x' as never), 'formula');
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => predictFinish({ og: 1.3, toleranceAbv: 14 }), 'og');
    expectInputError(
      () => predictFinish({ og: 1.1, toleranceAbv: 30 }),
      'toleranceAbv',
      'Yeast alcohol tolerance must be between 0 and 25 % ABV (got 30 % ABV).',
    );
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: -2 }), 'toleranceAbv');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: Number.NaN }), 'toleranceAbv');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: 14, formula: 'x' as never }), 'formula');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: 14, dryFg: 0.5 }), 'dryFg');
  });
});

describe('finish messages', () => {
  it('name the value and its unit', () => {
    expectInputError(() => fgAtAbv(1.3, 10), 'og', 'Original gravity must be between 0.980 and 1.200 (got 1.300).');
    expectInputError(() => fgAtAbv(1.1, 101), 'abv', 'Alcohol must be between 0 and 100 % ABV (got 101 % ABV).');
    expectInputError(() => strengthOf(101), 'abv', 'Alcohol must be between 0 and 100 % ABV (got 101 % ABV).');
    expectInputError(() => sweetnessOf(1.3), 'fg', 'Final gravity must be between 0.980 and 1.200 (got 1.300).');
  });
});
