import { describe, it, expect } from 'vitest';
import {
  freeSo2Needed,
  metabisulfiteGrams,
  sorbicAcidMgPerL,
  sorbateGrams,
  KMS_SO2_FRACTION,
  SORBATE_SORBIC_FRACTION,
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

  it('defaults to the 0.8 mg/L target', () => {
    expect(freeSo2Needed(3.4)).toBe(freeSo2Needed(3.4, 0.8));
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
    const full = metabisulfiteGrams({ volumeL: 23, pH: 3.4 });
    const topUp = metabisulfiteGrams({ volumeL: 23, pH: 3.4, freeSo2Now: 20 });
    expect(topUp).toBeCloseTo(full - (20 * 23) / 1000 / KMS_SO2_FRACTION, 9);
    expect(metabisulfiteGrams({ volumeL: 23, pH: 3.4, freeSo2Now: 60 })).toBe(0);
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

  it('stays at the 14 % figure for stronger wines and is capped at 200 mg/L (EU limit for wine) for weak ones', () => {
    expect(sorbicAcidMgPerL(17)).toBeCloseTo(50, 9);
    expect(sorbicAcidMgPerL(9)).toBeCloseTo(175, 9);
    expect(sorbicAcidMgPerL(6)).toBeCloseTo(200, 9);
    expect(sorbicAcidMgPerL(0)).toBeCloseTo(200, 9);
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => sorbateGrams({ volumeL: 10, abv: 30 }), 'abv');
    expectInputError(() => sorbateGrams({ volumeL: 10, abv: -1 }), 'abv');
    expectInputError(() => sorbateGrams({ volumeL: -10, abv: 12 }), 'volumeL');
    expectInputError(() => sorbateGrams({ volumeL: Number.NaN, abv: 12 }), 'volumeL');
  });
});
