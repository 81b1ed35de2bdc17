/**
 * Predicted finish of a fermentation: the yeast stops when it reaches its
 * alcohol tolerance or when the sugar runs out, whichever comes first.
 * An estimate only: real yeasts often pass their nominal tolerance, or stop
 * short of it when starved of nutrients or chilled.
 */
import { ABV_FORMULAS, ABV_SIMPLE_FACTOR, abvBy, ballingAbvUnchecked, DEFAULT_ABV_FORMULA, type AbvFormula } from './abv';
import { CalcInputError, GRAVITY_MIN, requireGravity, requireOneOf, requireRange, showNumber } from './guards';
import { solveRising } from './solve';
import { strengthOf, sweetnessOf, type Strength, type Sweetness } from './style-bands';

/**
 * Gravity a must reaches when all its sugar is fermented. Common practice:
 * fully fermented wines and meads usually end between 0.990 and 1.000; this is
 * the middle of that range, a little on the high side.
 */
export const DRY_FINISH_SG = 0.996;
/** Highest yeast alcohol tolerance accepted (% ABV); no wine yeast ferments far beyond 20 %. */
export const MAX_TOLERANCE_ABV = 25;

/** Options for predictFinish. */
export interface PredictFinishInput {
  /** Original gravity of the must. */
  og: number;
  /** The yeast's stated alcohol tolerance, % ABV. */
  toleranceAbv: number;
  /** ABV formula; Balling by default (DEFAULT_ABV_FORMULA), the one that holds at mead gravities. */
  formula?: AbvFormula;
  /** Gravity reached if the sugar runs out (default DRY_FINISH_SG). */
  dryFg?: number;
}

/** What predictFinish returns. */
export interface PredictedFinish {
  /** Expected final gravity. */
  fg: number;
  /** Expected % ABV at that gravity. */
  abv: number;
  /** Sweetness class of the expected final gravity. */
  sweetness: Sweetness;
  /** Strength class of the expected ABV. */
  strength: Strength;
  /** Why the fermentation is expected to stop. */
  limitedBy: 'tolerance' | 'sugar';
}

/**
 * Expected final gravity, ABV and sweetness from the original gravity and the yeast's tolerance.
 * @param input.og - original gravity
 * @param input.toleranceAbv - the yeast's alcohol tolerance in % ABV (0–25)
 * @param input.formula - ABV formula: 'balling' (default), 'simple' or 'high-gravity'
 * @param input.dryFg - gravity when the sugar runs out (default 0.996)
 */
export function predictFinish(input: PredictFinishInput): PredictedFinish {
  const og = requireGravity(input.og, 'og', 'Original gravity');
  const tolerance = requireRange(input.toleranceAbv, 'toleranceAbv', 'Yeast alcohol tolerance', 0, MAX_TOLERANCE_ABV, 0, ' % ABV');
  const formula = requireOneOf(input.formula ?? DEFAULT_ABV_FORMULA, ABV_FORMULAS, 'formula', 'ABV formula');
  const dryFg = requireGravity(input.dryFg ?? DRY_FINISH_SG, 'dryFg', 'Dry finishing gravity');

  if (og <= dryFg) return result(og, 0, 'sugar');
  const abvIfDry = abvBy(og, dryFg, formula);
  if (abvIfDry <= tolerance) return result(dryFg, abvIfDry, 'sugar');
  return result(fgAtAbv(og, tolerance, formula), tolerance, 'tolerance');
}

/**
 * Gravity at which a must of original gravity `og` has made `abv` % alcohol,
 * by the chosen formula (the formula solved for FG).
 * @param og - original gravity
 * @param abv - % ABV reached
 * @param formula - 'balling' (default), 'simple' or 'high-gravity'
 */
export function fgAtAbv(og: number, abv: number, formula: AbvFormula = DEFAULT_ABV_FORMULA): number {
  const o = requireGravity(og, 'og', 'Original gravity');
  const a = requireRange(abv, 'abv', 'Alcohol', 0, 100, 0, ' % ABV');
  const f = requireOneOf(formula, ABV_FORMULAS, 'formula', 'ABV formula');
  const fg = f === 'balling' ? ballingFgAtAbv(o, a) : f === 'simple' ? o - a / ABV_SIMPLE_FACTOR : highGravityFgAtAbv(o, a);
  if (!(fg >= GRAVITY_MIN)) {
    throw new CalcInputError('abv', `${showNumber(a, 1)} % ABV cannot be reached from an original gravity of ${showNumber(o, 3)}.`);
  }
  return fg;
}

// ABV = k·(og·fg − fg²) with k = 76.08 / ((1.775 − og)·0.794); the larger root is the one
// between og/2 and og, i.e. the physically meaningful FG. NaN when out of reach.
function highGravityFgAtAbv(og: number, abv: number): number {
  const k = 76.08 / ((1.775 - og) * 0.794);
  return (og + Math.sqrt(og * og - (4 * abv) / k)) / 2;
}

// The Balling ABV falls steadily as FG rises, so its negative rises: solve between the lowest
// accepted gravity and the OG. NaN when even the lowest gravity gives less alcohol.
function ballingFgAtAbv(og: number, abv: number): number {
  // A hair of slack: at the very bottom of the range the relations are flat to within rounding.
  if (ballingAbvUnchecked(og, GRAVITY_MIN) < abv - 1e-9) return Number.NaN;
  return solveRising((fg) => -ballingAbvUnchecked(og, fg), -abv, GRAVITY_MIN, og);
}

function result(fg: number, abv: number, limitedBy: PredictedFinish['limitedBy']): PredictedFinish {
  return { fg, abv, sweetness: sweetnessOf(fg), strength: strengthOf(abv), limitedBy };
}
