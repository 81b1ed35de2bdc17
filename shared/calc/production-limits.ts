/**
 * Annual production against a limit the cellar sets. Home production caps
 * vary by place; the US federal one is kept here as a reference:
 * 27 CFR 24.75(b) — an adult may produce wine for personal or family use, free
 * of tax, up to 100 gallons per calendar year if the household has one adult,
 * or 200 gallons if it has two or more.
 */
import { CalcInputError, requireFiniteResult, requireNonNegative, requirePositive, showNumber } from './guards';
import { LITRES_PER_US_GALLON } from './units';

/** US federal home wine production limits in litres (27 CFR 24.75(b)). */
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
  const total = requireFiniteResult(
    input.volumesL.reduce((sum: number, v: number, i: number) => sum + requireNonNegative(v, `volumesL[${i}]`, `Volume of batch ${i + 1}`, ' L'), 0),
    'volumesL',
    'Total volume',
  );
  return {
    totalL: total,
    limitL: limit,
    remainingL: Math.max(0, limit - total),
    percentUsed: sharePercent(total, limit),
    over: total > limit,
  };
}

// A limit a hair above zero makes any total an infinite share.
function sharePercent(total: number, limit: number): number {
  const percent = (total / limit) * 100;
  if (!Number.isFinite(percent)) {
    throw new CalcInputError('limitL', `Yearly limit (${showNumber(limit)} L) is too small to measure a share of.`);
  }
  return percent;
}
