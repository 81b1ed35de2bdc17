import { describe, it, expect } from 'vitest';
import { daysBetween, ageInDays, addMonths, ageMilestones, annualVolumeUsage, US_HOME_WINE_LIMIT_L, AGE_MILESTONE_MONTHS } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// Gregorian calendar facts: 2024 is a leap year (366 days, 29 February), 2023 is not.
describe('daysBetween', () => {
  it.each([
    ['2023-01-01', '2024-01-01', 365],
    ['2024-01-01', '2025-01-01', 366],
    ['2024-02-28', '2024-03-01', 2],
    ['2023-02-28', '2023-03-01', 1],
    ['2024-03-10', '2024-03-10', 0],
    ['2024-03-10', '2024-03-01', -9],
  ])('%s to %s is %s days', (a, b, days) => {
    expect(daysBetween(a, b)).toBe(days);
  });

  it('counts only complete days', () => {
    expect(daysBetween('2024-03-01T00:00:00Z', '2024-03-02T23:00:00Z')).toBe(1);
    expect(daysBetween(new Date('2024-03-02T23:00:00Z'), new Date('2024-03-01T00:00:00Z'))).toBe(-1);
  });

  it('rejects dates that are not dates', () => {
    expectInputError(() => daysBetween('yesterday', '2024-01-01'), 'a');
    expectInputError(() => daysBetween('2024-01-01', new Date(Number.NaN)), 'b');
    expectInputError(() => daysBetween('', '2024-01-01'), 'a');
  });
});

describe('addMonths', () => {
  it.each([
    ['2024-01-31', 1, '2024-02-29'], // leap-year February
    ['2023-01-31', 1, '2023-02-28'],
    ['2024-08-31', 1, '2024-09-30'],
    ['2024-11-15', 3, '2025-02-15'],
    ['2024-01-15', 12, '2025-01-15'],
    ['2024-02-29', 12, '2025-02-28'],
  ] as const)('%s plus %s months is %s', (start, months, expected) => {
    expect(addMonths(start, months).toISOString().slice(0, 10)).toBe(expected);
  });

  it('rejects part months and negative months', () => {
    expectInputError(() => addMonths('2024-01-01', 1.5), 'months');
    expectInputError(() => addMonths('2024-01-01', -1), 'months', 'Months must be between 0 and 12000 (got -1).');
    expectInputError(() => addMonths('2024-01-01', 12_001), 'months');
    expectInputError(() => addMonths('never', 1), 'date');
  });

  it('adds nothing for zero months and keeps the time of day', () => {
    expect(addMonths('2024-01-31T18:30:00Z', 0).toISOString()).toBe('2024-01-31T18:30:00.000Z');
    expect(addMonths('2024-01-31T18:30:00Z', 1).toISOString()).toBe('2024-02-29T18:30:00.000Z');
    expect(addMonths('2024-01-15', 12_000).toISOString().slice(0, 10)).toBe('3024-01-15');
  });
});

describe('ageMilestones — 3, 6 and 12 calendar months', () => {
  const reached = (start: string, now: string) =>
    ageMilestones(start, now)
      .filter((m) => m.reached)
      .map((m) => m.months);

  it.each([
    ['2024-01-15', '2024-04-14', []],
    ['2024-01-15', '2024-04-15', [3]],
    ['2024-01-15', '2024-07-14', [3]],
    ['2024-01-15', '2024-07-15', [3, 6]],
    ['2024-01-15', '2025-01-14', [3, 6]],
    ['2024-01-15', '2025-01-15', [3, 6, 12]],
    ['2023-11-30', '2024-02-29', [3]], // 30 Nov + 3 months falls back to 29 Feb 2024
  ])('started %s, on %s: reached %j', (start, now, months) => {
    expect(reached(start, now)).toEqual(months);
  });

  it('gives the date of each milestone', () => {
    const m = ageMilestones('2024-01-31', '2024-02-01');
    expect(m.map((x) => x.date.toISOString().slice(0, 10))).toEqual(['2024-04-30', '2024-07-31', '2025-01-31']);
  });

  it('tracks 3, 6 and 12 months by default', () => {
    expect(AGE_MILESTONE_MONTHS).toEqual([3, 6, 12]);
    expect(ageMilestones('2024-01-15', '2024-01-15').map((m) => m.months)).toEqual([3, 6, 12]);
  });

  it('counts a milestone as reached from its very moment', () => {
    const m = ageMilestones('2024-01-15T12:00:00Z', '2024-04-15T12:00:00Z');
    expect(m[0].reached).toBe(true);
    expect(ageMilestones('2024-01-15T12:00:00Z', '2024-04-15T11:59:59Z')[0].reached).toBe(false);
  });

  it('takes the cellar’s own milestones', () => {
    const m = ageMilestones('2024-01-01', '2024-03-01', [1, 2, 18]);
    expect(m.map((x) => [x.months, x.reached])).toEqual([
      [1, true],
      [2, true],
      [18, false],
    ]);
  });

  it('rejects bad dates and milestones', () => {
    expectInputError(() => ageMilestones('nope', '2024-01-01'), 'start');
    expectInputError(() => ageMilestones('2024-01-01', 'nope'), 'now');
    expectInputError(() => ageMilestones('2024-01-01', '2024-02-01', [3, 0]), 'months[1]');
    expectInputError(() => ageMilestones('2024-01-01', '2024-02-01', 'x' as never), 'months', 'Milestones must be a list of month counts.');
    expectInputError(() => ageMilestones('2024-01-01', '2024-02-01', [1201]), 'months[0]', 'Milestone 1 must be between 1 and 1200 (got 1201).');
  });
});

describe('annual production against a limit', () => {
  it('US federal reference: 100 gal for one adult, 200 for two or more (27 CFR 24.75(b)), in litres', () => {
    // 1 US gal = 231 in³ × (2.54 cm)³ (NIST Handbook 44, Appendix C).
    const gallon = (231 * 2.54 ** 3) / 1000;
    expect(US_HOME_WINE_LIMIT_L.oneAdult).toBeCloseTo(100 * gallon, 9);
    expect(US_HOME_WINE_LIMIT_L.twoOrMoreAdults).toBeCloseTo(200 * gallon, 9);
  });

  it('adds up the year’s batches against the limit', () => {
    const u = annualVolumeUsage({ volumesL: [23, 19, 4.5], limitL: 378.5411784 });
    expect(u.totalL).toBeCloseTo(46.5, 9);
    expect(u.remainingL).toBeCloseTo(378.5411784 - 46.5, 9);
    expect(u.percentUsed).toBeCloseTo((46.5 / 378.5411784) * 100, 9);
    expect(u.over).toBe(false);
  });

  it('is not over at exactly the limit', () => {
    const u = annualVolumeUsage({ volumesL: [50, 50], limitL: 100 });
    expect(u.over).toBe(false);
    expect(u.percentUsed).toBe(100);
    expect(u.remainingL).toBe(0);
  });

  it('says when the year is over the limit', () => {
    const u = annualVolumeUsage({ volumesL: [200, 200], limitL: US_HOME_WINE_LIMIT_L.oneAdult });
    expect(u.over).toBe(true);
    expect(u.remainingL).toBe(0);
    expect(u.percentUsed).toBeGreaterThan(100);
  });

  it('is empty for a year with no batches', () => {
    expect(annualVolumeUsage({ volumesL: [], limitL: 100 })).toEqual({
      totalL: 0,
      limitL: 100,
      remainingL: 100,
      percentUsed: 0,
      over: false,
    });
  });

  it('rejects impossible input, naming the argument', () => {
    expectInputError(() => annualVolumeUsage({ volumesL: [10, -2], limitL: 100 }), 'volumesL[1]');
    expectInputError(() => annualVolumeUsage({ volumesL: [10], limitL: 0 }), 'limitL');
    expectInputError(() => annualVolumeUsage({ volumesL: [Number.NaN], limitL: 100 }), 'volumesL[0]');
    expectInputError(() => annualVolumeUsage({ volumesL: 5 as never, limitL: 100 }), 'volumesL', 'Volumes must be a list of litres.');
  });
});

describe('production-limit messages', () => {
  it('name the value and its unit', () => {
    expectInputError(() => annualVolumeUsage({ volumesL: [], limitL: 0 }), 'limitL', 'Yearly limit must be more than zero (got 0 L).');
    expectInputError(() => annualVolumeUsage({ volumesL: [10, -2], limitL: 100 }), 'volumesL[1]', 'Volume of batch 2 cannot be negative (got -2 L).');
  });
});

// The cellar's one age rule: whole calendar days between two local dates (Gregorian calendar:
// 2024 is a leap year; July has 31 days).
describe('ageInDays', () => {
  it.each([
    ['2026-05-03', '2026-12-02', 213],
    ['2024-02-28', '2024-03-01', 2],
    ['2023-02-28', '2023-03-01', 1],
    ['2026-07-31', '2026-08-01', 1],
    ['2026-12-02', '2026-12-02', 0],
  ])('%s to %s is %s days', (start, today, days) => {
    expect(ageInDays(start, today)).toBe(days);
  });

  it('reads a timestamp by its date and never counts below zero', () => {
    expect(ageInDays('2026-05-03T23:30:00Z', '2026-05-04')).toBe(1);
    expect(ageInDays('2026-12-05', '2026-12-02')).toBe(0);
  });

  it('refuses what is not a calendar date', () => {
    expectInputError(() => ageInDays('2026-02-30', '2026-03-01'), 'startedOn');
    expectInputError(() => ageInDays('2026-03-01', 'yesterday'), 'today');
  });
});
