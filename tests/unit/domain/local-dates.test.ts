import { fc, test as propTest } from '@fast-check/vitest';
import dayjs from 'dayjs';
import utc from 'dayjs/plugin/utc';
import { describe, expect, it } from 'vitest';
import { addDays, addMonths, addPeriod, daysBetween } from '../../../shared/domain/plans/local-dates';

describe('local dates (calendar arithmetic)', () => {
  it('ends a month that has no such day on its last day (31 January + 1 month)', () => {
    expect(addMonths('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonths('2028-01-31', 1)).toBe('2028-02-29'); // 2028 is a leap year (Gregorian rule: divisible by 4, not by 100)
    expect(addMonths('2026-08-31', 1)).toBe('2026-09-30');
    expect(addMonths('2026-11-15', 3)).toBe('2027-02-15');
  });

  it('counts repeats from the first date, so month ends do not drift', () => {
    // 31 Jan → 28 Feb → 31 Mar, not 28 Mar.
    expect(addPeriod('2026-01-31', { count: 1, unit: 'months' }, 2)).toBe('2026-03-31');
    expect(addPeriod('2026-03-01', { count: 2, unit: 'weeks' })).toBe('2026-03-15');
  });

  it('is untouched by daylight-saving changes (dates, not clock times)', () => {
    // 29 March 2026 is the EU change to summer time; 25 October 2026 back (EU Directive 2000/84/EC: last Sundays).
    expect(addPeriod('2026-03-28', { count: 1, unit: 'days' })).toBe('2026-03-29');
    expect(addPeriod('2026-03-28', { count: 2, unit: 'days' })).toBe('2026-03-30');
    expect(daysBetween('2026-10-24', '2026-10-26')).toBe(2);
  });

  it('crosses months, years and leap days by the Gregorian calendar', () => {
    // Gregorian rule: a leap year is divisible by 4, except centuries not divisible by 400.
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29');
    expect(addDays('2023-02-28', 1)).toBe('2023-03-01');
    expect(addDays('2100-02-28', 1)).toBe('2100-03-01');
    expect(addDays('2000-02-28', 1)).toBe('2000-02-29');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
    expect(addDays('2027-01-01', -1)).toBe('2026-12-31');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(addDays('2026-01-01', 365)).toBe('2027-01-01'); // 2026 has 365 days
    expect(addDays('1999-12-31', 1)).toBe('2000-01-01');
    expect(addMonths('2026-12-15', 1)).toBe('2027-01-15');
    expect(addMonths('2026-03-31', -1)).toBe('2026-02-28');
    expect(addMonths('2026-01-15', -13)).toBe('2024-12-15');
    expect(daysBetween('2024-01-01', '2025-01-01')).toBe(366); // 2024 is a leap year
    expect(daysBetween('2026-03-01', '2026-02-01')).toBe(-28);
  });
});

// Checked against dayjs (a calendar library from npm, in UTC so no clock change interferes), which
// adds months the same way: the month's last day when the month has no such day.
dayjs.extend(utc);
describe('local dates agree with dayjs over four centuries', () => {
  const dateArb = fc
    .date({ min: new Date('1900-01-01T00:00:00Z'), max: new Date('2299-12-31T00:00:00Z'), noInvalidDate: true })
    .map((d) => d.toISOString().slice(0, 10));
  const ref = (date: string) => dayjs.utc(date);

  propTest.prop([dateArb, fc.integer({ min: -4000, max: 4000 })])('adds days', (date, days) => {
    expect(addDays(date, days)).toBe(ref(date).add(days, 'day').format('YYYY-MM-DD'));
  });
  propTest.prop([dateArb, fc.integer({ min: -240, max: 240 })])('adds months, ending on the month end', (date, months) => {
    expect(addMonths(date, months)).toBe(ref(date).add(months, 'month').format('YYYY-MM-DD'));
  });
  propTest.prop([dateArb, dateArb])('counts the days between two dates', (from, to) => {
    expect(daysBetween(from, to)).toBe(ref(to).diff(ref(from), 'day'));
  });
});
