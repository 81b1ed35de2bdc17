import { describe, it, expect } from 'vitest';
import { abvSimple, abvHighGravity, abvBy, apparentAttenuation, potentialAbv } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

describe('abvSimple — (OG − FG) × 131.25, the common linear formula', () => {
  it.each([
    // [og, fg, expected] worked by hand from the formula
    [1.05, 1.01, 5.25], // 0.040 × 131.25
    [1.1, 1.0, 13.125], // 0.100 × 131.25
    [1.12, 1.01, 14.4375], // 0.110 × 131.25
    [1.108, 1.012, 12.6], // 0.096 × 131.25
    [1.14, 0.996, 18.9], // 0.144 × 131.25
  ])('OG %s → FG %s gives %s percent ABV', (og, fg, expected) => {
    expect(abvSimple(og, fg)).toBeCloseTo(expected, 6);
  });

  it('is zero when nothing has fermented', () => {
    expect(abvSimple(1.09, 1.09)).toBe(0);
  });
});

describe('abvHighGravity — Daniels, Designing Great Beers (1996): 76.08 (OG − FG)/(1.775 − OG) × FG/0.794', () => {
  it('matches the worked example OG 1.052 / FG 1.012 → 5.3648 % (mathhelpforum.com thread "Complex Formula", 2013)', () => {
    expect(abvHighGravity(1.052, 1.012)).toBeCloseTo(5.3648, 3);
  });

  it.each([
    // Worked by hand: ABW = 76.08 × ΔSG / (1.775 − OG); ABV = ABW × FG / 0.794
    [1.1, 1.0, 14.1953], // 76.08 × 0.100 / 0.675 = 11.2711; × 1.000/0.794
    [1.12, 1.01, 16.2526], // 76.08 × 0.110 / 0.655 = 12.7768; × 1.010/0.794
    [1.15, 1.02, 20.3289], // 76.08 × 0.130 / 0.625 = 15.8246; × 1.020/0.794
  ])('OG %s → FG %s gives %s percent ABV', (og, fg, expected) => {
    expect(abvHighGravity(og, fg)).toBeCloseTo(expected, 3);
  });
});

describe('the two ABV formulas', () => {
  // Daniels (1996) introduces the second formula because the linear one
  // understates alcohol in strong worts; the two agree for ordinary beers.
  it('give more alcohol by the high-gravity formula for a strong must (OG 1.120 → FG 1.010)', () => {
    const simple = abvSimple(1.12, 1.01);
    const high = abvHighGravity(1.12, 1.01);
    expect(high).toBeGreaterThan(simple + 1.5);
  });

  it('agree closely for an ordinary beer-strength wort (OG 1.040 → FG 1.008)', () => {
    expect(Math.abs(abvHighGravity(1.04, 1.008) - abvSimple(1.04, 1.008))).toBeLessThan(0.1);
  });

  it.each([1.06, 1.08, 1.1, 1.12, 1.14, 1.16])('diverge more as OG rises (OG %s, FG 1.000)', (og) => {
    const gap = abvHighGravity(og, 1.0) - abvSimple(og, 1.0);
    const lowerGap = abvHighGravity(og - 0.02, 1.0) - abvSimple(og - 0.02, 1.0);
    expect(gap).toBeGreaterThan(lowerGap);
  });

  it('abvBy picks the formula asked for', () => {
    expect(abvBy(1.1, 1.0, 'simple')).toBeCloseTo(13.125, 9);
    expect(abvBy(1.1, 1.0, 'high-gravity')).toBeCloseTo(14.1953, 3);
    expect(abvBy(1.1, 1.0)).toBeCloseTo(14.1953, 3);
  });
});

describe('apparentAttenuation — (OG − FG)/(OG − 1), standard brewing definition', () => {
  it.each([
    [1.05, 1.01, 80],
    [1.1, 1.0, 100],
    [1.1, 0.995, 105],
    [1.12, 1.03, 75],
  ])('OG %s → FG %s is %s percent', (og, fg, expected) => {
    expect(apparentAttenuation(og, fg)).toBeCloseTo(expected, 6);
  });

  it('cannot be worked out for a must at or below 1.000', () => {
    expectInputError(() => apparentAttenuation(1.0, 0.99), 'og');
  });
});

describe('potentialAbv — ABV if fermented to 1.000 (the potential-alcohol convention)', () => {
  it('uses FG 1.000 with either formula', () => {
    expect(potentialAbv(1.1, 'simple')).toBeCloseTo(13.125, 9); // 0.100 × 131.25
    expect(potentialAbv(1.1)).toBeCloseTo(14.1953, 3); // Daniels, as worked above
  });

  it('is zero for a must that has no sugar to ferment', () => {
    expect(potentialAbv(0.998)).toBe(0);
    expect(potentialAbv(1.0)).toBe(0);
  });
});

describe('ABV input checks', () => {
  it('rejects an impossible original gravity with a plain message', () => {
    expectInputError(() => abvSimple(1.35, 1.0), 'og', 'Original gravity must be between 0.980 and 1.200 (got 1.350).');
    expectInputError(() => abvHighGravity(0.97, 0.97), 'og');
  });

  it('rejects a final gravity above the original', () => {
    expectInputError(
      () => abvHighGravity(1.05, 1.06),
      'fg',
      'Final gravity (1.060) cannot be above the original gravity (1.050).',
    );
    expectInputError(() => abvSimple(1.05, 1.06), 'fg');
    expectInputError(() => apparentAttenuation(1.05, 1.06), 'fg');
  });

  it('rejects NaN and Infinity rather than returning them', () => {
    expectInputError(() => abvSimple(Number.NaN, 1.0), 'og', 'Original gravity must be a number (got NaN).');
    expectInputError(() => abvHighGravity(1.1, Number.POSITIVE_INFINITY), 'fg');
    expectInputError(() => potentialAbv(Number.NaN), 'og');
    expectInputError(() => abvSimple('1.1' as never, 1.0), 'og');
  });

  it('rejects an unknown formula', () => {
    expectInputError(() => abvBy(1.1, 1.0, 'guess' as never), 'formula');
    expectInputError(() => potentialAbv(1.1, 'guess' as never), 'formula');
  });
});
