/**
 * Honey or sugar needed to bring a must to a target gravity.
 *
 * Sugar in a litre of must = °Brix/100 × SG × density of water at 20 °C, with
 * °Brix from the sucrose table fit in gravity.ts and water density from
 * temperature.ts. Honey is counted by its dry matter, taken to raise gravity
 * as sucrose does by mass (the sugars of honey and sucrose give solutions of
 * nearly the same density at equal % by mass).
 */
import { sgToBrix } from './gravity';
import { CalcInputError, GRAVITY_MAX, requireGravity, requireNonNegative, requireOneOf, showNumber } from './guards';
import { waterDensity } from './temperature';

/** Fermentable sources the calculator knows. */
export type FermentableSource = 'honey' | 'sucrose';
/** Both sources, for pickers. */
export const FERMENTABLE_SOURCES: readonly FermentableSource[] = ['honey', 'sucrose'];

/**
 * Dry matter of honey by mass: 1 − 0.171, from 17.1 g water per 100 g in the
 * USDA FoodData Central (SR Legacy) entry for honey. Real honeys run 15–20 % water.
 */
export const HONEY_SOLIDS_FRACTION = 0.829;

/** Sugar-equivalent mass per kilogram of each source. */
export const SUGAR_EQUIVALENT: Record<FermentableSource, number> = {
  honey: HONEY_SOLIDS_FRACTION,
  sucrose: 1,
};

/**
 * Kilograms of dissolved sugar in one litre of must at a given gravity (0 at or below 1.000).
 * @param sg - specific gravity at 20/20 °C
 */
export function sugarPerLitre(sg: number): number {
  const g = requireGravity(sg, 'sg', 'Specific gravity');
  if (g <= 1) return 0;
  const brix = Math.max(0, sgToBrix(g));
  return (brix / 100) * g * (waterDensity(20) / 1000);
}

/** Options for fermentableForGravity. */
export interface FermentableForGravityInput {
  /** Litres of must after the addition. */
  volumeL: number;
  /** Gravity wanted. */
  targetOg: number;
  /** Gravity of the must before the addition (1.000 for plain water). */
  startOg?: number;
  /** What is being added. */
  source: FermentableSource;
}

/**
 * Kilograms of honey or sucrose that bring `volumeL` of must from `startOg` to `targetOg`.
 * @param input.volumeL - litres of must after the addition
 * @param input.targetOg - the gravity wanted
 * @param input.startOg - gravity before the addition (default 1.000)
 * @param input.source - 'honey' or 'sucrose'
 */
export function fermentableForGravity(input: FermentableForGravityInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Must volume', ' L');
  const target = requireGravity(input.targetOg, 'targetOg', 'Target gravity');
  const start = requireGravity(input.startOg ?? 1, 'startOg', 'Starting gravity');
  const source = requireOneOf(input.source, FERMENTABLE_SOURCES, 'source', 'Fermentable');
  if (target < start) {
    throw new CalcInputError(
      'targetOg',
      `Target gravity (${showNumber(target, 3)}) is below the starting gravity (${showNumber(start, 3)}); adding sugar cannot lower it.`,
    );
  }
  const sugarKg = (sugarPerLitre(target) - sugarPerLitre(start)) * volume;
  return sugarKg / SUGAR_EQUIVALENT[source];
}

/** Options for gravityFromFermentable. */
export interface GravityFromFermentableInput {
  /** Litres of must after the addition. */
  volumeL: number;
  /** Kilograms added. */
  kg: number;
  /** Gravity before the addition (1.000 for plain water). */
  startOg?: number;
  /** What is being added. */
  source: FermentableSource;
}

/**
 * Gravity reached by adding `kg` of honey or sucrose to make `volumeL` of must (inverse of fermentableForGravity).
 * @param input.volumeL - litres of must after the addition (more than zero)
 * @param input.kg - kilograms added
 * @param input.startOg - gravity before the addition (default 1.000)
 * @param input.source - 'honey' or 'sucrose'
 */
export function gravityFromFermentable(input: GravityFromFermentableInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Must volume', ' L');
  if (volume === 0) throw new CalcInputError('volumeL', 'Must volume must be more than zero (got 0 L).');
  const kg = requireNonNegative(input.kg, 'kg', 'Amount added', ' kg');
  const start = requireGravity(input.startOg ?? 1, 'startOg', 'Starting gravity');
  const source = requireOneOf(input.source, FERMENTABLE_SOURCES, 'source', 'Fermentable');
  const wanted = sugarPerLitre(start) + (kg * SUGAR_EQUIVALENT[source]) / volume;
  if (wanted > sugarPerLitre(GRAVITY_MAX)) {
    throw new CalcInputError(
      'kg',
      `That much ${source} would take the must above ${showNumber(GRAVITY_MAX, 3)}, beyond what yeast can ferment.`,
    );
  }
  let lo = Math.max(start, 1);
  let hi = GRAVITY_MAX;
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2;
    if (sugarPerLitre(mid) < wanted) lo = mid;
    else hi = mid;
  }
  return kg === 0 ? start : (lo + hi) / 2;
}
