import { describe, it, expect } from 'vitest';
import { headspace, rackingLoss, bestVesselForRacking, bottlesFrom, casesFrom } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

describe('headspace — capacity minus volume (definition)', () => {
  it.each([
    // [capacity L, volume L, headspace L, % of capacity]
    [23, 21, 2, (2 / 23) * 100],
    [4.5, 4.5, 0, 0],
    [25, 0, 25, 100],
    [5 * 3.785411784, 4.75 * 3.785411784, 0.25 * 3.785411784, 5], // 5-gal carboy holding 4.75 gal
  ])('%s L vessel holding %s L', (capacityL, volumeL, litres, percent) => {
    const h = headspace({ capacityL, volumeL });
    expect(h.litres).toBeCloseTo(litres, 9);
    expect(h.percent).toBeCloseTo(percent, 9);
  });

  it('rejects a volume the vessel cannot hold', () => {
    expectInputError(
      () => headspace({ capacityL: 23, volumeL: 25 }),
      'volumeL',
      'Volume (25 L) is more than the vessel holds (23 L).',
    );
    expectInputError(() => headspace({ capacityL: 0, volumeL: 0 }), 'capacityL');
    expectInputError(() => headspace({ capacityL: 23, volumeL: -1 }), 'volumeL');
    expectInputError(() => headspace({ capacityL: Number.NaN, volumeL: 1 }), 'capacityL');
  });
});

describe('rackingLoss — rule of thumb (common practice): 8 % primary, 4 % secondary, 2 % later', () => {
  it.each([
    ['primary', 1.6],
    ['secondary', 0.8],
    ['ageing', 0.4],
  ] as const)('20 L at a %s racking loses %s L', (stage, litres) => {
    expect(rackingLoss({ volumeL: 20, stage })).toBeCloseTo(litres, 9);
  });

  it('defaults to a secondary racking and takes the cellar’s own loss share', () => {
    expect(rackingLoss({ volumeL: 20 })).toBeCloseTo(0.8, 9);
    expect(rackingLoss({ volumeL: 20, lossFraction: 0.15 })).toBeCloseTo(3, 9);
  });

  it('rejects impossible input', () => {
    expectInputError(() => rackingLoss({ volumeL: -3 }), 'volumeL');
    expectInputError(() => rackingLoss({ volumeL: 3, lossFraction: 0.9 }), 'lossFraction');
    expectInputError(() => rackingLoss({ volumeL: 3, stage: 'tertiary' as never }), 'stage');
  });
});

describe('bestVesselForRacking', () => {
  const free = [
    { id: 'keg-1', capacityL: 25 },
    { id: 'carboy-3', capacityL: 19 },
    { id: 'carboy-1', capacityL: 23 },
    { id: 'demijohn-2', capacityL: 4.5, label: 'DJ2' },
  ];

  it('picks the smallest vessel that holds the volume after the lees are left behind', () => {
    // 20 L off primary lees loses 1.6 L (8 %), leaving 18.4 L: the 19 L carboy.
    expect(bestVesselForRacking({ volumeL: 20, candidates: free, stage: 'primary' })?.id).toBe('carboy-3');
    // 20 L at a later racking loses 0.4 L, leaving 19.6 L: too much for 19 L.
    expect(bestVesselForRacking({ volumeL: 20, candidates: free, stage: 'ageing' })?.id).toBe('carboy-1');
  });

  it('uses a loss the hand gives instead of the rule of thumb', () => {
    expect(bestVesselForRacking({ volumeL: 20, candidates: free, lossL: 1 })?.id).toBe('carboy-3');
    expect(bestVesselForRacking({ volumeL: 20, candidates: free, lossL: 0 })?.id).toBe('carboy-1');
  });

  it('keeps the candidate’s other fields and prefers the earlier of equal sizes', () => {
    const pick = bestVesselForRacking({ volumeL: 4.5, candidates: free, stage: 'secondary' });
    expect(pick).toEqual({ id: 'demijohn-2', capacityL: 4.5, label: 'DJ2' });
    const twins = [
      { id: 'a', capacityL: 23 },
      { id: 'b', capacityL: 23 },
    ];
    expect(bestVesselForRacking({ volumeL: 22, candidates: twins })?.id).toBe('a');
  });

  it('accepts a vessel exactly as big as the volume left', () => {
    expect(bestVesselForRacking({ volumeL: 23, candidates: [{ id: 'x', capacityL: 23 }], lossL: 0 })?.id).toBe('x');
  });

  it('returns null when nothing is big enough or there is nothing free', () => {
    expect(bestVesselForRacking({ volumeL: 60, candidates: free })).toBeNull();
    expect(bestVesselForRacking({ volumeL: 10, candidates: [] })).toBeNull();
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => bestVesselForRacking({ volumeL: -1, candidates: free }), 'volumeL');
    expectInputError(() => bestVesselForRacking({ volumeL: 5, candidates: free, lossL: 6 }), 'lossL');
    expectInputError(
      () => bestVesselForRacking({ volumeL: 5, candidates: [{ id: 'a', capacityL: 10 }, { id: 'b', capacityL: -2 }] }),
      'candidates[1].capacityL',
    );
    expectInputError(() => bestVesselForRacking({ volumeL: 5, candidates: [{ id: 'a', capacityL: Number.NaN }] }), 'candidates[0].capacityL');
    expectInputError(() => bestVesselForRacking({ volumeL: 5, candidates: null as never }), 'candidates');
  });
});

describe('bottlesFrom — full bottles after losses (arithmetic)', () => {
  it.each([
    // [volume L, bottle mL, loss L, bottles, remainder mL]
    [19, 750, 0, 25, 250], // 25 × 750 = 18 750 mL
    [22.5, 750, 0, 30, 0], // exactly 30, not 29 from float error
    [19, 750, 0.3, 24, 700], // 18 700 mL usable
    [5 * 3.785411784, 750, 0, 25, 177.059], // a 5-US-gallon batch: 18 927.059 mL
    [4.5, 375, 0.25, 11, 125], // demijohn into half bottles: 4 250 mL
    [0, 750, 0, 0, 0],
  ])('%s L into %s mL bottles, losing %s L', (volumeL, bottleMl, lossL, bottles, remainderMl) => {
    const r = bottlesFrom({ volumeL, bottleMl, lossL });
    expect(r.bottles).toBe(bottles);
    expect(r.remainderMl).toBeCloseTo(remainderMl, 2);
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 0 }), 'bottleMl');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: 11 }), 'lossL');
    expectInputError(() => bottlesFrom({ volumeL: -10, bottleMl: 750 }), 'volumeL');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: Number.POSITIVE_INFINITY }), 'bottleMl');
  });
});

describe('casesFrom', () => {
  it.each([
    [25, 12, 2, 1],
    [24, 12, 2, 0],
    [11, 12, 0, 11],
    [30, 6, 5, 0],
    [0, 12, 0, 0],
  ])('%s bottles at %s a case', (bottles, perCase, cases, loose) => {
    expect(casesFrom(bottles, perCase)).toEqual({ cases, loose });
  });

  it('defaults to 12 bottles a case', () => {
    expect(casesFrom(30)).toEqual({ cases: 2, loose: 6 });
  });

  it('rejects part bottles and empty cases', () => {
    expectInputError(() => casesFrom(2.5), 'bottles');
    expectInputError(() => casesFrom(-1), 'bottles');
    expectInputError(() => casesFrom(10, 0), 'perCase');
    expectInputError(() => casesFrom(10, 1.5), 'perCase');
  });
});
