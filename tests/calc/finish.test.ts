import { describe, it, expect } from 'vitest';
import { predictFinish, fgAtAbv, sweetnessOf, strengthOf, abvHighGravity, DRY_FINISH_SG } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

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
  it('matches a forum worked example with the simple formula: OG 1.115 and a 14 % yeast stop at 1.008', () => {
    // gotmead.com forum thread 21487: "16 lbs in 5 gal ... 1.115 SG and would
    // hit 14% ABV at SG 1.008" (1.115 − 14/131.25 = 1.00833).
    const p = predictFinish({ og: 1.115, toleranceAbv: 14, formula: 'simple' });
    expect(Math.abs(p.fg - 1.008)).toBeLessThan(0.0005);
    expect(p.abv).toBeCloseTo(14, 9);
    expect(p.limitedBy).toBe('tolerance');
    expect(p.sweetness).toBe('dry');
  });

  it('with the high-gravity formula, OG 1.120 and a 14 % yeast stop at 1.0268 (Daniels 1996 solved by hand)', () => {
    // ABV = k (OG·FG − FG²), k = 76.08 / ((1.775 − 1.120) × 0.794) = 146.29
    // FG² − 1.120 FG + 14/146.29 = 0 → FG = (1.120 + √(1.2544 − 0.38280)) / 2 = 1.02680
    const p = predictFinish({ og: 1.12, toleranceAbv: 14 });
    expect(Math.abs(p.fg - 1.0268)).toBeLessThan(0.0002);
    expect(p.abv).toBeCloseTo(14, 9);
    expect(p.sweetness).toBe('sweet');
    expect(p.strength).toBe('sack');
    expect(p.limitedBy).toBe('tolerance');
  });

  it('ends at the dry finish when the sugar runs out before the yeast tires', () => {
    // Dry finish 0.996 is common practice (fully fermented wines end 0.990–1.000).
    // ABV by hand: 76.08 × 0.084 / 0.695 = 9.1952; × 0.996 / 0.794 = 11.5345
    const p = predictFinish({ og: 1.08, toleranceAbv: 18 });
    expect(p.fg).toBe(DRY_FINISH_SG);
    expect(p.abv).toBeCloseTo(11.5345, 3);
    expect(p.sweetness).toBe('dry');
    expect(p.strength).toBe('standard');
    expect(p.limitedBy).toBe('sugar');
  });

  it.each([1.09, 1.1, 1.11, 1.12, 1.13, 1.14, 1.15, 1.16])(
    'a 12 percent yeast in OG %s: the predicted FG gives back 12 percent by the same formula',
    (og) => {
      const p = predictFinish({ og, toleranceAbv: 12 });
      expect(abvHighGravity(og, p.fg)).toBeCloseTo(12, 6);
      expect(p.fg).toBeLessThan(og);
      expect(p.fg).toBeGreaterThan(DRY_FINISH_SG);
    },
  );

  it('gets sweeter as the must gets stronger for the same yeast', () => {
    const fgs = [1.1, 1.12, 1.14, 1.16].map((og) => predictFinish({ og, toleranceAbv: 14 }).fg);
    for (let i = 1; i < fgs.length; i++) expect(fgs[i]).toBeGreaterThan(fgs[i - 1]);
  });

  it('predicts the high-gravity finish above the simple one for a strong must', () => {
    const high = predictFinish({ og: 1.13, toleranceAbv: 15 });
    const simple = predictFinish({ og: 1.13, toleranceAbv: 15, formula: 'simple' });
    expect(high.fg).toBeGreaterThan(simple.fg);
  });

  it('leaves an unfermentable must where it is', () => {
    const p = predictFinish({ og: 0.995, toleranceAbv: 14 });
    expect(p.fg).toBe(0.995);
    expect(p.abv).toBe(0);
  });

  it('fgAtAbv rejects an ABV the must cannot reach', () => {
    expectInputError(() => fgAtAbv(1.02, 30, 'simple'), 'abv');
    expectInputError(() => fgAtAbv(1.02, 90), 'abv');
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => predictFinish({ og: 1.3, toleranceAbv: 14 }), 'og');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: 30 }), 'toleranceAbv');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: -2 }), 'toleranceAbv');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: Number.NaN }), 'toleranceAbv');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: 14, formula: 'x' as never }), 'formula');
    expectInputError(() => predictFinish({ og: 1.1, toleranceAbv: 14, dryFg: 0.5 }), 'dryFg');
  });
});
