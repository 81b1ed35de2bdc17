import { describe, expect, it } from 'vitest';
import {
  FORMER_SCORE_MAX,
  pointsFromFormerScore,
  TASTING_POINTS_MAX,
  TASTING_POINTS_MIN,
  TASTING_SCALE,
  tastingWords,
} from '../../../shared/domain/tasting-scale';

describe('our tasting scale', () => {
  it('has eight points, each with its own word', () => {
    expect([TASTING_POINTS_MIN, TASTING_POINTS_MAX]).toEqual([1, 8]);
    expect(TASTING_SCALE.map((s) => s.points)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(new Set(TASTING_SCALE.map((s) => s.word)).size).toBe(8);
    expect(tastingWords(6)).toBe('6\u00a0· Fine');
    expect(tastingWords(1)).toBe('1\u00a0· Pour away');
    expect(tastingWords(12)).toBe('12');
  });
});

// The documented mapping of the migration (server/db/migrations/…-TastingScoresOnOwnScale.ts):
// 1 + round(score × 7 / 20), halves up, worked by hand for every whole score out of 20.
describe('pointsFromFormerScore', () => {
  it.each([
    [0, 1],
    [1, 1],
    [2, 2],
    [4, 2],
    [5, 3],
    [7, 3],
    [8, 4],
    [9, 4],
    [10, 5],
    [12, 5],
    [13, 6],
    [15, 6],
    [16, 7],
    [18, 7],
    [19, 8],
    [20, 8],
  ])('%s of 20 → %s', (score, points) => {
    expect(pointsFromFormerScore(score)).toBe(points);
  });

  it('keeps scores out of range on the scale, and takes halves', () => {
    expect(FORMER_SCORE_MAX).toBe(20);
    expect(pointsFromFormerScore(25)).toBe(8);
    expect(pointsFromFormerScore(-3)).toBe(1);
    // 15.5 × 7 / 20 = 5.425 → 5, + 1 = 6.
    expect(pointsFromFormerScore(15.5)).toBe(6);
  });
});
