/**
 * Mead sweetness and strength classes.
 *
 * Strength: BJCP 2015 Mead Style Guidelines, Introduction, "Strength" —
 * hydromel 3.5–7.5 % ABV, standard 7.5–14 %, sack 14–18 %. Values below the
 * hydromel band are still called hydromel and above 18 % still sack.
 *
 * Sweetness by final gravity: dry below 1.010, semi-sweet 1.010–1.025, sweet
 * 1.025 and above. These bands (dry 0.990–1.010, semi-sweet 1.010–1.025,
 * sweet 1.025–1.050) are widely quoted as BJCP mead guidance, but the 2015
 * guidelines judge sweetness by taste, so treat them as common practice.
 * Perceived sweetness also depends on acid, alcohol and tannin.
 */
import { requireGravity, requireRange } from './guards';

/** Sweetness classes. */
export type Sweetness = 'dry' | 'semi-sweet' | 'sweet';
/** Strength classes. */
export type Strength = 'hydromel' | 'standard' | 'sack';

/** Final gravity at and above which a mead is semi-sweet (common practice, see module note). */
export const SEMI_SWEET_FROM_FG = 1.01;
/** Final gravity at and above which a mead is sweet (common practice, see module note). */
export const SWEET_FROM_FG = 1.025;
/** % ABV at and above which a mead is standard strength (BJCP 2015). */
export const STANDARD_FROM_ABV = 7.5;
/** % ABV at and above which a mead is sack strength (BJCP 2015). */
export const SACK_FROM_ABV = 14;

// Gravities and ABVs arrive as computed floats; this keeps 1.0250000000001 and
// 1.0249999999999 on the same side of a band edge.
const EDGE = 1e-9;

/**
 * Sweetness class from the final gravity.
 * @param fg - final gravity
 */
export function sweetnessOf(fg: number): Sweetness {
  const g = requireGravity(fg, 'fg', 'Final gravity');
  if (g >= SWEET_FROM_FG - EDGE) return 'sweet';
  if (g >= SEMI_SWEET_FROM_FG - EDGE) return 'semi-sweet';
  return 'dry';
}

/**
 * Strength class from % ABV.
 * @param abv - alcohol by volume in %
 */
export function strengthOf(abv: number): Strength {
  const a = requireRange(abv, 'abv', 'Alcohol', 0, 100, 0, ' % ABV');
  if (a >= SACK_FROM_ABV - EDGE) return 'sack';
  if (a >= STANDARD_FROM_ABV - EDGE) return 'standard';
  return 'hydromel';
}
