/**
 * Fermentation state from a series of gravity readings:
 *
 * - finished: gravity steady over STABLE_WINDOW_DAYS at or near the predicted
 *   finish (or the yeast has already made its stated tolerance);
 * - stuck: gravity steady but well above the predicted finish while the yeast
 *   is still short of its tolerance;
 * - active: falling quickly, rising (a fresh sugar addition), or too few
 *   readings (or less than a day of them) to judge;
 * - slowing: still falling, but slowly, or not yet steady for long enough.
 */
import { abvHighGravity } from './abv';
import { predictFinish } from './finish';
import { CalcInputError, requireDate, requireGravity } from './guards';

/** Fermentation states. */
export type FermentationState = 'active' | 'slowing' | 'finished' | 'stuck';

/** Days the gravity must hold steady: the cellar rule of "the same reading a few days apart" (common practice). */
export const STABLE_WINDOW_DAYS = 3;
/** Largest change still called steady: one division of a common hydrometer, i.e. reading noise. */
export const STABLE_TOLERANCE_SG = 0.001;
/** How far above the predicted finish still counts as finished: tolerances and dry finishes are nominal. */
export const NEAR_FINISH_SG = 0.005;
/** Yeast within this much of its stated tolerance has done its work: tolerances are quoted to about ±1 % ABV. */
export const TOLERANCE_MARGIN_ABV = 1;
/** Below this fall per day a ferment is slowing: a lively primary drops several points a day (common practice). */
export const SLOWING_RATE_SG_PER_DAY = 0.002;
/** The fall rate is measured over at least this span; with less history the ferment is called active. */
export const RATE_SPAN_DAYS = 1;
/** Readings may be dated up to this far after `now`: date-only entries and time zones can put today's reading "tomorrow" in UTC. */
export const FUTURE_GRACE_DAYS = 1;

const DAY_MS = 86_400_000;
// Float noise guard for "difference within tolerance" comparisons.
const EPS = 1e-9;

/** One gravity reading. */
export interface GravityReading {
  /** When it was taken (Date or ISO 8601 string). */
  at: Date | string;
  /** Specific gravity, temperature-corrected. */
  sg: number;
}

/** Options for fermentationState. */
export interface FermentationStateInput {
  /** Original gravity of the batch. */
  og: number;
  /** The yeast's stated alcohol tolerance, % ABV. */
  toleranceAbv: number;
  /** Gravity readings in any order. */
  readings: readonly GravityReading[];
  /** The moment of judgement (Date or ISO 8601 string). */
  now: Date | string;
}

/**
 * State of a fermentation from its readings.
 * @param input.og - original gravity
 * @param input.toleranceAbv - the yeast's alcohol tolerance in % ABV
 * @param input.readings - gravity readings `{ at, sg }`, any order; 0 or 1 reading gives 'active'
 * @param input.now - the moment of judgement; readings more than a day after it are rejected
 */
export function fermentationState(input: FermentationStateInput): FermentationState {
  const og = requireGravity(input.og, 'og', 'Original gravity');
  const predicted = predictFinish({ og, toleranceAbv: input.toleranceAbv });
  const now = requireDate(input.now, 'now', 'Date of judgement');
  if (!Array.isArray(input.readings)) {
    throw new CalcInputError('readings', 'Readings must be a list of { at, sg } entries.');
  }
  const readings = input.readings
    .map((r: GravityReading, i: number) => {
      if (r === null || typeof r !== 'object') {
        throw new CalcInputError(`readings[${i}]`, `Reading ${i + 1} must be an entry with a date and a gravity.`);
      }
      const at = requireDate(r.at, `readings[${i}].at`, `Date of reading ${i + 1}`);
      const sg = requireGravity(r.sg, `readings[${i}].sg`, `Gravity of reading ${i + 1}`);
      if (at.getTime() > now.getTime() + FUTURE_GRACE_DAYS * DAY_MS) {
        throw new CalcInputError(
          `readings[${i}].at`,
          `Reading ${i + 1} is dated ${at.toISOString().slice(0, 10)}, after ${now.toISOString().slice(0, 10)}.`,
        );
      }
      return { t: at.getTime(), sg };
    })
    .sort((a, b) => a.t - b.t);

  if (readings.length < 2) return 'active';
  const last = readings[readings.length - 1];

  // Steady: every reading from the last one at least STABLE_WINDOW_DAYS before
  // the latest up to the latest stays within STABLE_TOLERANCE_SG.
  let anchor = -1;
  for (let i = readings.length - 2; i >= 0; i--) {
    if (last.t - readings[i].t >= STABLE_WINDOW_DAYS * DAY_MS) {
      anchor = i;
      break;
    }
  }
  if (anchor >= 0) {
    const window = readings.slice(anchor);
    const spread = Math.max(...window.map((r) => r.sg)) - Math.min(...window.map((r) => r.sg));
    if (spread <= STABLE_TOLERANCE_SG + EPS) {
      if (last.sg <= predicted.fg + NEAR_FINISH_SG + EPS) return 'finished';
      const madeSoFar = abvHighGravity(og, Math.min(last.sg, og));
      return madeSoFar >= input.toleranceAbv - TOLERANCE_MARGIN_ABV ? 'finished' : 'stuck';
    }
  }

  let ref: { t: number; sg: number } | null = null;
  for (let i = readings.length - 2; i >= 0; i--) {
    if (last.t - readings[i].t >= RATE_SPAN_DAYS * DAY_MS) {
      ref = readings[i];
      break;
    }
  }
  // Less than a day of history, or a rise from fresh sugar: too early to call it slowing.
  if (ref === null || last.sg > ref.sg + STABLE_TOLERANCE_SG + EPS) return 'active';
  const days = (last.t - ref.t) / DAY_MS;
  const fallPerDay = (ref.sg - last.sg) / days;
  return fallPerDay >= SLOWING_RATE_SG_PER_DAY - EPS ? 'active' : 'slowing';
}
