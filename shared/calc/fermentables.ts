/**
 * Honey or sugar needed to bring a must to a target gravity.
 *
 * Sugar in a litre of must = °Brix/100 × SG × density of water at 20 °C, with
 * °Brix from the sucrose table fit in gravity.ts and water density from
 * temperature.ts. Sucrose counts by its own mass. Honey counts as the sucrose
 * that gives the makers' figure of 35 gravity points per pound in a US gallon
 * (common practice), scaled by its dry matter when its moisture is known.
 */
import { sgToBrix } from './gravity';
import { CalcInputError, GRAVITY_MAX, requireGravity, requireNonNegative, requireOneOf, requireRange, showNumber } from './guards';
import { solveRising } from './solve';
import { waterDensity } from './temperature';
import { KILOGRAMS_PER_POUND, LITRES_PER_US_GALLON } from './units';

/** Fermentable sources the calculator knows. */
export type FermentableSource = 'honey' | 'sucrose';
/** Both sources, for pickers. */
export const FERMENTABLE_SOURCES: readonly FermentableSource[] = ['honey', 'sucrose'];

/**
 * Gravity points one pound of honey gives when made up to one US gallon: 35, the figure mead
 * makers work with (common practice; quoted figures run 35–40, and 35 matches what they measure).
 */
export const HONEY_POINTS_PER_LB_PER_US_GAL = 35;

/**
 * Water in a typical honey, % by mass: 17.1 g per 100 g in the USDA FoodData Central
 * (SR Legacy) entry for honey. The 35-point figure is taken to be for such a honey.
 */
export const HONEY_MOISTURE_PERCENT = 17.1;
/** Dry matter of a typical honey by mass, 1 − 0.171. */
export const HONEY_SOLIDS_FRACTION = 1 - HONEY_MOISTURE_PERCENT / 100;
/** Honey moisture accepted, %: the Codex honey standard allows at most 20 % (23 % for heather), from memory; 12 % is drier than honey comes. */
export const HONEY_MOISTURE_RANGE = { min: 12, max: 25 } as const;

/** Sucrose-equivalent mass per kilogram of each source (honey of typical moisture). */
export const SUGAR_EQUIVALENT: Readonly<Record<FermentableSource, number>> = {
  // The sucrose that a pound of honey stands for: the sugar of a 1.035 must in one US gallon.
  // Worked out when read, not when the module loads, so a load never runs the input checks.
  get honey() {
    return (sugarAt(1 + HONEY_POINTS_PER_LB_PER_US_GAL / 1000) * LITRES_PER_US_GALLON) / KILOGRAMS_PER_POUND;
  },
  sucrose: 1,
};

/**
 * Kilograms of dissolved sugar in one litre of must at a given gravity (0 at or below 1.000).
 * @param sg - specific gravity at 20/20 °C
 */
export function sugarPerLitre(sg: number): number {
  return sugarAt(requireGravity(sg, 'sg', 'Specific gravity'));
}

function sugarAt(sg: number): number {
  if (sg <= 1) return 0;
  // The °Brix fit reads −0.005 at 1.000 and crosses zero near 1.00002: no sugar below that, never less than none.
  return Math.max(0, (sgToBrix(sg) / 100) * sg * (waterDensity(20) / 1000));
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
  /** The honey's water content, % by mass, when known (default 17.1); ignored for sucrose. */
  honeyMoisturePercent?: number;
}

/**
 * Kilograms of honey or sucrose that bring `volumeL` of must from `startOg` to `targetOg`.
 * @param input.volumeL - litres of must after the addition
 * @param input.targetOg - the gravity wanted
 * @param input.startOg - gravity before the addition (default 1.000)
 * @param input.source - 'honey' or 'sucrose'
 * @param input.honeyMoisturePercent - the honey's water content in % (12–25; default 17.1)
 */
export function fermentableForGravity(input: FermentableForGravityInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Must volume', ' L');
  const target = requireGravity(input.targetOg, 'targetOg', 'Target gravity');
  const start = requireGravity(input.startOg ?? 1, 'startOg', 'Starting gravity');
  const equivalent = sugarEquivalent(input.source, input.honeyMoisturePercent);
  if (target < start) {
    throw new CalcInputError(
      'targetOg',
      `Target gravity (${showNumber(target, 3)}) is below the starting gravity (${showNumber(start, 3)}); adding sugar cannot lower it.`,
    );
  }
  const sugarKg = (sugarAt(target) - sugarAt(start)) * volume;
  return sugarKg / equivalent;
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
  /** The honey's water content, % by mass, when known (default 17.1); ignored for sucrose. */
  honeyMoisturePercent?: number;
}

/**
 * Gravity reached by adding `kg` of honey or sucrose to make `volumeL` of must (inverse of fermentableForGravity).
 * @param input.volumeL - litres of must after the addition (more than zero)
 * @param input.kg - kilograms added
 * @param input.startOg - gravity before the addition (default 1.000)
 * @param input.source - 'honey' or 'sucrose'
 * @param input.honeyMoisturePercent - the honey's water content in % (12–25; default 17.1)
 */
export function gravityFromFermentable(input: GravityFromFermentableInput): number {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Must volume', ' L');
  if (volume === 0) throw new CalcInputError('volumeL', 'Must volume must be more than zero (got 0 L).');
  const kg = requireNonNegative(input.kg, 'kg', 'Amount added', ' kg');
  const start = requireGravity(input.startOg ?? 1, 'startOg', 'Starting gravity');
  const source = requireOneOf(input.source, FERMENTABLE_SOURCES, 'source', 'Fermentable');
  const wanted = sugarAt(start) + (kg * sugarEquivalent(source, input.honeyMoisturePercent)) / volume;
  // A part in 10¹² of slack, so the amount worked out for 1.200 itself is accepted back.
  if (wanted > sugarAt(GRAVITY_MAX) * (1 + 1e-12)) {
    throw new CalcInputError('kg', `That much ${source} would take the must above ${showNumber(GRAVITY_MAX, 3)}, beyond what yeast can ferment.`);
  }
  // No sugar below 1.000, so the answer lies between 1.000 and the highest gravity accepted.
  return kg === 0 ? start : solveRising(sugarAt, wanted, 1, GRAVITY_MAX);
}

/**
 * Sucrose-equivalent kilograms per kilogram of the source; a honey of known moisture counts
 * in proportion to its dry matter against the typical honey the 35-point figure is for.
 */
function sugarEquivalent(source: unknown, honeyMoisturePercent: unknown): number {
  const s = requireOneOf(source, FERMENTABLE_SOURCES, 'source', 'Fermentable');
  if (s === 'sucrose' || honeyMoisturePercent == null) return SUGAR_EQUIVALENT[s];
  const moisture = requireRange(
    honeyMoisturePercent,
    'honeyMoisturePercent',
    'Honey moisture',
    HONEY_MOISTURE_RANGE.min,
    HONEY_MOISTURE_RANGE.max,
    0,
    ' %',
  );
  return (SUGAR_EQUIVALENT.honey * (1 - moisture / 100)) / HONEY_SOLIDS_FRACTION;
}
