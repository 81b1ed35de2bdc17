/** Dates relative to now, for records a test makes in the past (or, with a negative count, the future). */

const DAY_MS = 86_400_000;

/** The ISO date (YYYY-MM-DD, UTC) `days` before today. */
export function daysAgo(days: number): string {
  return new Date(Date.now() - days * DAY_MS).toISOString().slice(0, 10);
}

/** An ISO date-time `days` before now. */
export function momentDaysAgo(days: number): string {
  return new Date(Date.now() - days * DAY_MS).toISOString();
}
