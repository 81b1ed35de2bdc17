import { describe, it, expect } from 'vitest';
import {
  headspace,
  rackingLoss,
  bestVesselForRacking,
  bottlesFrom,
  casesFrom,
  DEFAULT_BOTTLES_PER_CASE,
  RACKING_LOSS_FIXED_L,
  RACKING_LOSS_FRACTION,
  RACKING_STAGES,
} from '../../shared/calc';
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
    expectInputError(() => headspace({ capacityL: 23, volumeL: 25 }), 'volumeL', 'Volume (25 L) is more than the vessel holds (23 L).');
    expectInputError(() => headspace({ capacityL: 0, volumeL: 0 }), 'capacityL');
    expectInputError(() => headspace({ capacityL: 23, volumeL: -1 }), 'volumeL');
    expectInputError(() => headspace({ capacityL: Number.NaN, volumeL: 1 }), 'capacityL');
  });
});

describe('rackingLoss — a fixed 0.03 L plus a share of the volume by stage (common practice)', () => {
  // Makers' figures (common practice): about half a cup from a one-gallon batch and a couple
  // of cups from a five-gallon batch. US cup = 8 US fl oz = 236.6 mL (NIST Handbook 44, App. C).
  const CUP_L = (8 * 231 * 2.54 ** 3) / 1000 / 128;
  const GALLON_L = (231 * 2.54 ** 3) / 1000;

  it('loses about half a cup from a one-gallon batch', () => {
    const loss = rackingLoss({ volumeL: GALLON_L });
    expect(loss / CUP_L).toBeGreaterThan(0.4);
    expect(loss / CUP_L).toBeLessThan(0.65);
  });

  it('loses about two cups from a five-gallon batch', () => {
    const loss = rackingLoss({ volumeL: 5 * GALLON_L });
    expect(loss / CUP_L).toBeGreaterThan(1.75);
    expect(loss / CUP_L).toBeLessThan(2.5);
  });

  it('loses more off the heavy primary lees than at later rackings, never a fixed share', () => {
    const primary = rackingLoss({ volumeL: 5 * GALLON_L, stage: 'primary' });
    const later = rackingLoss({ volumeL: 5 * GALLON_L, stage: 'ageing' });
    expect(primary / CUP_L).toBeGreaterThan(3);
    expect(primary / CUP_L).toBeLessThan(4); // a share of 8 % would be 6.4 cups
    expect(later / CUP_L).toBeLessThan(1);
  });

  it.each([
    // [stage, litres lost from 20 L]: 0.03 + 20 × share
    ['primary', 0.83], // 0.04
    ['secondary', 0.53], // 0.025
    ['ageing', 0.23], // 0.01
  ] as const)('20 L at a %s racking loses %s L', (stage, litres) => {
    expect(rackingLoss({ volumeL: 20, stage })).toBeCloseTo(litres, 9);
  });

  it('pins the rule’s figures', () => {
    expect(RACKING_STAGES).toEqual(['primary', 'secondary', 'ageing']);
    expect(RACKING_LOSS_FIXED_L).toBe(0.03);
    expect(RACKING_LOSS_FRACTION).toEqual({ primary: 0.04, secondary: 0.025, ageing: 0.01 });
  });

  it('defaults to a secondary racking and takes the cellar’s own loss share instead of the rule', () => {
    expect(rackingLoss({ volumeL: 20 })).toBeCloseTo(0.53, 9);
    expect(rackingLoss({ volumeL: 20, lossFraction: 0.15 })).toBeCloseTo(3, 9);
    expect(rackingLoss({ volumeL: 20, lossFraction: 0 })).toBe(0);
  });

  it('never loses more than there is', () => {
    expect(rackingLoss({ volumeL: 0.02 })).toBe(0.02);
    expect(rackingLoss({ volumeL: 0 })).toBe(0);
  });

  it('rejects impossible input', () => {
    expectInputError(() => rackingLoss({ volumeL: -3 }), 'volumeL');
    expectInputError(() => rackingLoss({ volumeL: 3, lossFraction: 0.9 }), 'lossFraction', 'Loss share must be between 0.00 and 0.50 (got 0.90).');
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
    // 19.5 L off primary lees loses 0.03 + 0.78 = 0.81 L, leaving 18.69 L: the 19 L carboy.
    expect(bestVesselForRacking({ volumeL: 19.5, candidates: free, stage: 'primary' })?.id).toBe('carboy-3');
    // 19.5 L at a later racking loses 0.03 + 0.195 = 0.225 L, leaving 19.275 L: too much for 19 L.
    expect(bestVesselForRacking({ volumeL: 19.5, candidates: free, stage: 'ageing' })?.id).toBe('carboy-1');
    // A secondary racking by default: 19.5 L loses 0.5175 L, leaving 18.98 L: the 19 L carboy.
    expect(bestVesselForRacking({ volumeL: 19.5, candidates: free })?.id).toBe('carboy-3');
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
      () =>
        bestVesselForRacking({
          volumeL: 5,
          candidates: [
            { id: 'a', capacityL: 10 },
            { id: 'b', capacityL: -2 },
          ],
        }),
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
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 0 }), 'bottleMl', 'Bottle size must be at least 1 mL (got 0 mL).');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 0.5 }), 'bottleMl');
    expect(bottlesFrom({ volumeL: 0.01, bottleMl: 1 })).toEqual({ bottles: 10, remainderMl: 0 });
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: 11 }), 'lossL');
    expectInputError(() => bottlesFrom({ volumeL: -10, bottleMl: 750 }), 'volumeL');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: Number.POSITIVE_INFINITY }), 'bottleMl');
  });

  it('refuses a volume too large to count in bottles rather than answer Infinity or an inexact count', () => {
    expectInputError(() => bottlesFrom({ volumeL: 1e308, bottleMl: 750 }), 'volumeL', 'Volume (1e+308 L) is too large to count in bottles.');
    expectInputError(() => bottlesFrom({ volumeL: 1e13, bottleMl: 1 }), 'volumeL');
    // 2⁵³ − 1 mL of 1 mL bottles is the largest exact count: 9 007 199 254 740.991 L.
    expect(bottlesFrom({ volumeL: 9e12, bottleMl: 1000 }).bottles).toBe(9e12);
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
    expect(DEFAULT_BOTTLES_PER_CASE).toBe(12);
    expect(casesFrom(30)).toEqual({ cases: 2, loose: 6 });
  });

  it('rejects part bottles and empty cases', () => {
    expectInputError(() => casesFrom(2.5), 'bottles');
    expectInputError(() => casesFrom(-1), 'bottles');
    expectInputError(() => casesFrom(10, 0), 'perCase');
    expectInputError(() => casesFrom(10, 1.5), 'perCase');
  });
});

describe('vessel and bottle messages name the value and its unit', () => {
  it('says which figure is wrong, in litres', () => {
    expectInputError(() => headspace({ capacityL: -1, volumeL: 0 }), 'capacityL', 'Vessel capacity must be more than zero (got -1 L).');
    expectInputError(() => headspace({ capacityL: 5, volumeL: -1 }), 'volumeL', 'Volume cannot be negative (got -1 L).');
    expectInputError(() => rackingLoss({ volumeL: -3 }), 'volumeL', 'Volume cannot be negative (got -3 L).');
    expectInputError(() => bestVesselForRacking({ volumeL: -1, candidates: [] }), 'volumeL', 'Volume cannot be negative (got -1 L).');
    expectInputError(() => bestVesselForRacking({ volumeL: 5, candidates: [], lossL: -1 }), 'lossL', 'Expected loss cannot be negative (got -1 L).');
    expectInputError(
      () => bestVesselForRacking({ volumeL: 5, candidates: [], lossL: 6 }),
      'lossL',
      'Expected loss (6 L) cannot be more than the volume racked (5 L).',
    );
    expectInputError(
      () =>
        bestVesselForRacking({
          volumeL: 5,
          candidates: [
            { id: 'a', capacityL: 10 },
            { id: 'b', capacityL: 0 },
          ],
        }),
      'candidates[1].capacityL',
      'Capacity of candidate 2 must be more than zero (got 0 L).',
    );
    expectInputError(() => bottlesFrom({ volumeL: -10, bottleMl: 750 }), 'volumeL', 'Volume cannot be negative (got -10 L).');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: -1 }), 'lossL', 'Loss cannot be negative (got -1 L).');
    expectInputError(() => bottlesFrom({ volumeL: 10, bottleMl: 750, lossL: 11 }), 'lossL', 'Loss (11 L) cannot be more than the volume (10 L).');
  });

  it('names a candidate that is not a vessel', () => {
    expectInputError(
      () => bestVesselForRacking({ volumeL: 5, candidates: [{ id: 'a', capacityL: 10 }, null as never] }),
      'candidates[1]',
      'Candidate 2 must be a vessel with a capacity.',
    );
    expectInputError(() => bestVesselForRacking({ volumeL: 5, candidates: ['x' as never] }), 'candidates[0]');
    expectInputError(
      () => bestVesselForRacking({ volumeL: 5, candidates: null as never }),
      'candidates',
      'Candidates must be a list of vessels with a capacity.',
    );
  });

  it('accepts a loss as large as the whole volume', () => {
    expect(bestVesselForRacking({ volumeL: 5, candidates: [{ id: 'a', capacityL: 1 }], lossL: 5 })?.id).toBe('a');
  });
});
