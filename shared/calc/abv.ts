/**
 * Alcohol by volume and attenuation from original and final gravity.
 *
 * - Simple: ABV = (OG − FG) × 131.25, the common linear approximation.
 * - High gravity: ABV = [76.08 × (OG − FG) / (1.775 − OG)] × (FG / 0.794),
 *   given by Ray Daniels, "Designing Great Beers" (Brewers Publications, 1996).
 *   The first factor is alcohol by weight, growing faster than linearly as OG
 *   rises; FG/0.794 converts weight to volume (0.794 ≈ ethanol's SG).
 *   For strong musts it gives noticeably more than the simple formula.
 */
import { CalcInputError, requireGravity, requireOneOf, showNumber } from './guards';

/** Multiplier of the simple linear ABV formula (% ABV per unit of SG drop). */
export const ABV_SIMPLE_FACTOR = 131.25;

/** The two ABV formulas offered. */
export type AbvFormula = 'simple' | 'high-gravity';
/** Both formulas, for pickers. */
export const ABV_FORMULAS: readonly AbvFormula[] = ['simple', 'high-gravity'];

/**
 * Checks an OG/FG pair: both in range and the final not above the original.
 * @param og - original gravity
 * @param fg - final (or current) gravity
 */
export function requireGravityPair(og: unknown, fg: unknown): { og: number; fg: number } {
  const o = requireGravity(og, 'og', 'Original gravity');
  const f = requireGravity(fg, 'fg', 'Final gravity');
  if (f > o) {
    throw new CalcInputError(
      'fg',
      `Final gravity (${showNumber(f, 3)}) cannot be above the original gravity (${showNumber(o, 3)}).`,
    );
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
 * % ABV by the high-gravity formula (Daniels 1996), suited to mead-strength musts.
 * @param og - original gravity
 * @param fg - final gravity
 */
export function abvHighGravity(og: number, fg: number): number {
  const p = requireGravityPair(og, fg);
  return ((76.08 * (p.og - p.fg)) / (1.775 - p.og)) * (p.fg / 0.794);
}

/**
 * % ABV by the chosen formula.
 * @param og - original gravity
 * @param fg - final gravity
 * @param formula - 'high-gravity' (default) or 'simple'
 */
export function abvBy(og: number, fg: number, formula: AbvFormula = 'high-gravity'): number {
  const f = requireOneOf(formula, ABV_FORMULAS, 'formula', 'ABV formula');
  return f === 'simple' ? abvSimple(og, fg) : abvHighGravity(og, fg);
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
    throw new CalcInputError(
      'og',
      `Original gravity must be above 1.000 to work out attenuation (got ${showNumber(p.og, 3)}).`,
    );
  }
  return ((p.og - p.fg) / (p.og - 1)) * 100;
}

/** Final gravity assumed by the "potential alcohol" convention. */
export const POTENTIAL_ABV_FG = 1.0;

/**
 * Potential % ABV of a must: the alcohol if it fermented down to 1.000, by the
 * high-gravity formula (or the simple one if asked). A must at or below 1.000 has none.
 * @param og - original gravity of the must
 * @param formula - 'high-gravity' (default) or 'simple'
 */
export function potentialAbv(og: number, formula: AbvFormula = 'high-gravity'): number {
  const o = requireGravity(og, 'og', 'Original gravity');
  const f = requireOneOf(formula, ABV_FORMULAS, 'formula', 'ABV formula');
  if (o <= POTENTIAL_ABV_FG) return 0;
  return abvBy(o, POTENTIAL_ABV_FG, f);
}
