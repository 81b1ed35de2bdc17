/**
 * Cellarwright's arithmetic of the trade: pure functions, no I/O, metric
 * units inside (litres, kilograms, °C, specific gravity with water = 1.000).
 * Every function throws CalcInputError (with `field` naming the argument) for
 * impossible input rather than returning NaN or Infinity.
 */
export { CalcInputError, GRAVITY_MIN, GRAVITY_MAX } from './guards';

export {
  type VolumeUnit,
  type MassUnit,
  type TemperatureUnit,
  VOLUME_UNITS,
  MASS_UNITS,
  LITRES_PER_US_GALLON,
  LITRES_PER_IMPERIAL_GALLON,
  LITRES_PER_US_FLUID_OUNCE,
  KILOGRAMS_PER_POUND,
  KILOGRAMS_PER_OUNCE,
  ABSOLUTE_ZERO_C,
  litresFrom,
  litresTo,
  kilogramsFrom,
  kilogramsTo,
  celsiusFrom,
  fahrenheitFrom,
} from './units';

export { type UnitSystem, UNIT_SYSTEMS, tidyNumber, formatVolume, formatTemperature, formatMass } from './display';

export { sgToBrix, brixToSg, sgToPlato, platoToSg, gravityPoints, BRIX_MIN, BRIX_MAX, PLATO_MIN, PLATO_MAX } from './gravity';

export { waterDensity, correctGravity, recordedGravity, CORRECTION_MIN_C, CORRECTION_MAX_C, CALIBRATION_60F_C, CALIBRATION_20C } from './temperature';

export {
  type AbvFormula,
  ABV_FORMULAS,
  DEFAULT_ABV_FORMULA,
  ABV_FORMULA_LABELS,
  ABV_SIMPLE_FACTOR,
  BALLING_EXTRACT_PER_ALCOHOL,
  BALLING_REAL_EXTRACT_OE_SHARE,
  ETHANOL_DENSITY_20C,
  POTENTIAL_ABV_FG,
  abvSimple,
  abvHighGravity,
  abvBalling,
  abvBy,
  apparentAttenuation,
  potentialAbv,
} from './abv';

export {
  type FermentableSource,
  type FermentableForGravityInput,
  type GravityFromFermentableInput,
  FERMENTABLE_SOURCES,
  HONEY_POINTS_PER_LB_PER_US_GAL,
  HONEY_MOISTURE_PERCENT,
  HONEY_MOISTURE_RANGE,
  HONEY_SOLIDS_FRACTION,
  SUGAR_EQUIVALENT,
  sugarPerLitre,
  fermentableForGravity,
  gravityFromFermentable,
} from './fermentables';

export {
  type Sweetness,
  type Strength,
  SEMI_SWEET_FROM_FG,
  SWEET_FROM_FG,
  STANDARD_FROM_ABV,
  SACK_FROM_ABV,
  sweetnessOf,
  strengthOf,
} from './style-bands';

export { type PredictFinishInput, type PredictedFinish, DRY_FINISH_SG, MAX_TOLERANCE_ABV, predictFinish, fgAtAbv } from './finish';

export {
  type FermentationState,
  type GravityReading,
  type FermentationStateInput,
  STABLE_WINDOW_DAYS,
  STABLE_TOLERANCE_SG,
  DRY_END_ALLOWANCE_SG,
  NEAR_FINISH_SG,
  TOLERANCE_MARGIN_ABV,
  SLOWING_RATE_SG_PER_DAY,
  RATE_SPAN_DAYS,
  FUTURE_GRACE_DAYS,
  fermentationState,
} from './fermentation-state';

export {
  type MetabisulfiteInput,
  type SorbateInput,
  SO2_PKA,
  KMS_SO2_FRACTION,
  SORBATE_SORBIC_FRACTION,
  DEFAULT_MOLECULAR_SO2,
  SORBIC_ACID_TABLE,
  SORBIC_ACID_MAX_MG_PER_L,
  freeSo2Needed,
  metabisulfiteGrams,
  sorbicAcidMgPerL,
  sorbateGrams,
} from './stabilisers';

export {
  type RackingStage,
  type HeadspaceInput,
  type RackingLossInput,
  type VesselCandidate,
  type BestVesselInput,
  RACKING_STAGES,
  RACKING_LOSS_FIXED_L,
  RACKING_LOSS_FRACTION,
  headspace,
  rackingLoss,
  bestVesselForRacking,
} from './vessels';

export { type BottlesFromInput, DEFAULT_BOTTLES_PER_CASE, bottlesFrom, casesFrom } from './bottling';

export { type TypedGravity, readTypedGravity } from './gravity-entry';

export { type GravityPart, type AbvPart, mixedGravity, mixedAbv } from './mixing';

export { type AgeMilestone, AGE_MILESTONE_MONTHS, daysBetween, ageInDays, addMonths, ageMilestones } from './ages';

export { type AnnualVolumeInput, type AnnualVolumeUsage, US_HOME_WINE_LIMIT_L, annualVolumeUsage } from './production-limits';

export {
  CAUTION_ESTIMATE,
  CAUTION_SULFITES,
  CAUTION_SORBATE,
  CAUTION_BOTTLE_PRESSURE,
  CAUTION_LEGAL_LIMITS,
  CAUTION_GLASS,
  CAUTION_SANITISER,
  CAUTION_SPICE_IN_PRIMARY,
  CAUTIONS,
} from './cautions';

export { ANTIMICROBIAL_SPICES, isAntimicrobialSpice, spiceCaution } from './spices';

export { type SourceBasis, type FormulaSource, type FormulaKey, FORMULA_SOURCES, ABV_FORMULA_KEYS } from './sources';
