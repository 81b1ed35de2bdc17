import { describe, expect, it } from 'vitest';
import { figuresAfterTopUps, type TopUpEvent } from '../../../shared/domain/top-up-figures';

// Gravity points add up by volume (the Pearson-square relation, V₁(P₁ − P) = V₂(P − P₂));
// another wine's alcohol counts back as gravity points by the linear relation
// ABV = (OG − FG) × 131.25 (the common homebrewing approximation). Worked by hand below.
const reading = (at: string, sg: number) => ({ at, sg });
const topUp = (at: string, addedL: number, batchVolumeBeforeL: number, liquid: TopUpEvent['liquid']): TopUpEvent => ({
  at,
  addedL,
  batchVolumeBeforeL,
  liquid,
});

describe('figuresAfterTopUps', () => {
  it('changes nothing without top-ups', () => {
    expect(figuresAfterTopUps(1.1, [reading('2026-01-10T00:00:00Z', 1.02)], [])).toEqual({
      og: 1.1,
      currentSg: 1.02,
      sgEstimated: false,
      unknownTopUps: 0,
    });
  });

  it('water dilutes both the original and the current gravity', () => {
    // 19 L, OG 1.100, read 1.010; + 1 L water: OG (19 × 100)/20 = 95 → 1.095; now (19 × 10)/20 = 9.5 → 1.0095.
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.01)],
      [topUp('2026-01-11T00:00:00Z', 1, 19, { kind: 'water', sg: null, abv: null })],
    );
    expect(f.og).toBeCloseTo(1.095, 9);
    expect(f.currentSg).toBeCloseTo(1.0095, 9);
    expect(f.sgEstimated).toBe(true);
  });

  it('a later reading replaces the estimate, the original gravity stays mixed', () => {
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.01), reading('2026-01-20T00:00:00Z', 1.004)],
      [topUp('2026-01-11T00:00:00Z', 1, 19, { kind: 'water', sg: null, abv: null })],
    );
    expect(f.og).toBeCloseTo(1.095, 9);
    expect(f.currentSg).toBe(1.004);
    expect(f.sgEstimated).toBe(false);
  });

  it('honey-water with its gravity raises both', () => {
    // 4 L, OG 1.100, read 0.996; + 0.5 L at 1.120: OG (4 × 100 + 0.5 × 120)/4.5 = 102.22 → 1.10222;
    // now (4 × −4 + 0.5 × 120)/4.5 = 9.78 → 1.00978.
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 0.996)],
      [topUp('2026-01-12T00:00:00Z', 0.5, 4, { kind: 'honey-water', sg: 1.12, abv: null })],
    );
    expect(f.og).toBeCloseTo(1 + (4 * 100 + 0.5 * 120) / 4.5 / 1000, 9);
    expect(f.currentSg).toBeCloseTo(1 + (4 * -4 + 0.5 * 120) / 4.5 / 1000, 9);
  });

  it('the same batch changes nothing', () => {
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.01)],
      [topUp('2026-01-12T00:00:00Z', 1, 19, { kind: 'same-batch', sg: null, abv: null })],
    );
    expect(f.og).toBeCloseTo(1.1, 9);
    expect(f.currentSg).toBeCloseTo(1.01, 9);
  });

  it('another wine brings its alcohol as gravity points', () => {
    // Its OG equivalent: 0.996 + 13.125 / 131.25 = 1.096. 9 L of OG 1.100 at 1.000 with 1 L of it:
    // OG (9 × 100 + 1 × 96)/10 = 99.6 → 1.0996; now (9 × 0 + 1 × −4)/10 = −0.4 → 0.9996.
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.0)],
      [topUp('2026-01-12T00:00:00Z', 1, 9, { kind: 'other-wine', sg: 0.996, abv: 13.125 })],
    );
    expect(f.og).toBeCloseTo(1.0996, 9);
    expect(f.currentSg).toBeCloseTo(0.9996, 9);
  });

  it('leaves out a top-up whose gravity is not known, and counts it', () => {
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.01)],
      [topUp('2026-01-12T00:00:00Z', 1, 19, { kind: 'sugar-water', sg: null, abv: null })],
    );
    expect(f).toEqual({ og: 1.1, currentSg: 1.01, sgEstimated: false, unknownTopUps: 1 });
  });

  it('before any reading, mixes with the original gravity', () => {
    // 10 L at OG 1.100 + 1 L water: 1000 / 11 = 90.91 points for both.
    const f = figuresAfterTopUps(1.1, [], [topUp('2026-01-01T00:00:00Z', 1, 10, { kind: 'water', sg: null, abv: null })]);
    expect(f.og).toBeCloseTo(1 + (10 * 100) / 11 / 1000, 9);
    expect(f.currentSg).toBeCloseTo(f.og, 12);
  });
});

describe('figuresAfterTopUps, each kind of liquid and the edge cases', () => {
  it('the same batch changes no figure but estimates the current gravity', () => {
    const f = figuresAfterTopUps(
      1.1,
      [reading('2026-01-10T00:00:00Z', 1.01)],
      [topUp('2026-01-12T00:00:00Z', 1, 19, { kind: 'same-batch', sg: null, abv: null })],
    );
    expect(f).toEqual({ og: expect.closeTo(1.1, 9), currentSg: expect.closeTo(1.01, 9), sgEstimated: true, unknownTopUps: 0 });
  });

  it('sugar-water with its gravity mixes like honey-water', () => {
    // 9 L, OG 1.080, read 1.000; + 1 L at 1.040: OG (9 × 80 + 40)/10 = 76 → 1.076; now (0 + 40)/10 = 4 → 1.004.
    const f = figuresAfterTopUps(
      1.08,
      [reading('2026-01-10T00:00:00Z', 1.0)],
      [topUp('2026-01-12T00:00:00Z', 1, 9, { kind: 'sugar-water', sg: 1.04, abv: null })],
    );
    expect(f).toEqual({ og: expect.closeTo(1.076, 9), currentSg: expect.closeTo(1.004, 9), sgEstimated: true, unknownTopUps: 0 });
  });

  it('leaves out another wine whose gravity or strength is not known', () => {
    const noSg = topUp('2026-01-12T00:00:00Z', 1, 9, { kind: 'other-wine', sg: null, abv: 12 });
    const noAbv = topUp('2026-01-13T00:00:00Z', 1, 10, { kind: 'other-wine', sg: 0.996, abv: null });
    expect(figuresAfterTopUps(1.1, [reading('2026-01-10T00:00:00Z', 1.0)], [noSg])).toEqual({
      og: 1.1,
      currentSg: 1.0,
      sgEstimated: false,
      unknownTopUps: 1,
    });
    expect(figuresAfterTopUps(1.1, [reading('2026-01-10T00:00:00Z', 1.0)], [noAbv])).toEqual({
      og: 1.1,
      currentSg: 1.0,
      sgEstimated: false,
      unknownTopUps: 1,
    });
  });

  it('leaves out a top-up of nothing, or into a batch of no recorded volume', () => {
    const none = topUp('2026-01-12T00:00:00Z', 0, 9, { kind: 'water', sg: null, abv: null });
    const noBatch = topUp('2026-01-13T00:00:00Z', 1, 0, { kind: 'water', sg: null, abv: null });
    expect(figuresAfterTopUps(1.1, [reading('2026-01-10T00:00:00Z', 1.0)], [none])).toEqual({
      og: 1.1,
      currentSg: 1.0,
      sgEstimated: false,
      unknownTopUps: 1,
    });
    expect(figuresAfterTopUps(1.1, [reading('2026-01-10T00:00:00Z', 1.0)], [noBatch])).toEqual({
      og: 1.1,
      currentSg: 1.0,
      sgEstimated: false,
      unknownTopUps: 1,
    });
  });

  it('has no current gravity and nothing estimated without readings or top-ups', () => {
    expect(figuresAfterTopUps(1.1, [], [])).toEqual({ og: 1.1, currentSg: null, sgEstimated: false, unknownTopUps: 0 });
  });

  it('takes a reading at the moment of a top-up as read before it, whichever is listed first', () => {
    // 19 L read 1.010, then 1 L of water at the same moment: (19 × 10)/20 = 9.5 → 1.0095.
    const at = '2026-01-11T00:00:00Z';
    const water = topUp(at, 1, 19, { kind: 'water', sg: null, abv: null });
    for (const readings of [[reading(at, 1.01)], [reading('2026-01-01T00:00:00Z', 1.05), reading(at, 1.01)]]) {
      const f = figuresAfterTopUps(1.1, readings, [water]);
      expect(f.currentSg).toBeCloseTo(1.0095, 9);
      expect(f.sgEstimated).toBe(true);
    }
  });
});
