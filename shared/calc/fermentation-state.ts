/**
 * Fermentation state from a series of gravity readings:
 *
 * - finished: gravity steady over STABLE_WINDOW_DAYS, and either at the dry end (within
 *   DRY_END_ALLOWANCE_SG of DRY_FINISH_SG) or with the yeast at its tolerance by a conservative
 *   estimate of the alcohol made (the lower of the linear and Balling figures);
 * - stuck: gravity steady, above the dry end, with the yeast more than TOLERANCE_MARGIN_ABV
 *   short of its tolerance — never called finished, so bottling it asks first;
 * - active: falling quickly, rising (a fresh sugar addition), or too few readings (or less than
 *   a day of them) to judge;
 * - slowing: still falling, but slowly, or not yet steady for long enough.
 */
import { abvBalling, abvSimple } from './abv';
import { DRY_FINISH_SG, MAX_TOLERANCE_ABV } from './finish';
import { CalcInputError, requireDate, requireGravity, requireRange } from './guards';

/** Fermentation states. */
export type FermentationState = 'active' | 'slowing' | 'finished' | 'stuck';

/** Days the gravity must hold steady: the cellar rule of "the same reading a few days apart" (common practice). */
export const STABLE_WINDOW_DAYS = 3;
/** Largest change still called steady: one division of a common hydrometer, i.e. reading noise. */
export const STABLE_TOLERANCE_SG = 0.001;
/**
 * How far above the dry finish (0.996) a steady ferment still counts as fermented dry: up to
 * 1.004. Dry meads and wines end anywhere from about 0.990 to a little above 1.000 (common practice).
 */
export const DRY_END_ALLOWANCE_SG = 0.008;
/** @deprecated The dry-end allowance under its earlier name; use DRY_END_ALLOWANCE_SG. */
export const NEAR_FINISH_SG = DRY_END_ALLOWANCE_SG;
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

interface Point {
  t: number;
  sg: number;
}

/**
 * State of a fermentation from its readings. The answer does not depend on the order the
 * readings come in, even when several share a timestamp.
 * @param input.og - original gravity
 * @param input.toleranceAbv - the yeast's alcohol tolerance in % ABV (0–25)
 * @param input.readings - gravity readings `{ at, sg }`, any order; 0 or 1 reading gives 'active'
 * @param input.now - the moment of judgement; readings more than a day after it are rejected
 */
export function fermentationState(input: FermentationStateInput): FermentationState {
  const og = requireGravity(input.og, 'og', 'Original gravity');
  const tolerance = requireRange(input.toleranceAbv, 'toleranceAbv', 'Yeast alcohol tolerance', 0, MAX_TOLERANCE_ABV, 0, ' % ABV');
  const now = requireDate(input.now, 'now', 'Date of judgement');
  const readings = inTimeOrder(input.readings, now);
  if (readings.length < 2) return 'active';
  const last = readings[readings.length - 1];

  if (isSteady(readings, last)) return hasFinished(og, tolerance, last.sg) ? 'finished' : 'stuck';

  const ref = latestBefore(readings, last.t - RATE_SPAN_DAYS * DAY_MS);
  // Less than a day of history, or a rise from fresh sugar: too early to call it slowing.
  if (ref === null || last.sg > ref.sg + STABLE_TOLERANCE_SG + EPS) return 'active';
  const fallPerDay = ((ref.sg - last.sg) * DAY_MS) / (last.t - ref.t);
  return fallPerDay >= SLOWING_RATE_SG_PER_DAY - EPS ? 'active' : 'slowing';
}

/**
 * The readings checked and sorted by time. Readings with equal timestamps are put in order of
 * gravity, the higher last, so a tie never makes a ferment look further along than it is.
 */
function inTimeOrder(list: readonly GravityReading[], now: Date): Point[] {
  if (!Array.isArray(list)) {
    throw new CalcInputError('readings', 'Readings must be a list of { at, sg } entries.');
  }
  const latestAllowed = now.getTime() + FUTURE_GRACE_DAYS * DAY_MS;
  return list
    .map((r: GravityReading, i: number) => {
      if (r === null || typeof r !== 'object') {
        throw new CalcInputError(`readings[${i}]`, `Reading ${i + 1} must be an entry with a date and a gravity.`);
      }
      const at = requireDate(r.at, `readings[${i}].at`, `Date of reading ${i + 1}`);
      const sg = requireGravity(r.sg, `readings[${i}].sg`, `Gravity of reading ${i + 1}`);
      if (at.getTime() > latestAllowed) {
        throw new CalcInputError(
          `readings[${i}].at`,
          `Reading ${i + 1} is dated ${at.toISOString().slice(0, 10)}, after ${now.toISOString().slice(0, 10)}.`,
        );
      }
      return { t: at.getTime(), sg };
    })
    .sort((a, b) => a.t - b.t || a.sg - b.sg);
}

/** The last reading taken at or before `t`, or null. */
function latestBefore(readings: readonly Point[], t: number): Point | null {
  for (let i = readings.length - 1; i >= 0; i--) if (readings[i].t <= t) return readings[i];
  return null;
}

/**
 * Steady: every reading from the last one taken at least STABLE_WINDOW_DAYS before the latest
 * (all readings of that moment included) up to the latest stays within STABLE_TOLERANCE_SG.
 */
function isSteady(readings: readonly Point[], last: Point): boolean {
  const anchor = latestBefore(readings, last.t - STABLE_WINDOW_DAYS * DAY_MS);
  if (anchor === null) return false;
  const window = readings.filter((r) => r.t >= anchor.t).map((r) => r.sg);
  return Math.max(...window) - Math.min(...window) <= STABLE_TOLERANCE_SG + EPS;
}

/**
 * A steady ferment has finished when it is at the dry end, or when the yeast has made its
 * tolerance (less the margin) by the lower of the linear and Balling estimates: the linear
 * formula understates strong musts, so a stall is never mistaken for the yeast's limit.
 */
function hasFinished(og: number, toleranceAbv: number, sg: number): boolean {
  if (sg <= DRY_FINISH_SG + DRY_END_ALLOWANCE_SG + EPS) return true;
  // A reading above the OG (sugar added since) has made no alcohol to count.
  const fg = Math.min(sg, og);
  const madeSoFar = Math.min(abvSimple(og, fg), abvBalling(og, fg));
  return madeSoFar >= toleranceAbv - TOLERANCE_MARGIN_ABV - EPS;
}
