import { describe, it, expect } from 'vitest';
import {
  fermentationState,
  predictFinish,
  STABLE_WINDOW_DAYS,
  STABLE_TOLERANCE_SG,
  NEAR_FINISH_SG,
  SLOWING_RATE_SG_PER_DAY,
  TOLERANCE_MARGIN_ABV,
  fgAtAbv,
  type GravityReading,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// The thresholds are common practice (see the constants' comments); these tests
// check the decisions built on them, so they use the constants rather than copies.
const START = Date.UTC(2024, 2, 1);
const DAY = 86_400_000;
const on = (day: number, sg: number): GravityReading => ({ at: new Date(START + day * DAY), sg });
const nowAfter = (day: number) => new Date(START + day * DAY + 3_600_000);

describe('fermentationState', () => {
  it('calls a batch with no readings, or only one, active', () => {
    expect(fermentationState({ og: 1.1, toleranceAbv: 14, readings: [], now: nowAfter(0) })).toBe('active');
    expect(fermentationState({ og: 1.1, toleranceAbv: 14, readings: [on(0, 1.1)], now: nowAfter(0) })).toBe('active');
  });

  it('is active while the gravity falls several points a day', () => {
    const readings = [on(0, 1.11), on(2, 1.09), on(4, 1.07), on(6, 1.05)];
    expect(fermentationState({ og: 1.11, toleranceAbv: 14, readings, now: nowAfter(6) })).toBe('active');
  });

  it('is slowing when the fall drops below the slowing rate but the gravity is not yet steady', () => {
    const slow = SLOWING_RATE_SG_PER_DAY / 2;
    const readings = [on(0, 1.11), on(10, 1.03), on(12, 1.03 - 2 * slow), on(14, 1.03 - 4 * slow)];
    expect(fermentationState({ og: 1.11, toleranceAbv: 14, readings, now: nowAfter(14) })).toBe('slowing');
  });

  it('is finished when steady for the window at the predicted dry finish', () => {
    const readings = [on(0, 1.1), on(7, 1.04), on(14, 0.998), on(14 + STABLE_WINDOW_DAYS, 0.998)];
    expect(fermentationState({ og: 1.1, toleranceAbv: 18, readings, now: nowAfter(20) })).toBe('finished');
  });

  it('is finished when steady near (not exactly at) the predicted finish', () => {
    const predicted = predictFinish({ og: 1.12, toleranceAbv: 14 }).fg;
    const sg = predicted + NEAR_FINISH_SG * 0.8;
    const readings = [on(0, 1.12), on(10, sg + 0.01), on(20, sg), on(24, sg)];
    expect(fermentationState({ og: 1.12, toleranceAbv: 14, readings, now: nowAfter(24) })).toBe('finished');
  });

  it('is stuck when steady well above the finish with the yeast far short of its tolerance', () => {
    // OG 1.120 → 1.040 is about 12 % ABV, well short of an 18 % yeast.
    const readings = [on(0, 1.12), on(7, 1.06), on(14, 1.04), on(15, 1.0405), on(18, 1.04)];
    expect(fermentationState({ og: 1.12, toleranceAbv: 18, readings, now: nowAfter(18) })).toBe('stuck');
  });

  it('is finished, not stuck, when the yeast has already made about its stated tolerance', () => {
    // Steady above the predicted FG, but the alcohol made is within the margin of the tolerance.
    const predicted = predictFinish({ og: 1.1, toleranceAbv: 12 }).fg;
    const sg = fgAtAbv(1.1, 12 - 0.8 * TOLERANCE_MARGIN_ABV);
    expect(sg).toBeGreaterThan(predicted + NEAR_FINISH_SG); // outside the "near the finish" allowance
    const readings = [on(0, 1.1), on(14, sg), on(18, sg)];
    expect(fermentationState({ og: 1.1, toleranceAbv: 12, readings, now: nowAfter(18) })).toBe('finished');
    // The same gravity with a yeast good for 16 % is a stuck ferment.
    expect(fermentationState({ og: 1.1, toleranceAbv: 16, readings, now: nowAfter(18) })).toBe('stuck');
  });

  it('needs the full window of steadiness before calling it stuck or finished', () => {
    const short = [on(0, 1.12), on(14, 1.04), on(14 + STABLE_WINDOW_DAYS - 1, 1.04)];
    const state = fermentationState({ og: 1.12, toleranceAbv: 18, readings: short, now: nowAfter(20) });
    expect(state).not.toBe('stuck');
    expect(state).not.toBe('finished');
  });

  it('treats a change within the steadiness tolerance as steady, and a larger one as movement', () => {
    const within = [on(0, 1.12), on(10, 1.04), on(14, 1.04 - STABLE_TOLERANCE_SG)];
    expect(fermentationState({ og: 1.12, toleranceAbv: 18, readings: within, now: nowAfter(14) })).toBe('stuck');
    const beyond = [on(0, 1.12), on(10, 1.04), on(14, 1.04 - 3 * STABLE_TOLERANCE_SG)];
    expect(fermentationState({ og: 1.12, toleranceAbv: 18, readings: beyond, now: nowAfter(14) })).toBe('slowing');
  });

  it('is active again after a rise in gravity (honey added in a step feed)', () => {
    const readings = [on(0, 1.1), on(10, 1.02), on(13, 1.02), on(14, 1.045)];
    expect(fermentationState({ og: 1.1, toleranceAbv: 18, readings, now: nowAfter(14) })).toBe('active');
  });

  it('calls less than a day of history active', () => {
    const readings = [{ at: new Date(START), sg: 1.1 }, { at: new Date(START + 6 * 3_600_000), sg: 1.1 }];
    expect(fermentationState({ og: 1.1, toleranceAbv: 14, readings, now: nowAfter(1) })).toBe('active');
  });

  it('does not depend on the order of the readings, and accepts ISO strings', () => {
    const readings = [on(18, 1.04), on(0, 1.12), on(14, 1.04), on(7, 1.06)];
    const asStrings = readings.map((r) => ({ at: (r.at as Date).toISOString(), sg: r.sg }));
    expect(fermentationState({ og: 1.12, toleranceAbv: 18, readings, now: nowAfter(18) })).toBe('stuck');
    expect(
      fermentationState({ og: 1.12, toleranceAbv: 18, readings: asStrings, now: nowAfter(18).toISOString() }),
    ).toBe('stuck');
  });
});

describe('fermentationState input checks', () => {
  const base = { og: 1.1, toleranceAbv: 14, now: nowAfter(10) };
  it('names the reading that is wrong', () => {
    expectInputError(() => fermentationState({ ...base, readings: [on(0, 1.1), on(2, 1.3)] }), 'readings[1].sg');
    expectInputError(
      () => fermentationState({ ...base, readings: [{ at: 'not a date', sg: 1.05 }] }),
      'readings[0].at',
    );
    expectInputError(() => fermentationState({ ...base, readings: [on(0, Number.NaN)] }), 'readings[0].sg');
    expectInputError(() => fermentationState({ ...base, readings: [on(30, 1.05)] }), 'readings[0].at', /after/);
    expectInputError(() => fermentationState({ ...base, readings: [null as never] }), 'readings[0]');
    expectInputError(() => fermentationState({ ...base, readings: 'x' as never }), 'readings');
  });

  it('names the batch figure that is wrong', () => {
    expectInputError(() => fermentationState({ ...base, og: 1.4, readings: [] }), 'og');
    expectInputError(() => fermentationState({ ...base, toleranceAbv: 40, readings: [] }), 'toleranceAbv');
    expectInputError(() => fermentationState({ ...base, now: 'soon', readings: [] }), 'now');
  });
});
