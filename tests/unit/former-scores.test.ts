import { describe, expect, it } from 'vitest';
import { rescoredJournalRow, scoresOutOfTwenty } from '../../server/archive/former-scores';

// Archives name the newest migration of the installation that wrote them; before the
// TastingScoresOnOwnScale migration (1796171100000) scores were out of 20.
describe('restoring an older archive', () => {
  it('knows which archives hold scores out of 20', () => {
    expect(scoresOutOfTwenty('CreateIdempotencyKeys1796170900000')).toBe(true);
    expect(scoresOutOfTwenty('TastingScoresOnOwnScale1796171100000')).toBe(false);
    expect(scoresOutOfTwenty('SomethingLater1796171200000')).toBe(false);
    expect(scoresOutOfTwenty('no-timestamp')).toBe(false);
  });

  it('moves a tasting’s score and a correction’s score onto our scale by the migration’s mapping', () => {
    // 1 + round(15 × 7 / 20) = 6; 1 + round(19 × 7 / 20) = 8.
    expect(rescoredJournalRow({ kind: 'tasted', payload: { kind: 'tasted', aroma: 'Pear', score: 15 } })).toEqual({
      kind: 'tasted',
      payload: { kind: 'tasted', aroma: 'Pear', score: 6 },
    });
    expect(rescoredJournalRow({ kind: 'amendment', payload: JSON.stringify({ kind: 'amendment', reason: 'typo', changes: { score: 19 } }) })).toEqual(
      {
        kind: 'amendment',
        payload: { kind: 'amendment', reason: 'typo', changes: { score: 8 } },
      },
    );
  });

  it('leaves every other row as it is', () => {
    const note = { kind: 'note', payload: { kind: 'note', text: 'score 15' } };
    expect(rescoredJournalRow(note)).toBe(note);
    const unscored = { kind: 'tasted', payload: { kind: 'tasted', score: null } };
    expect(rescoredJournalRow(unscored)).toBe(unscored);
    const otherChange = { kind: 'amendment', payload: { kind: 'amendment', changes: { aroma: 'Pear' } } };
    expect(rescoredJournalRow(otherChange)).toBe(otherChange);
    const empty = { kind: 'tasted', payload: null };
    expect(rescoredJournalRow(empty)).toBe(empty);
  });
});
