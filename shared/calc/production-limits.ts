/**
 * Annual production against a limit the cellar sets. Home production caps
 * vary by place; the US federal one is kept here as a reference:
 * 27 CFR 24.75(a) — an adult may produce wine for personal or family use, free
 * of tax, up to 100 gallons per calendar year if the household has one adult,
 * or 200 gallons if it has two or more.
 */
import { CalcInputError, requireNonNegative, requirePositive } from './guards';
import { LITRES_PER_US_GALLON } from './units';

/** US federal home wine production limits in litres (27 CFR 24.75(a)). */
export const US_HOME_WINE_LIMIT_L = {
  /** Household with one adult: 100 US gallons a calendar year. */
  oneAdult: 100 * LITRES_PER_US_GALLON,
  /** Household with two or more adults: 200 US gallons a calendar year. */
  twoOrMoreAdults: 200 * LITRES_PER_US_GALLON,
} as const;

/** Options for annualVolumeUsage. */
export interface AnnualVolumeInput {
  /** Litres of each batch started in the calendar year. */
  volumesL: readonly number[];
  /** The cellar's yearly limit, litres. */
  limitL: number;
}

/** What annualVolumeUsage returns. */
export interface AnnualVolumeUsage {
  /** Litres made this year. */
  totalL: number;
  /** The limit, litres. */
  limitL: number;
  /** Litres left before the limit (0 once over). */
  remainingL: number;
  /** Share of the limit used, % (can pass 100). */
  percentUsed: number;
  /** Whether the total is above the limit. */
  over: boolean;
}

/**
 * Total made in a calendar year against the cellar's limit.
 * @param input.volumesL - litres of each batch made this year (each zero or more)
 * @param input.limitL - the yearly limit in litres (more than zero)
 */
export function annualVolumeUsage(input: AnnualVolumeInput): AnnualVolumeUsage {
  const limit = requirePositive(input.limitL, 'limitL', 'Yearly limit', ' L');
  if (!Array.isArray(input.volumesL)) {
    throw new CalcInputError('volumesL', 'Volumes must be a list of litres.');
  }
  const total = input.volumesL.reduce(
    (sum: number, v: number, i: number) => sum + requireNonNegative(v, `volumesL[${i}]`, `Volume of batch ${i + 1}`, ' L'),
    0,
  );
  return {
    totalL: total,
    limitL: limit,
    remainingL: Math.max(0, limit - total),
    percentUsed: (total / limit) * 100,
    over: total > limit,
  };
}
