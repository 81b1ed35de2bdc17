/**
 * Conversions between specific gravity (20 °C/20 °C, water = 1.000) and the
 * sugar-by-mass scales °Brix and °Plato.
 *
 * - °Brix: cubic fit to the sucrose table of NBS Circular C440 (Bates et al.,
 *   "Polarimetry, Saccharimetry and the Sugars", 1942), as given in the
 *   Wikipedia article "Brix": °Bx = 182.46007·SG³ − 775.68212·SG² + 1262.7794·SG − 669.56218,
 *   stated RMS disagreement with the table 0.0009 °Bx over 0–40 °Bx.
 * - °Plato: the widely published cubic fit to the ASBC extract tables,
 *   °P = −616.868 + 1111.14·SG − 630.272·SG² + 135.997·SG³.
 *
 * Both fits are made for 1.000–1.179 (0–40 °); above that (up to 1.200) they
 * are extrapolations. Below 1.000 they give the negative "apparent" values a
 * hydrometer scale would show in an alcoholic liquid.
 * The inverse directions are solved numerically so that a round trip returns
 * the starting value.
 */
import { CalcInputError, GRAVITY_MAX, GRAVITY_MIN, requireFinite, requireGravity, showNumber } from './guards';
import { solveRising } from './solve';

/**
 * °Brix from specific gravity (NBS C440 fit).
 * @param sg - specific gravity at 20/20 °C
 */
export function sgToBrix(sg: number): number {
  const g = requireGravity(sg, 'sg', 'Specific gravity');
  return brixPolynomial(g);
}

/**
 * Specific gravity from °Brix (inverse of sgToBrix).
 * @param brix - degrees Brix (sucrose % by mass)
 */
export function brixToSg(brix: number): number {
  const b = requireScale(brix, 'brix', 'Brix', BRIX_MIN, BRIX_MAX);
  return solveRising(brixPolynomial, b, GRAVITY_MIN, GRAVITY_MAX);
}

/**
 * °Plato from specific gravity (ASBC-table cubic fit).
 * @param sg - specific gravity at 20/20 °C
 */
export function sgToPlato(sg: number): number {
  const g = requireGravity(sg, 'sg', 'Specific gravity');
  return platoPolynomial(g);
}

/**
 * Specific gravity from °Plato (inverse of sgToPlato).
 * @param plato - degrees Plato (extract % by mass)
 */
export function platoToSg(plato: number): number {
  const p = requireScale(plato, 'plato', 'Plato', PLATO_MIN, PLATO_MAX);
  return solveRising(platoPolynomial, p, GRAVITY_MIN, GRAVITY_MAX);
}

/**
 * Gravity points: (SG − 1) × 1000, the trade's shorthand (1.085 → 85).
 * @param sg - specific gravity
 */
export function gravityPoints(sg: number): number {
  const g = requireGravity(sg, 'sg', 'Specific gravity');
  return (g - 1) * 1000;
}

function brixPolynomial(sg: number): number {
  return ((182.46007 * sg - 775.68212) * sg + 1262.7794) * sg - 669.56218;
}

function platoPolynomial(sg: number): number {
  return ((135.997 * sg - 630.272) * sg + 1111.14) * sg - 616.868;
}

/** Lowest °Brix accepted (the Brix of the lowest accepted gravity). */
export const BRIX_MIN = brixPolynomial(GRAVITY_MIN);
/** Highest °Brix accepted (the Brix of the highest accepted gravity). */
export const BRIX_MAX = brixPolynomial(GRAVITY_MAX);
/** Lowest °Plato accepted (the Plato of the lowest accepted gravity). */
export const PLATO_MIN = platoPolynomial(GRAVITY_MIN);
/** Highest °Plato accepted (the Plato of the highest accepted gravity). */
export const PLATO_MAX = platoPolynomial(GRAVITY_MAX);

function requireScale(value: unknown, field: string, label: string, min: number, max: number): number {
  const n = requireFinite(value, field, label);
  // The limits are irrational; compare with a hair of slack so the exact
  // Brix of 0.980 or 1.200 is still accepted after rounding for display.
  if (n < min - 1e-9 || n > max + 1e-9) {
    throw new CalcInputError(
      field,
      `${label} must be between ${showNumber(Math.ceil(min * 10) / 10, 1)} and ${showNumber(Math.floor(max * 10) / 10, 1)} (got ${showNumber(n, 1)}).`,
    );
  }
  return Math.min(Math.max(n, min), max);
}
