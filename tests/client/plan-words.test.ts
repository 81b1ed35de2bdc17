import { describe, expect, it } from 'vitest';
import type { PlanRule } from '@shared/schemas/plans';
import { ruleWords } from '@/components/tasks/plan-words';

const rule = (when: PlanRule['when'], extra: Partial<PlanRule> = {}): PlanRule =>
  ({ id: 'r1', what: 'reading', title: '', note: '', showDaysAhead: 1, until: null, when, ...extra }) as PlanRule;

describe('a plan rule in a sentence, as Settings lists it', () => {
  it('says one of a unit in the singular, and a repeat of one unit without the number', () => {
    expect(ruleWords(rule({ type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' }))).toMatch(/: every week while /);
    expect(ruleWords(rule({ type: 'every', every: { count: 2, unit: 'weeks' }, while: 'primary' }))).toMatch(/: every 2 weeks while /);
    expect(ruleWords(rule({ type: 'after', after: { count: 1, unit: 'months' }, anchor: 'start' }))).toMatch(/: 1 month after /);
    expect(ruleWords(rule({ type: 'gravity-held', days: 1, while: 'primary' }))).toMatch(/held 1 day while /);
  });

  it('says "on the day of" for nought days after, as the task it makes does', () => {
    expect(ruleWords(rule({ type: 'after', after: { count: 0, unit: 'days' }, anchor: 'start' }))).toMatch(/: on the day of /);
  });
});
