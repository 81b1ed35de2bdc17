import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  fermentationState,
  STABLE_WINDOW_DAYS,
  STABLE_TOLERANCE_SG,
  DRY_END_ALLOWANCE_SG,
  NEAR_FINISH_SG,
  SLOWING_RATE_SG_PER_DAY,
  RATE_SPAN_DAYS,
  TOLERANCE_MARGIN_ABV,
  FUTURE_GRACE_DAYS,
  type GravityReading,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';
import { conservativeReferenceFg, linearReferenceAbv } from './reference-abv';

// Every input here is a literal or comes from the reference relations written out in
// reference-abv.ts; none is built from the code under test or its constants.
const START = Date.UTC(2024, 2, 1);
const DAY = 86_400_000;
const HOUR = 3_600_000;
const on = (day: number, sg: number): GravityReading => ({ at: new Date(START + day * DAY), sg });
const nowAfter = (day: number) => new Date(START + day * DAY + HOUR);
const state = (og: number, toleranceAbv: number, readings: GravityReading[], day = 20) =>
  fermentationState({ og, toleranceAbv, readings, now: nowAfter(day) });
/** A ferment that fell from its OG and then held at `sg` for four days (days 10 and 14). */
const heldAt = (og: number, sg: number) => [on(0, og), on(10, sg), on(14, sg)];

describe('the thresholds of the fermentation state (common practice, see each constant)', () => {
  it('are pinned to their values', () => {
    expect(STABLE_WINDOW_DAYS).toBe(3);
    expect(STABLE_TOLERANCE_SG).toBe(0.001);
    expect(DRY_END_ALLOWANCE_SG).toBe(0.008);
    expect(NEAR_FINISH_SG).toBe(0.008);
    expect(TOLERANCE_MARGIN_ABV).toBe(1);
    expect(SLOWING_RATE_SG_PER_DAY).toBe(0.002);
    expect(RATE_SPAN_DAYS).toBe(1);
    expect(FUTURE_GRACE_DAYS).toBe(1);
  });
});

describe('active and slowing', () => {
  it('calls a batch with no readings, or only one, active', () => {
    expect(state(1.1, 14, [], 0)).toBe('active');
    expect(state(1.1, 14, [on(0, 1.1)], 0)).toBe('active');
  });

  it('is active while the gravity falls several points a day', () => {
    expect(state(1.11, 14, [on(0, 1.11), on(2, 1.09), on(4, 1.07), on(6, 1.05)], 6)).toBe('active');
  });

  it('is active at 2.5 points a day and slowing at 1.5 (slowing below 2 points a day)', () => {
    expect(state(1.1, 14, [on(0, 1.1), on(10, 1.03), on(12, 1.025)], 12)).toBe('active');
    expect(state(1.1, 14, [on(0, 1.1), on(10, 1.03), on(12, 1.027)], 12)).toBe('slowing');
    expect(state(1.1, 14, [on(0, 1.1), on(10, 1.03), on(12, 1.026)], 12)).toBe('active'); // exactly 2 points a day
  });

  it('measures the rate over at least a day, counting a reading exactly a day old', () => {
    expect(state(1.05, 14, [on(0, 1.05), on(2, 1.049)], 2)).toBe('slowing');
    expect(state(1.05, 14, [on(0, 1.05), on(1, 1.0495)], 1)).toBe('slowing');
    const hoursApart = [
      { at: new Date(START), sg: 1.05 },
      { at: new Date(START + 20 * HOUR), sg: 1.0499 },
    ];
    expect(state(1.05, 14, hoursApart, 1)).toBe('active');
  });

  it('is active again after a rise in gravity (honey added in a step feed), but not for a rise within reading noise', () => {
    expect(state(1.1, 18, [on(0, 1.1), on(10, 1.02), on(13, 1.02), on(14, 1.045)], 14)).toBe('active');
    expect(state(1.1, 18, [on(0, 1.1), on(12, 1.02), on(14, 1.0205)], 14)).toBe('slowing');
  });
});

describe('steady: the same gravity for three days, within one hydrometer division', () => {
  it('needs the full three days', () => {
    expect(state(1.12, 18, [on(0, 1.12), on(10, 1.04), on(13, 1.04)], 13)).toBe('stuck');
    expect(state(1.12, 18, [on(0, 1.12), on(10, 1.04), on(12.9, 1.04)], 13)).toBe('slowing');
  });

  it('treats a change of 0.001 as steady and 0.002 as movement', () => {
    expect(state(1.12, 18, [on(0, 1.12), on(10, 1.04), on(14, 1.039)], 14)).toBe('stuck');
    expect(state(1.12, 18, [on(0, 1.12), on(10, 1.04), on(14, 1.038)], 14)).toBe('slowing');
  });

  it('looks at every reading from three days back, the oldest of them included', () => {
    expect(state(1.12, 18, [on(0, 1.12), on(10, 1.045), on(11, 1.04), on(13, 1.04)], 13)).toBe('slowing');
  });

  it('counts no alcohol for a steady reading above the OG (sugar added since)', () => {
    expect(state(1.1, 14, [on(0, 1.1), on(10, 1.105), on(14, 1.105)])).toBe('stuck');
  });
});

describe('stuck or finished, at several gravities and tolerances', () => {
  // The conservative reading of "the yeast has reached its tolerance": the alcohol made, by the
  // lower of the linear formula and the Balling relations (both written out in the test), is
  // within 1 % ABV of the tolerance. Dry (steady at or below 1.004) is always finished.
  const cases: [number, number][] = [];
  for (const og of [1.06, 1.09, 1.11, 1.128, 1.14, 1.16]) for (const tol of [10, 12, 14, 16, 18]) cases.push([og, tol]);

  it.each(cases)('OG %s, %s percent yeast: stuck a little short of the tolerance, finished within it', (og, tol) => {
    const boundary = conservativeReferenceFg(og, tol - 1);
    const short = boundary + 0.002;
    if (short > 1.0045 && short < og) expect(state(og, tol, heldAt(og, short))).toBe('stuck');
    const within = boundary - 0.002;
    if (within > 0.98 && within < og) expect(state(og, tol, heldAt(og, within))).toBe('finished');
    expect(state(og, tol, heldAt(og, 1.002))).toBe('finished');
  });

  it.each(cases)('OG %s, %s percent yeast: steady well above the dry end and short is stuck', (og, tol) => {
    const sg = Math.max(1.01, conservativeReferenceFg(og, tol - 1) + 0.01);
    if (sg < og) expect(state(og, tol, heldAt(og, sg))).toBe('stuck');
  });

  it('calls a 1.128 must stopped at 1.040 with a 14 % yeast stuck (11.5 % by the linear formula)', () => {
    expect(linearReferenceAbv(1.128, 1.04)).toBeCloseTo(11.55, 2);
    expect(state(1.128, 14, heldAt(1.128, 1.04))).toBe('stuck');
  });

  it('calls a 1.110 must resting at 1.015 with a 14 % yeast stuck (12.5 % by the linear formula)', () => {
    expect(linearReferenceAbv(1.11, 1.015)).toBeCloseTo(12.47, 2);
    expect(state(1.11, 14, heldAt(1.11, 1.015))).toBe('stuck');
  });

  it('judges by the lower estimate: 1.128 at 1.031 is 12.7 % linear but 13.4 % Balling, short of 14 − 1', () => {
    expect(state(1.128, 14, heldAt(1.128, 1.031))).toBe('stuck');
    expect(state(1.128, 14, heldAt(1.128, 1.028))).toBe('finished'); // 13.1 % linear
  });

  it('calls a ferment steady at 1.002 finished when the yeast could have gone further (dry end to 1.004)', () => {
    expect(state(1.09, 18, heldAt(1.09, 1.002))).toBe('finished');
    expect(state(1.09, 18, heldAt(1.09, 1.004))).toBe('finished');
    expect(state(1.09, 18, heldAt(1.09, 0.994))).toBe('finished');
    expect(state(1.09, 18, heldAt(1.09, 1.006))).toBe('stuck');
  });

  it('never calls a steady ferment finished while it is well above the dry end and more than a point short', () => {
    const steadyShort = fc
      .record({ og: fc.double({ min: 1.03, max: 1.16, noNaN: true }), tol: fc.double({ min: 6, max: 20, noNaN: true }) })
      .chain(({ og, tol }) => fc.record({ og: fc.constant(og), tol: fc.constant(tol), sg: fc.double({ min: 1.0045, max: og, noNaN: true }) }))
      .filter(({ og, tol, sg }) => linearReferenceAbv(og, sg) < tol - 1.05);
    fc.assert(
      fc.property(steadyShort, ({ og, tol, sg }) => {
        expect(state(og, tol, heldAt(og, sg))).toBe('stuck');
      }),
    );
  });
});

describe('order of the readings', () => {
  it('does not depend on the order of the readings, and accepts ISO strings', () => {
    const readings = [on(18, 1.04), on(0, 1.12), on(14, 1.04), on(7, 1.06)];
    const asStrings = readings.map((r) => ({ at: (r.at as Date).toISOString(), sg: r.sg }));
    expect(state(1.12, 18, readings, 18)).toBe('stuck');
    expect(fermentationState({ og: 1.12, toleranceAbv: 18, readings: asStrings, now: nowAfter(18).toISOString() })).toBe('stuck');
  });

  it('gives the same state for two readings with the same timestamp in either order', () => {
    const base = [on(0, 1.1), on(10, 1.01)];
    const a = [...base, on(13, 1.01), on(13, 1.0125)];
    const b = [...base, on(13, 1.0125), on(13, 1.01)];
    expect(state(1.1, 14, a, 13)).toBe('active');
    expect(state(1.1, 14, b, 13)).toBe('active');
  });

  it('gives the same state for any order of the same readings, timestamps shared or not', () => {
    const reading = fc.record({ day: fc.integer({ min: 0, max: 12 }), sg: fc.integer({ min: 990, max: 1120 }) });
    fc.assert(
      fc.property(
        fc.array(reading, { maxLength: 8 }),
        fc.integer({ min: 1000, max: 1120 }),
        fc.integer({ min: 0, max: 20 }),
        (rows, ogPoints, tol) => {
          const readings = rows.map((r) => on(r.day, r.sg / 1000));
          const og = ogPoints / 1000;
          const expected = state(og, tol, readings, 12);
          expect(state(og, tol, [...readings].reverse(), 12)).toBe(expected);
          const rotated = readings.length ? [...readings.slice(1), readings[0]] : readings;
          expect(state(og, tol, rotated, 12)).toBe(expected);
        },
      ),
    );
  });
});

describe('fermentationState input checks', () => {
  const base = { og: 1.1, toleranceAbv: 14, now: nowAfter(10) };
  it('names the reading that is wrong', () => {
    expectInputError(() => fermentationState({ ...base, readings: [on(0, 1.1), on(2, 1.3)] }), 'readings[1].sg');
    expectInputError(
      () => fermentationState({ ...base, readings: [{ at: 'not a date', sg: 1.05 }] }),
      'readings[0].at',
      "Date of reading 1 must be a valid date (got 'not a date').",
    );
    expectInputError(() => fermentationState({ ...base, readings: [on(0, Number.NaN)] }), 'readings[0].sg');
    expectInputError(
      () => fermentationState({ ...base, readings: [null as never] }),
      'readings[0]',
      'Reading 1 must be an entry with a date and a gravity.',
    );
    expectInputError(() => fermentationState({ ...base, readings: [7 as never] }), 'readings[0]');
    expectInputError(() => fermentationState({ ...base, readings: 'x' as never }), 'readings', 'Readings must be a list of { at, sg } entries.');
  });

  it('accepts a reading dated up to a day after the moment of judgement, not more', () => {
    const now = new Date(START + 10 * DAY);
    const dayAhead = { at: new Date(START + 11 * DAY), sg: 1.05 };
    expect(fermentationState({ ...base, now, readings: [dayAhead] })).toBe('active');
    expectInputError(
      () => fermentationState({ ...base, now, readings: [{ at: new Date(START + 11 * DAY + 1000), sg: 1.05 }] }),
      'readings[0].at',
      'Reading 1 is dated 2024-03-12, after 2024-03-11.',
    );
  });

  it('names the batch figure that is wrong', () => {
    expectInputError(() => fermentationState({ ...base, og: 1.4, readings: [] }), 'og');
    expectInputError(
      () => fermentationState({ ...base, toleranceAbv: 40, readings: [] }),
      'toleranceAbv',
      'Yeast alcohol tolerance must be between 0 and 25 % ABV (got 40 % ABV).',
    );
    expectInputError(() => fermentationState({ ...base, toleranceAbv: -1, readings: [] }), 'toleranceAbv');
    expectInputError(() => fermentationState({ ...base, now: 'soon', readings: [] }), 'now');
  });
});

describe('reading messages', () => {
  it('number the reading from 1', () => {
    expectInputError(
      () => fermentationState({ og: 1.1, toleranceAbv: 14, now: nowAfter(10), readings: [on(0, 1.1), on(2, 1.3)] }),
      'readings[1].sg',
      'Gravity of reading 2 must be between 0.980 and 1.200 (got 1.300).',
    );
  });

  it('counts a rise of exactly one hydrometer division as noise', () => {
    expect(state(1.1, 18, [on(0, 1.1), on(12, 1.02), on(14, 1.021)], 14)).toBe('slowing');
  });
});
