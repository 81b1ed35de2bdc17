import { describe, expect, it } from 'vitest';
import { planRuleSchema } from '../../../shared/schemas/plans';

describe('plan rules: bad input in words a maker reads', () => {
  const issues = (input: unknown) => planRuleSchema.safeParse(input).error?.issues.map((i) => [i.path.join('.'), i.message]) ?? [];
  const base = { id: 'r', what: 'reading', showDaysAhead: 0 };

  it('refuses a negative count, a zero repeat and anything over ten years', () => {
    expect(issues({ ...base, when: { type: 'after', anchor: 'start', after: { count: -1, unit: 'days' } } })).toEqual([
      ['when.after.count', 'cannot be negative'],
    ]);
    expect(issues({ ...base, when: { type: 'every', every: { count: 0, unit: 'days' }, while: 'primary' } })).toEqual([
      ['when.every.count', 'must be at least 1'],
    ]);
    expect(issues({ ...base, when: { type: 'after', anchor: 'start', after: { count: 121, unit: 'months' } } })).toEqual([
      ['when.after.count', 'at most ten years'],
    ]);
    expect(issues({ ...base, when: { type: 'after', anchor: 'start', after: { count: 120, unit: 'months' } } })).toEqual([]);
  });

  it('refuses an unknown kind of task and a rule that can never fire', () => {
    expect(issues({ ...base, what: 'dance', when: { type: 'after', anchor: 'start', after: { count: 1, unit: 'days' } } })[0]![0]).toBe('what');
    expect(
      issues({ ...base, when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'bulk-ageing' }, until: { stage: 'secondary' } }),
    ).toEqual([['until', 'this rule can never fire: it starts in bulk-ageing, after it would end']]);
    expect(
      issues({ ...base, when: { type: 'after', anchor: 'bottling', after: { count: 1, unit: 'days' } }, until: { event: 'bottling' } })[0]![0],
    ).toBe('until');
  });
});
