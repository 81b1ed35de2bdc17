/**
 * A hydrometer is read to ±0.001 (one line of its scale); a rise of more than that between two
 * readings is worth a word (common practice).
 */
export const GRAVITY_RISE_TOLERANCE = 0.001;

/**
 * What to say when a reading is above the one before it: either the ferment started again (sugar,
 * honey or fruit went in) or one of the two was misread. Null when it did not rise.
 * @param previousSg - the reading before (temperature-corrected)
 * @param nextSg - the new reading (temperature-corrected)
 * @param gravity - how gravities are written ("1.012")
 */
export function gravityRiseNote(
  previousSg: number | null | undefined,
  nextSg: number,
  gravity: (sg: number) => string = (sg) => sg.toFixed(3),
): string | null {
  if (previousSg === null || previousSg === undefined) return null;
  // Rounded to the ten-thousandth so float noise at the tolerance does not tip the verdict.
  const rise = Math.round((nextSg - previousSg) * 10_000) / 10_000;
  if (rise <= GRAVITY_RISE_TOLERANCE) return null;
  return `Gravity rose from ${gravity(previousSg)} to ${gravity(nextSg)}: a new ferment (sugar, honey or fruit added?) or a misread — check the hydrometer and the temperature.`;
}
