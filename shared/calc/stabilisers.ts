/**
 * Stabiliser doses: potassium metabisulfite (KMS) for a free-SO₂ target, and
 * potassium sorbate.
 *
 * Free SO₂ needed for a molecular-SO₂ target at a given pH:
 *   free = molecular × (1 + 10^(pH − pKa)),  pKa = 1.81,
 * the first dissociation of sulfurous acid in wine, as used in
 * Zoecklein, Fugelsang, Gump & Nury, "Wine Analysis and Production" (1995).
 * The usual target is 0.8 mg/L molecular SO₂ for white wines and meads,
 * about 0.5 mg/L for reds (same source).
 *
 * Mass fractions come from the formulas and IUPAC standard atomic weights
 * (K 39.098, S 32.06, O 15.999, C 12.011, H 1.008):
 *   K₂S₂O₅ (222.31 g/mol) yields 2 SO₂ (128.12 g/mol): 57.6 % SO₂ by mass;
 *   potassium sorbate C₆H₇KO₂ (150.22 g/mol) carries sorbic acid C₆H₈O₂
 *   (112.13 g/mol): 74.6 % sorbic acid by mass.
 */
import { requireFiniteResult, requireNonNegative, requireRange } from './guards';

/** pKa of the HSO₃⁻/SO₂ equilibrium used for wine (Zoecklein et al. 1995). */
export const SO2_PKA = 1.81;
/** Fraction of the mass of potassium metabisulfite released as SO₂ (2·64.06 / 222.31). */
export const KMS_SO2_FRACTION = 0.576;
/** Fraction of the mass of potassium sorbate that is sorbic acid (112.13 / 150.22). */
export const SORBATE_SORBIC_FRACTION = 0.7465;
/** Default molecular SO₂ target, mg/L (the usual white-wine figure). */
export const DEFAULT_MOLECULAR_SO2 = 0.8;

/**
 * Sorbic acid, mg/L, by % ABV: the widely reproduced winemaking table
 * 10 % → 150, 11 % → 125, 12 % → 100, 13 % → 75, 14 % → 50 (common practice),
 * interpolated between rows. Below 10 % the same 25 mg/L per % is continued up
 * to a ceiling of 200 mg/L (the EU maximum for sorbic acid in wine); above 14 % it stays at 50.
 */
export const SORBIC_ACID_TABLE: readonly { abv: number; mgPerL: number }[] = [
  { abv: 10, mgPerL: 150 },
  { abv: 11, mgPerL: 125 },
  { abv: 12, mgPerL: 100 },
  { abv: 13, mgPerL: 75 },
  { abv: 14, mgPerL: 50 },
];
/** Ceiling on the sorbic-acid dose, mg/L (EU limit for wine). */
export const SORBIC_ACID_MAX_MG_PER_L = 200;

/**
 * Free SO₂ in mg/L that gives the molecular-SO₂ target at this pH.
 * @param pH - pH of the wine or mead (2.5–4.5)
 * @param molecularSo2 - molecular SO₂ target in mg/L (default 0.8)
 */
export function freeSo2Needed(pH: number, molecularSo2: number = DEFAULT_MOLECULAR_SO2): number {
  const p = requireRange(pH, 'pH', 'pH', 2.5, 4.5, 1);
  const m = requireRange(molecularSo2, 'molecularSo2', 'Molecular SO₂ target', 0.1, 2, 1, ' mg/L');
  return m * (1 + 10 ** (p - SO2_PKA));
}

/** Options for metabisulfiteGrams. */
export interface MetabisulfiteInput {
  /** Litres to treat. */
  volumeL: number;
  /** Measured pH. */
  pH: number;
  /** Molecular SO₂ target, mg/L (default 0.8). */
  molecularSo2?: number;
  /** Free SO₂ already measured, mg/L (default 0). */
  freeSo2Now?: number;
}

/**
 * Grams of potassium metabisulfite to bring free SO₂ up to the level the pH calls for.
 * Returns 0 when the free SO₂ already present is enough.
 * @param input.volumeL - litres to treat
 * @param input.pH - measured pH (2.5–4.5)
 * @param input.molecularSo2 - molecular SO₂ target in mg/L (default 0.8)
 * @param input.freeSo2Now - free SO₂ already present in mg/L (default 0)
 */
export function metabisulfiteGrams(input: MetabisulfiteInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  const target = freeSo2Needed(input.pH, input.molecularSo2 ?? DEFAULT_MOLECULAR_SO2);
  const now = requireRange(input.freeSo2Now ?? 0, 'freeSo2Now', 'Free SO₂ already present', 0, 500, 0, ' mg/L');
  const addMgPerL = Math.max(0, target - now);
  return requireFiniteResult((addMgPerL * volume) / 1000 / KMS_SO2_FRACTION, 'volumeL', 'Volume');
}

/**
 * Sorbic acid dose in mg/L for a given strength (see SORBIC_ACID_TABLE).
 * @param abv - % ABV of the wine or mead (0–25)
 */
export function sorbicAcidMgPerL(abv: number): number {
  const a = requireRange(abv, 'abv', 'Alcohol', 0, 25, 0, ' % ABV');
  // The table falls a steady 25 mg/L per % ABV: one straight line through its ends, held at
  // the 14 % figure above it and capped at the EU ceiling below.
  const first = SORBIC_ACID_TABLE[0];
  const last = SORBIC_ACID_TABLE[SORBIC_ACID_TABLE.length - 1];
  const slope = (last.mgPerL - first.mgPerL) / (last.abv - first.abv);
  return Math.min(SORBIC_ACID_MAX_MG_PER_L, Math.max(last.mgPerL, first.mgPerL + slope * (a - first.abv)));
}

/** Options for sorbateGrams. */
export interface SorbateInput {
  /** Litres to treat. */
  volumeL: number;
  /** % ABV of the wine or mead. */
  abv: number;
}

/**
 * Grams of potassium sorbate for the volume and strength (sorbic-acid table ÷ 74.65 %).
 * @param input.volumeL - litres to treat
 * @param input.abv - % ABV of the wine or mead (0–25)
 */
export function sorbateGrams(input: SorbateInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  const sorbic = sorbicAcidMgPerL(input.abv);
  return requireFiniteResult((sorbic * volume) / 1000 / SORBATE_SORBIC_FRACTION, 'volumeL', 'Volume');
}
