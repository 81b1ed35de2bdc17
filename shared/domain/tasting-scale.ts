/**
 * Cellarwright's own tasting scale: eight points, each with a word, from a glass you would pour
 * away to one you would keep for a feast. Stored as the number; the word is shown beside it.
 */
export const TASTING_SCALE = [
  { points: 1, word: 'Pour away' },
  { points: 2, word: 'Troubled' },
  { points: 3, word: 'Wanting' },
  { points: 4, word: 'Drinkable' },
  { points: 5, word: 'Agreeable' },
  { points: 6, word: 'Fine' },
  { points: 7, word: 'Rewarding' },
  { points: 8, word: 'Keep for a feast' },
] as const;

export const TASTING_POINTS_MIN = 1;
export const TASTING_POINTS_MAX = TASTING_SCALE.length;

/** "6 · Fine"; an out-of-scale number as it is. */
export function tastingWords(points: number): string {
  const step = TASTING_SCALE.find((s) => s.points === points);
  return step ? `${step.points}\u00a0· ${step.word}` : String(points);
}

/** The highest score of the 20-point scale tastings were recorded on before this scale. */
export const FORMER_SCORE_MAX = 20;

/**
 * A score recorded out of 20 on this scale: the 0–20 range laid evenly over the eight points,
 * 1 + round(score × 7 / 20), halves rounded up. So 0–1 → 1, 2–4 → 2, 5–7 → 3, 8–9 → 4,
 * 10–12 → 5, 13–15 → 6, 16–18 → 7, 19–20 → 8. Used by the migration that moved stored scores
 * (server/db/migrations, in SQL: 1 + round(score * 7 / 20.0)) and by the restore of older archives.
 * @param score - a score out of 20
 */
export function pointsFromFormerScore(score: number): number {
  const clamped = Math.min(FORMER_SCORE_MAX, Math.max(0, score));
  return 1 + Math.floor((clamped * (TASTING_POINTS_MAX - 1)) / FORMER_SCORE_MAX + 0.5);
}
