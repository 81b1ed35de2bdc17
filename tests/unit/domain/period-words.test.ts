import { describe, expect, it } from 'vitest';
import { daysWords, everyWords, periodWords } from '../../../shared/domain/plans/period-words';

// English number agreement: one of a unit in the singular, any other count in the plural.
describe('plan periods in words', () => {
  it('says one of a unit in the singular and other counts in the plural', () => {
    expect(periodWords({ count: 1, unit: 'weeks' })).toBe('1 week');
    expect(periodWords({ count: 1, unit: 'months' })).toBe('1 month');
    expect(periodWords({ count: 30, unit: 'days' })).toBe('30 days');
    expect(periodWords({ count: 0, unit: 'days' })).toBe('0 days');
    expect(periodWords({ count: 2, unit: 'weeks' })).toBe('2 weeks');
  });

  it('says a repeat of one unit without the number', () => {
    expect(everyWords({ count: 1, unit: 'months' })).toBe('every month');
    expect(everyWords({ count: 1, unit: 'days' })).toBe('every day');
    expect(everyWords({ count: 3, unit: 'months' })).toBe('every 3 months');
  });

  it('counts days', () => {
    expect(daysWords(1)).toBe('1 day');
    expect(daysWords(5)).toBe('5 days');
  });
});
