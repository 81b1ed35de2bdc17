/**
 * Alcohol by volume and attenuation from original and final gravity, by three formulas:
 *
 * - Balling (the default): the Balling relations. Original and apparent extract (°Plato, from
 *   OG and FG) give the real extract, RE = 0.1808·OE + 0.8192·AE; Balling's mass balance
 *   (2.0665 g of extract make 1 g of alcohol, 0.9565 g of CO₂ and 0.11 g of yeast) gives
 *   alcohol by weight, ABW = (OE − RE) / (2.0665 − 0.010665·OE); ABV = ABW × FG × ρwater / ρethanol
 *   at 20 °C. C. J. N. Balling, Die Gärungschemie (Prague, 1854); the relations as reviewed by
 *   Cutaia, Reid & Speers, J. Inst. Brew. 115 (2009) 318–327. It holds from beer to mead gravities.
 * - Simple: ABV = (OG − FG) × 131.25, the common linear approximation; it understates strong musts.
 * - High gravity: ABV = [76.08 × (OG − FG) / (1.775 − OG)] × (FG / 0.794), first published by
 *   M. Hall, Zymurgy (1995), and reprinted in R. Daniels, Designing Great Beers (1996). It agrees
 *   with the others at beer gravities and overstates mead-strength musts by 1–3 % ABV.
 */
import { sgToPlato } from './gravity';
import { CalcInputError, requireGravity, requireOneOf, showNumber } from './guards';
import { waterDensity } from './temperature';

/** Multiplier of the simple linear ABV formula (% ABV per unit of SG drop). */
export const ABV_SIMPLE_FACTOR = 131.25;

/** Balling: extract lost per unit of alcohol made, by mass (1 g alcohol + 0.9565 g CO₂ + 0.11 g yeast). */
export const BALLING_EXTRACT_PER_ALCOHOL = 2.0665;
/** Balling: share of the original extract left in the real extract at the apparent extract's zero (RE = 0.1808·OE + 0.8192·AE). */
export const BALLING_REAL_EXTRACT_OE_SHARE = 0.1808;
/** Density of absolute ethanol at 20 °C, kg/m³ (OIML R 22, International alcoholometric tables). */
export const ETHANOL_DENSITY_20C = 789.24;

/** The ABV formulas offered. */
export type AbvFormula = 'balling' | 'simple' | 'high-gravity';
/** Every formula, the default first, for pickers. */
export const ABV_FORMULAS: readonly AbvFormula[] = ['balling', 'simple', 'high-gravity'];
/** The formula used when none is named: the one that holds at mead gravities. */
export const DEFAULT_ABV_FORMULA: AbvFormula = 'balling';
/** Short name of each formula, to show beside every ABV figure ("12.9 % ABV, Balling"). */
export const ABV_FORMULA_LABELS: Readonly<Record<AbvFormula, string>> = {
  balling: 'Balling',
  simple: 'linear',
  'high-gravity': 'high-gravity fit',
};

/**
 * Checks an OG/FG pair: both in range and the final not above the original.
 * @param og - original gravity
 * @param fg - final (or current) gravity
 */
export function requireGravityPair(og: unknown, fg: unknown): { og: number; fg: number } {
  const o = requireGravity(og, 'og', 'Original gravity');
  const f = requireGravity(fg, 'fg', 'Final gravity');
  if (f > o) {
    throw new CalcInputError('fg', `Final gravity (${showNumber(f, 3)}) cannot be above the original gravity (${showNumber(o, 3)}).`);
  }
  return { og: o, fg: f };
}

/**
 * % ABV by the simple linear formula, (OG − FG) × 131.25.
 * @param og - original gravity
 * @param fg - final gravity
 */
export function abvSimple(og: number, fg: number): number {
  const p = requireGravityPair(og, fg);
  return (p.og - p.fg) * ABV_SIMPLE_FACTOR;
}

/**
 * % ABV by the high-gravity fit (Hall 1995); overstates mead-strength musts.
 * @param og - original gravity
 * @param fg - final gravity
 */
export function abvHighGravity(og: number, fg: number): number {
  const p = requireGravityPair(og, fg);
  return ((76.08 * (p.og - p.fg)) / (1.775 - p.og)) * (p.fg / 0.794);
}

/**
 * % ABV by the Balling relations (real extract, alcohol by weight, then by volume).
 * @param og - original gravity
 * @param fg - final gravity
 */
export function abvBalling(og: number, fg: number): number {
  const p = requireGravityPair(og, fg);
  return ballingAbvUnchecked(p.og, p.fg);
}

/**
 * The Balling relations for gravities already checked (predictFinish solves them for FG).
 * @param og - original gravity, within range
 * @param fg - final gravity, within range and not above `og`
 */
export function ballingAbvUnchecked(og: number, fg: number): number {
  const oe = sgToPlato(og);
  // RE = 0.1808·OE + 0.8192·AE, so the extract fermented, OE − RE, is 0.8192·(OE − AE);
  // never below zero, even where the fitted cubic wobbles between neighbouring doubles.
  const fermented = (1 - BALLING_REAL_EXTRACT_OE_SHARE) * Math.max(0, oe - sgToPlato(fg));
  const abw = fermented / (BALLING_EXTRACT_PER_ALCOHOL - ((BALLING_EXTRACT_PER_ALCOHOL - 1) * oe) / 100);
  return (abw * fg * waterDensity(20)) / ETHANOL_DENSITY_20C;
}

/**
 * % ABV by the chosen formula.
 * @param og - original gravity
 * @param fg - final gravity
 * @param formula - 'balling' (default), 'simple' or 'high-gravity'
 */
export function abvBy(og: number, fg: number, formula: AbvFormula = DEFAULT_ABV_FORMULA): number {
  const f = requireOneOf(formula, ABV_FORMULAS, 'formula', 'ABV formula');
  if (f === 'simple') return abvSimple(og, fg);
  return f === 'balling' ? abvBalling(og, fg) : abvHighGravity(og, fg);
}

/**
 * Apparent attenuation in %: the share of the gravity above 1.000 that is gone,
 * (OG − FG) / (OG − 1) × 100. Can exceed 100 % when the FG is below 1.000.
 * @param og - original gravity (must be above 1.000)
 * @param fg - final gravity
 */
export function apparentAttenuation(og: number, fg: number): number {
  const p = requireGravityPair(og, fg);
  if (p.og <= 1) {
    throw new CalcInputError('og', `Original gravity must be above 1.000 to work out attenuation (got ${showNumber(p.og, 3)}).`);
  }
  return ((p.og - p.fg) / (p.og - 1)) * 100;
}

/** Final gravity assumed by the "potential alcohol" convention. */
export const POTENTIAL_ABV_FG = 1.0;

/**
 * Potential % ABV of a must: the alcohol if it fermented down to 1.000, by the chosen
 * formula (Balling by default). A must at or below 1.000 has none.
 * @param og - original gravity of the must
 * @param formula - 'balling' (default), 'simple' or 'high-gravity'
 */
export function potentialAbv(og: number, formula: AbvFormula = DEFAULT_ABV_FORMULA): number {
  const o = requireGravity(og, 'og', 'Original gravity');
  const f = requireOneOf(formula, ABV_FORMULAS, 'formula', 'ABV formula');
  if (o <= POTENTIAL_ABV_FG) return 0;
  return abvBy(o, POTENTIAL_ABV_FG, f);
}
