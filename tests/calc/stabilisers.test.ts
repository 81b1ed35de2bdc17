import { describe, it, expect } from 'vitest';
import {
  freeSo2Needed,
  metabisulfiteGrams,
  sorbicAcidMgPerL,
  sorbateGrams,
  KMS_SO2_FRACTION,
  SORBATE_SORBIC_FRACTION,
  SO2_PKA,
  DEFAULT_MOLECULAR_SO2,
  SORBIC_ACID_TABLE,
  SORBIC_ACID_MAX_MG_PER_L,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// IUPAC standard atomic weights (CIAAW, abridged/conventional values, 2021).
const K = 39.098;
const S = 32.06;
const O = 15.999;
const C = 12.011;
const H = 1.008;
// Same mass fractions worked from the formulas, independently of the code.
const SO2_SHARE_OF_KMS = (2 * (S + 2 * O)) / (2 * K + 2 * S + 5 * O); // 2 SO2 / K2S2O5 = 0.5763
const SORBIC_SHARE_OF_SORBATE = (6 * C + 8 * H + 2 * O) / (6 * C + 7 * H + K + 2 * O); // 0.7464

describe('mass fractions from atomic weights', () => {
  it('potassium metabisulfite is 57.6 % SO₂ by mass', () => {
    expect(Math.abs(KMS_SO2_FRACTION - SO2_SHARE_OF_KMS)).toBeLessThan(0.0005);
  });

  it('potassium sorbate is 74.6 % sorbic acid by mass', () => {
    expect(Math.abs(SORBATE_SORBIC_FRACTION - SORBIC_SHARE_OF_SORBATE)).toBeLessThan(0.0005);
  });
});

describe('free SO₂ for a molecular-SO₂ target', () => {
  // Free SO₂ (mg/L) for 0.8 mg/L molecular SO₂ by pH: the widely reproduced
  // winemaking table derived from pKa 1.81 (Zoecklein et al., Wine Analysis and
  // Production, 1995). Values from memory, printed to whole mg/L.
  it.each([
    [3.0, 13],
    [3.1, 16],
    [3.3, 26],
    [3.4, 32],
    [3.5, 40],
    [3.6, 50],
    [3.7, 63],
    [3.8, 79],
  ])('pH %s needs about %s mg/L free SO₂ for 0.8 mg/L molecular', (pH, mgPerL) => {
    expect(Math.abs(freeSo2Needed(pH, 0.8) - mgPerL)).toBeLessThanOrEqual(1);
  });

  // Same table's 0.5 mg/L column, used for red wines (from memory).
  it.each([
    [3.4, 20],
    [3.5, 25],
    [3.6, 31],
  ])('pH %s needs about %s mg/L free SO₂ for 0.5 mg/L molecular', (pH, mgPerL) => {
    expect(Math.abs(freeSo2Needed(pH, 0.5) - mgPerL)).toBeLessThanOrEqual(1);
  });

  it('defaults to the 0.8 mg/L target: 0.8 × (1 + 10^(3.4 − 1.81)) = 31.92 mg/L at pH 3.4 (worked by hand)', () => {
    expect(freeSo2Needed(3.4)).toBeCloseTo(31.924, 3);
  });

  it('pins the constants', () => {
    expect(SO2_PKA).toBe(1.81); // Zoecklein et al. (1995)
    expect(DEFAULT_MOLECULAR_SO2).toBe(0.8);
    expect(KMS_SO2_FRACTION).toBe(0.576);
    expect(SORBATE_SORBIC_FRACTION).toBe(0.7465);
  });
});

describe('metabisulfiteGrams', () => {
  it('23 L at pH 3.4 takes about 1.28 g KMS (32 mg/L × 23 L ÷ 0.5763)', () => {
    const expected = (32 * 23) / 1000 / SO2_SHARE_OF_KMS; // 1.277 g
    const got = metabisulfiteGrams({ volumeL: 23, pH: 3.4 });
    expect(Math.abs(got - expected) / expected).toBeLessThan(0.03); // table rounded to 1 mg/L
  });

  it.each([
    [3.0, 13],
    [3.5, 40],
    [3.8, 79],
  ])('10 L at pH %s: %s mg/L from the table, as grams of KMS', (pH, mgPerL) => {
    const expected = (mgPerL * 10) / 1000 / SO2_SHARE_OF_KMS;
    expect(Math.abs(metabisulfiteGrams({ volumeL: 10, pH }) - expected)).toBeLessThan(0.02);
  });

  it('only tops up what is missing', () => {
    // (31.924 − 20) mg/L × 23 L ÷ 0.5763, worked by hand: 0.4759 g.
    const topUp = metabisulfiteGrams({ volumeL: 23, pH: 3.4, freeSo2Now: 20 });
    expect(Math.abs(topUp - ((31.924 - 20) * 23) / 1000 / SO2_SHARE_OF_KMS)).toBeLessThan(0.001);
    expect(metabisulfiteGrams({ volumeL: 23, pH: 3.4, freeSo2Now: 60 })).toBe(0);
    expect(metabisulfiteGrams({ volumeL: 0, pH: 3.4 })).toBe(0);
  });

  it('needs more sulfite at higher pH', () => {
    expect(metabisulfiteGrams({ volumeL: 10, pH: 3.8 })).toBeGreaterThan(metabisulfiteGrams({ volumeL: 10, pH: 3.2 }));
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => metabisulfiteGrams({ volumeL: 10, pH: 2.4 }), 'pH', 'pH must be between 2.5 and 4.5 (got 2.4).');
    expectInputError(() => metabisulfiteGrams({ volumeL: 10, pH: 4.6 }), 'pH');
    expectInputError(() => metabisulfiteGrams({ volumeL: 10, pH: Number.NaN }), 'pH');
    expectInputError(() => metabisulfiteGrams({ volumeL: -1, pH: 3.4 }), 'volumeL');
    expectInputError(() => metabisulfiteGrams({ volumeL: 10, pH: 3.4, molecularSo2: 0 }), 'molecularSo2');
    expectInputError(() => metabisulfiteGrams({ volumeL: 10, pH: 3.4, freeSo2Now: -5 }), 'freeSo2Now');
    expectInputError(() => freeSo2Needed(3.4, Number.POSITIVE_INFINITY), 'molecularSo2');
  });
});

describe('sorbate', () => {
  // Sorbic acid by ABV — the widely reproduced winemaking table (common
  // practice, from memory): 10 % → 150, 11 % → 125, 12 % → 100, 13 % → 75, 14 % → 50 mg/L.
  it.each([
    [10, 150],
    [11, 125],
    [12, 100],
    [13, 75],
    [14, 50],
  ])('%s percent ABV takes %s mg/L sorbic acid', (abv, mgPerL) => {
    expect(sorbicAcidMgPerL(abv)).toBeCloseTo(mgPerL, 9);
    const expectedGrams = (mgPerL * 20) / 1000 / SORBIC_SHARE_OF_SORBATE;
    expect(Math.abs(sorbateGrams({ volumeL: 20, abv }) - expectedGrams)).toBeLessThan(0.005);
  });

  it('interpolates between table rows', () => {
    expect(sorbicAcidMgPerL(12.5)).toBeCloseTo(87.5, 9);
  });

  it('pins the table and the ceiling', () => {
    expect(SORBIC_ACID_TABLE).toEqual([
      { abv: 10, mgPerL: 150 },
      { abv: 11, mgPerL: 125 },
      { abv: 12, mgPerL: 100 },
      { abv: 13, mgPerL: 75 },
      { abv: 14, mgPerL: 50 },
    ]);
    expect(SORBIC_ACID_MAX_MG_PER_L).toBe(200);
  });

  it('stays at the 14 % figure for stronger wines and is capped at 200 mg/L (EU limit for wine) for weak ones', () => {
    expect(sorbicAcidMgPerL(17)).toBeCloseTo(50, 9);
    expect(sorbicAcidMgPerL(9)).toBeCloseTo(175, 9);
    expect(sorbicAcidMgPerL(6)).toBeCloseTo(200, 9);
    expect(sorbicAcidMgPerL(0)).toBeCloseTo(200, 9);
    expect(sorbicAcidMgPerL(8)).toBeCloseTo(200, 9); // 150 + 2 × 25, just at the ceiling
    expect(sorbicAcidMgPerL(25)).toBeCloseTo(50, 9);
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => sorbateGrams({ volumeL: 10, abv: 30 }), 'abv', 'Alcohol must be between 0 and 25 % ABV (got 30 % ABV).');
    expectInputError(() => sorbateGrams({ volumeL: 10, abv: -1 }), 'abv');
    expectInputError(() => sorbateGrams({ volumeL: -10, abv: 12 }), 'volumeL');
    expectInputError(() => sorbateGrams({ volumeL: Number.NaN, abv: 12 }), 'volumeL');
  });
});

describe('stabiliser messages', () => {
  it('name the value, its unit and its range', () => {
    expectInputError(() => freeSo2Needed(3.4, 3), 'molecularSo2', 'Molecular SO₂ target must be between 0.1 and 2.0 mg/L (got 3.0 mg/L).');
    expectInputError(() => metabisulfiteGrams({ volumeL: -1, pH: 3.4 }), 'volumeL', 'Volume cannot be negative (got -1 L).');
    expectInputError(
      () => metabisulfiteGrams({ volumeL: 10, pH: 3.4, freeSo2Now: 600 }),
      'freeSo2Now',
      'Free SO₂ already present must be between 0 and 500 mg/L (got 600 mg/L).',
    );
    expectInputError(() => metabisulfiteGrams({ volumeL: 1e308, pH: 3.4 }), 'volumeL', 'Volume is too large to work with.');
    expectInputError(() => sorbateGrams({ volumeL: -2, abv: 12 }), 'volumeL', 'Volume cannot be negative (got -2 L).');
    expectInputError(() => sorbateGrams({ volumeL: 1e308, abv: 12 }), 'volumeL', 'Volume is too large to work with.');
  });
});
