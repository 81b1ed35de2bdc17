/**
 * Bottles and cases from a volume.
 */
import { CalcInputError, requireAtLeast, requireInteger, requireNonNegative, showNumber } from './guards';

/** Bottles per case when none is given: the usual 12-bottle wine case. */
export const DEFAULT_BOTTLES_PER_CASE = 12;

/** Options for bottlesFrom. */
export interface BottlesFromInput {
  /** Litres available to bottle. */
  volumeL: number;
  /** Size of one bottle, mL. */
  bottleMl: number;
  /** Litres lost on the way (lees, siphon, sampling); default 0. */
  lossL?: number;
}

/**
 * Full bottles that a volume fills, and what is left over.
 * @param input.volumeL - litres available to bottle
 * @param input.bottleMl - bottle size in mL (e.g. 750; at least 1)
 * @param input.lossL - litres lost to lees, siphon and sampling (default 0)
 */
export function bottlesFrom(input: BottlesFromInput): { bottles: number; remainderMl: number } {
  const volume = requireNonNegative(input.volumeL, 'volumeL', 'Volume', ' L');
  const bottleMl = requireAtLeast(input.bottleMl, 'bottleMl', 'Bottle size', 1, ' mL');
  const loss = requireNonNegative(input.lossL ?? 0, 'lossL', 'Loss', ' L');
  if (loss > volume) {
    throw new CalcInputError('lossL', `Loss (${showNumber(loss)} L) cannot be more than the volume (${showNumber(volume)} L).`);
  }
  // Work in microlitres-rounded millilitres so 22.5 L / 750 mL is exactly 30, not 29.
  const usableMl = Math.round((volume - loss) * 1e6) / 1e3;
  const bottles = Math.floor(usableMl / bottleMl + 1e-9);
  // Past 2⁵³ bottles (or an overflow to Infinity) a count is no longer exact.
  if (!Number.isSafeInteger(bottles)) {
    throw new CalcInputError('volumeL', `Volume (${showNumber(volume)} L) is too large to count in bottles.`);
  }
  const remainderMl = Math.max(0, Math.round((usableMl - bottles * bottleMl) * 1e3) / 1e3);
  return { bottles, remainderMl };
}

/**
 * Full cases and loose bottles.
 * @param bottles - number of bottles (whole, zero or more)
 * @param perCase - bottles per case (whole, at least 1; default 12)
 */
export function casesFrom(bottles: number, perCase: number = DEFAULT_BOTTLES_PER_CASE): { cases: number; loose: number } {
  const n = requireInteger(bottles, 'bottles', 'Number of bottles', 0);
  const per = requireInteger(perCase, 'perCase', 'Bottles per case', 1);
  return { cases: Math.floor(n / per), loose: n % per };
}
