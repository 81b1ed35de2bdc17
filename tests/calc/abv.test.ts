import { describe, it, expect } from 'vitest';
import {
  abvSimple,
  abvHighGravity,
  abvBalling,
  abvBy,
  apparentAttenuation,
  potentialAbv,
  ABV_FORMULAS,
  ABV_FORMULA_LABELS,
  ABV_FORMULA_KEYS,
  ABV_SIMPLE_FACTOR,
  BALLING_EXTRACT_PER_ALCOHOL,
  BALLING_REAL_EXTRACT_OE_SHARE,
  DEFAULT_ABV_FORMULA,
  ETHANOL_DENSITY_20C,
  POTENTIAL_ABV_FG,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';
import { ballingReferenceAbv, linearReferenceAbv } from './reference-abv';

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

describe('abvHighGravity — 76.08 (OG − FG)/(1.775 − OG) × FG/0.794, first published by M. Hall, Zymurgy (1995)', () => {
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

describe('abvBalling — the Balling relations (Balling 1854, as reviewed by Cutaia, Reid & Speers, J. Inst. Brew. 2009)', () => {
  // Worked by hand, step by step: OE and AE by the ASBC-table cubic for °Plato;
  // RE = 0.1808 OE + 0.8192 AE; ABW = (OE − RE)/(2.0665 − 0.010665 OE);
  // ABV = ABW × FG × 998.207/789.24 (water by Tanaka et al. 2001, ethanol by OIML R 22, 20 °C).
  it.each([
    [1.05, 1.01, 5.3161], // OE 12.3876, AE 2.5608, RE 4.3375, ABW 4.1616
    [1.1, 1.0, 13.5852], // OE 23.7689, AE −0.0030, RE 4.2950, ABW 10.7412
    [1.128, 1.01, 16.2585], // OE 29.7395, AE 2.5608, RE 7.4747, ABW 12.7276
    [1.16, 1.02, 19.5991], // OE 36.2376, AE 5.0809, RE 10.7140, ABW 15.1923
    [1.08, 0.996, 11.3006], // OE 19.3310, AE −1.0409, RE 2.6423, ABW 8.9708
  ])('OG %s → FG %s gives %s percent ABV', (og, fg, expected) => {
    expect(abvBalling(og, fg)).toBeCloseTo(expected, 3);
  });

  it('is zero when nothing has fermented', () => {
    expect(abvBalling(1.1, 1.1)).toBe(0);
  });
});

describe('the three formulas against the Balling relations worked in the test, 1.040–1.160', () => {
  const pairs: [number, number][] = [];
  for (let og = 1.04; og <= 1.1605; og += 0.01) {
    for (const fg of [0.994, 1.0, 1.01, 1.02]) if (fg < og) pairs.push([Number(og.toFixed(3)), fg]);
  }

  it.each(pairs)('Balling: OG %s → FG %s agrees with the reference within 0.001 % ABV', (og, fg) => {
    expect(Math.abs(abvBalling(og, fg) - ballingReferenceAbv(og, fg))).toBeLessThan(0.001);
  });

  it.each(pairs.filter(([og]) => og <= 1.06))('beer gravities, OG %s → FG %s: all three within 0.15 % ABV', (og, fg) => {
    const reference = ballingReferenceAbv(og, fg);
    expect(Math.abs(abvSimple(og, fg) - reference)).toBeLessThan(0.15);
    expect(Math.abs(abvHighGravity(og, fg) - reference)).toBeLessThan(0.15);
  });

  // The reason for the default: at mead gravities the high-gravity fit overstates the alcohol
  // and the linear formula understates it, while the Balling relations hold.
  it.each(pairs.filter(([og]) => og >= 1.12))('mead gravities, OG %s → FG %s: the fit overstates, the linear understates', (og, fg) => {
    const reference = ballingReferenceAbv(og, fg);
    expect(abvHighGravity(og, fg) - reference).toBeGreaterThan(0.9);
    expect(reference - linearReferenceAbv(og, fg)).toBeGreaterThan(0.4);
    expect(Math.abs(abvBy(og, fg) - reference)).toBeLessThan(0.001);
  });

  it('at 1.128 → 1.010 gives 16.3 % where the fit gives 17.7 % and the linear 15.5 %', () => {
    expect(abvBy(1.128, 1.01)).toBeCloseTo(16.26, 2);
    expect(abvHighGravity(1.128, 1.01)).toBeCloseTo(17.65, 2);
    expect(abvSimple(1.128, 1.01)).toBeCloseTo(15.49, 2);
  });
});

describe('choosing a formula', () => {
  it('makes Balling the default and offers all three, each with a label and a footnote', () => {
    expect(DEFAULT_ABV_FORMULA).toBe('balling');
    expect(ABV_FORMULAS).toEqual(['balling', 'simple', 'high-gravity']);
    expect(ABV_FORMULA_LABELS).toEqual({ balling: 'Balling', simple: 'linear', 'high-gravity': 'high-gravity fit' });
    expect(ABV_FORMULA_KEYS).toEqual({ balling: 'abvBalling', simple: 'abvSimple', 'high-gravity': 'abvHighGravity' });
  });

  it('abvBy picks the formula asked for, Balling when none is named', () => {
    expect(abvBy(1.1, 1.0, 'simple')).toBeCloseTo(13.125, 9);
    expect(abvBy(1.1, 1.0, 'high-gravity')).toBeCloseTo(14.1953, 3);
    expect(abvBy(1.1, 1.0, 'balling')).toBeCloseTo(13.5852, 3);
    expect(abvBy(1.1, 1.0)).toBeCloseTo(13.5852, 3);
  });

  it('pins the constants of the formulas', () => {
    expect(ABV_SIMPLE_FACTOR).toBe(131.25);
    expect(BALLING_EXTRACT_PER_ALCOHOL).toBe(2.0665); // 1 g alcohol + 0.9565 g CO₂ + 0.11 g yeast
    expect(BALLING_REAL_EXTRACT_OE_SHARE).toBe(0.1808); // RE = 0.1808 OE + 0.8192 AE (from memory)
    expect(ETHANOL_DENSITY_20C).toBe(789.24); // OIML R 22 (from memory)
    expect(POTENTIAL_ABV_FG).toBe(1);
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
    expectInputError(() => apparentAttenuation(1.0, 0.99), 'og', 'Original gravity must be above 1.000 to work out attenuation (got 1.000).');
    expect(apparentAttenuation(1.001, 1.0)).toBeCloseTo(100, 6);
  });
});

describe('potentialAbv — ABV if fermented to 1.000 (the potential-alcohol convention)', () => {
  it('uses FG 1.000 with any formula, Balling by default', () => {
    expect(potentialAbv(1.1, 'simple')).toBeCloseTo(13.125, 9); // 0.100 × 131.25
    expect(potentialAbv(1.1, 'high-gravity')).toBeCloseTo(14.1953, 3); // worked above
    expect(potentialAbv(1.1)).toBeCloseTo(13.5852, 3); // Balling, worked above
  });

  it('is zero for a must that has no sugar to ferment', () => {
    expect(potentialAbv(0.998)).toBe(0);
    expect(potentialAbv(1.0)).toBe(0);
    expect(potentialAbv(1.001, 'simple')).toBeCloseTo(0.13125, 9);
  });
});

describe('ABV input checks', () => {
  it('rejects an impossible original gravity with a plain message', () => {
    expectInputError(() => abvSimple(1.35, 1.0), 'og', 'Original gravity must be between 0.980 and 1.200 (got 1.350).');
    expectInputError(() => abvHighGravity(0.97, 0.97), 'og');
    expectInputError(() => abvBalling(1.21, 1.0), 'og');
  });

  it('rejects a final gravity above the original', () => {
    expectInputError(() => abvHighGravity(1.05, 1.06), 'fg', 'Final gravity (1.060) cannot be above the original gravity (1.050).');
    expectInputError(() => abvSimple(1.05, 1.06), 'fg');
    expectInputError(() => abvBalling(1.05, 1.0501), 'fg');
    expectInputError(() => apparentAttenuation(1.05, 1.06), 'fg');
  });

  it('rejects NaN and Infinity rather than returning them', () => {
    expectInputError(() => abvSimple(Number.NaN, 1.0), 'og', 'Original gravity must be a number (got NaN).');
    expectInputError(() => abvHighGravity(1.1, Number.POSITIVE_INFINITY), 'fg');
    expectInputError(() => abvBalling(1.1, Number.NaN), 'fg', 'Final gravity must be a number (got NaN).');
    expectInputError(() => potentialAbv(Number.NaN), 'og');
    expectInputError(() => abvSimple('1.1' as never, 1.0), 'og');
  });

  it('rejects an unknown formula', () => {
    expectInputError(
      () => abvBy(1.1, 1.0, 'guess' as never),
      'formula',
      "ABV formula must be one of 'balling', 'simple', 'high-gravity' (got 'guess').",
    );
    expectInputError(() => potentialAbv(1.1, 'guess' as never), 'formula');
  });
});
