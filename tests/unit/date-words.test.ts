import dayjs from 'dayjs';
import { describe, expect, it } from 'vitest';
import { dayMonthYear } from '../../shared/date-words';

describe('a calendar date in words', () => {
  // dayjs's English "D MMM YYYY" is the reference: a day without a leading zero, the month's three letters.
  const days = ['2026-01-01', '2026-02-28', '2026-03-14', '2024-02-29', '2026-09-05', '2026-12-31'];
  it.each(days)('writes %s as dayjs does', (iso) => {
    expect(dayMonthYear(iso)).toBe(dayjs(iso).format('D MMM YYYY'));
  });

  it('reads the day of a timestamp without moving it to another zone', () => {
    expect(dayMonthYear('2026-03-14T23:30:00Z')).toBe('14 Mar 2026');
  });

  it('gives back what is not a date as it was given', () => {
    expect(dayMonthYear('soon')).toBe('soon');
    expect(dayMonthYear('2026-13-01')).toBe('2026-13-01');
  });
});
