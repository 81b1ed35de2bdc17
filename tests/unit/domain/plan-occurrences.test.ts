import { describe, expect, it } from 'vitest';
import type { BatchFacts, FactEvent } from '../../../shared/domain/plans/batch-facts';
import { gravityHeldOn, occurrencesOf, untilDate } from '../../../shared/domain/plans/occurrences';
import { planRuleSchema, type Condition, type PlanRule, type PlanRuleInput } from '../../../shared/schemas/plans';

/**
 * The dates a single rule gives a batch, before the journal closes any of them: what each
 * anchor counts from, where a rule ends, when the gravity has held, and how far back repeats
 * are unrolled. Expected dates are worked out by hand (or with Python's datetime, as noted).
 */

const B = '00000000-0000-4000-8000-000000000002';
const rule = (input: Partial<PlanRuleInput> & Pick<PlanRuleInput, 'what' | 'when'>): PlanRule =>
  planRuleSchema.parse({ id: 'r', showDaysAhead: 0, ...input });
const facts = (stage: BatchFacts['stage'], events: FactEvent[], startedOn = '2026-03-01'): BatchFacts => ({ batchId: B, startedOn, stage, events });
const after = (anchor: 'start' | 'first-racking' | 'each-racking' | 'addition-in' | 'take-out-date' | 'bottling', count: number) =>
  ({ type: 'after', anchor, after: { count, unit: 'days' } }) as const;
const FAR = '2027-12-31';
/** Each occurrence as [occurrence, due date, reason]. */
const listed = (r: PlanRule, f: BatchFacts, horizon = FAR, from?: string) =>
  occurrencesOf(r, f, horizon, from).map((o) => [o.occurrence, o.dueOn, o.reason]);

const racking = (id: string, on: string): FactEvent => ({ kind: 'racking', id, on });
const addition = (id: string, on: string, category: string, removeOn: string | null = null): FactEvent => ({
  kind: 'addition',
  id,
  on,
  category,
  name: { oak: 'Oak spiral', fruit: 'Blackcurrants', stabiliser: 'Potassium sorbate' }[category] ?? category,
  removeOn,
});

describe('what an "after" rule counts from', () => {
  const tasted: FactEvent = { kind: 'tasted', id: 't0', on: '2026-03-20' };
  const rackedTwice = facts('bulk-ageing', [tasted, racking('rk1', '2026-04-01'), racking('rk2', '2026-05-01')]);

  it('counts from the first racking only, or from each racking', () => {
    expect(listed(rule({ what: 'milestone', when: after('first-racking', 10) }), rackedTwice)).toEqual([
      ['rk1', '2026-04-11', '10 days after the first racking (2026-04-01)'],
    ]);
    expect(listed(rule({ what: 'headspace-check', when: after('each-racking', 3) }), rackedTwice)).toEqual([
      ['rk1', '2026-04-04', '3 days after the racking of 2026-04-01'],
      ['rk2', '2026-05-04', '3 days after the racking of 2026-05-01'],
    ]);
  });

  it('words a count of nothing as "on the day of", and counts from bottling', () => {
    const bottled = facts('bottled', [racking('rk1', '2026-04-01'), racking('rk2', '2026-05-01'), { kind: 'bottled', id: 'bt', on: '2026-06-01' }]);
    expect(listed(rule({ what: 'tasting', when: after('bottling', 0) }), bottled)).toEqual([
      ['bt', '2026-06-01', 'on the day of bottling (2026-06-01)'],
    ]);
  });

  const additions = facts('secondary', [
    racking('rk1', '2026-03-20'),
    addition('oak', '2026-04-01', 'oak'),
    addition('fruit-out', '2026-04-02', 'fruit', '2026-04-20'),
    addition('fruit', '2026-04-03', 'fruit'),
    addition('sorbate', '2026-04-04', 'stabiliser'),
  ]);

  it('follows every addition, but oak work only oak and additions with a take-out date', () => {
    expect(listed(rule({ what: 'tasting', when: after('addition-in', 7) }), additions)).toEqual([
      ['oak', '2026-04-08', '7 days after Oak spiral went in (2026-04-01)'],
      ['fruit-out', '2026-04-09', '7 days after Blackcurrants went in (2026-04-02)'],
      ['fruit', '2026-04-10', '7 days after Blackcurrants went in (2026-04-03)'],
      ['sorbate', '2026-04-11', '7 days after Potassium sorbate went in (2026-04-04)'],
    ]);
    expect(listed(rule({ what: 'oak-check', when: after('addition-in', 7) }), additions).map(([o]) => o)).toEqual(['oak', 'fruit-out']);
    expect(listed(rule({ what: 'oak-out', when: after('addition-in', 7) }), additions).map(([o]) => o)).toEqual(['oak', 'fruit-out']);
  });

  it('counts from a take-out date only where the maker set one', () => {
    expect(listed(rule({ what: 'oak-out', when: after('take-out-date', 0) }), additions)).toEqual([
      ['fruit-out', '2026-04-20', "on the day of Blackcurrants's take-out date (2026-04-20)"],
    ]);
  });

  it('groups the work on an addition by that addition, and other work by its kind', () => {
    const groups = (r: PlanRule) => occurrencesOf(r, additions, FAR).map((o) => o.group);
    expect(groups(rule({ what: 'tasting', when: after('addition-in', 7) }))).toEqual([
      'tasting:oak',
      'tasting:fruit-out',
      'tasting:fruit',
      'tasting:sorbate',
    ]);
    expect(groups(rule({ what: 'milestone', when: after('start', 30) }))).toEqual(['milestone']);
  });
});

describe('where a rule ends', () => {
  const weeklyUntil = (what: PlanRuleInput['what'], condition: Condition, until: PlanRuleInput['until']) =>
    rule({ what, when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: condition }, until });
  const readingsUntil = (until: PlanRuleInput['until'], events: FactEvent[], stage: BatchFacts['stage'] = 'secondary') =>
    occurrencesOf(weeklyUntil('reading', 'in-vessels', until), facts(stage, events), '2026-05-31').map((o) => o.dueOn);

  it('stops a weekly rule at the first racking, bottling or stabiliser after it began', () => {
    // Started 1 March: weekly from 8 March.
    expect(readingsUntil({ event: 'racking' }, [{ kind: 'tasted', id: 't0', on: '2026-03-09' }, racking('rk1', '2026-03-20')])).toEqual([
      '2026-03-08',
      '2026-03-15',
    ]);
    expect(readingsUntil({ event: 'stabilised' }, [racking('rk1', '2026-03-10'), addition('s', '2026-03-23', 'stabiliser')], 'bulk-ageing')).toEqual([
      '2026-03-08',
      '2026-03-15',
      '2026-03-22',
    ]);
    // Fruit is not a stabiliser: the rule runs on to the end of May, 13 Sundays from 8 March.
    expect(readingsUntil({ event: 'stabilised' }, [addition('f', '2026-03-23', 'fruit')], 'primary')).toHaveLength(13);
  });

  it('stops at bottling, even work that is not on the liquid in vessels', () => {
    // A partial bottling leaves the batch in vessels: only the rule's "until" ends a weekly tasting.
    const weeklyTasting = weeklyUntil('tasting', 'in-vessels', { event: 'bottling' });
    const partlyBottled = facts('bulk-ageing', [
      racking('rk1', '2026-03-10'),
      racking('rk2', '2026-03-12'),
      { kind: 'bottled', id: 'bt', on: '2026-03-22' },
    ]);
    expect(occurrencesOf(weeklyTasting, partlyBottled, '2026-05-31').map((o) => o.dueOn)).toEqual(['2026-03-08', '2026-03-15']);
  });

  it('gives an "after" rule nothing once it ended before the task fell due', () => {
    const tasteAMonthIn = rule({ what: 'tasting', when: after('start', 30), until: { event: 'racking' } });
    expect(occurrencesOf(tasteAMonthIn, facts('secondary', [racking('rk1', '2026-03-10')]), FAR)).toEqual([]);
    expect(occurrencesOf(tasteAMonthIn, facts('primary', []), FAR).map((o) => [o.dueOn, o.endsOn])).toEqual([['2026-03-31', null]]);
  });

  it('stops when the batch reaches a stage, whichever way it got there', () => {
    // Common practice: two rackings move a batch on to bulk ageing (shared/domain/stage).
    expect(readingsUntil({ stage: 'bulk-ageing' }, [racking('rk1', '2026-03-10'), racking('rk2', '2026-03-24')], 'bulk-ageing')).toEqual([
      '2026-03-08',
      '2026-03-15',
      '2026-03-22',
    ]);
    expect(readingsUntil({ stage: 'secondary' }, [racking('rk1', '2026-03-10')])).toEqual(['2026-03-08']);
  });

  it('is not ended by the very entry it counts from, but by a later one', () => {
    const tasteAfterStabiliser = rule({ what: 'tasting', when: after('addition-in', 7), until: { event: 'stabilised' } });
    const once = facts('bulk-ageing', [racking('rk1', '2026-03-10'), addition('s1', '2026-03-20', 'stabiliser')]);
    expect(untilDate(tasteAfterStabiliser, once, '2026-03-20')).toBeNull();
    const twice = facts('bulk-ageing', [
      racking('rk1', '2026-03-10'),
      addition('s1', '2026-03-20', 'stabiliser'),
      addition('s2', '2026-03-22', 'stabiliser'),
    ]);
    expect(untilDate(tasteAfterStabiliser, twice, '2026-03-20')).toBe('2026-03-22');
    // A repeating rule is ended by an entry on the day its span begins.
    const weekly = weeklyUntil('reading', 'racked', { event: 'stabilised' });
    expect(untilDate(weekly, twice, '2026-03-20')).toBe('2026-03-20');
    expect(untilDate(weekly, twice, '2026-03-21')).toBe('2026-03-22');
  });

  it('ends when the oak comes out or when the rule\'s "until" comes, whichever is sooner', () => {
    // Oak in on 12 March, a stabiliser on 20 March, the oak out on 10 April: weekly checks until
    // stabilised stop at the stabiliser, although the oak's span runs on to 10 April.
    const oakChecks = weeklyUntil('oak-check', 'oak-in', { event: 'stabilised' });
    const oakOutLate = facts('secondary', [
      racking('rk1', '2026-03-10'),
      addition('oak', '2026-03-12', 'oak'),
      addition('s', '2026-03-20', 'stabiliser'),
      { kind: 'removed', id: 'out', on: '2026-04-10', additionId: 'oak' },
    ]);
    expect(occurrencesOf(oakChecks, oakOutLate, '2026-05-31').map((o) => [o.dueOn, o.endsOn])).toEqual([['2026-03-19', '2026-03-20']]);
  });

  it('gives no task due on the day the rule ends', () => {
    // Weekly readings in primary (common practice); racked on 15 March, the day the second fell due.
    const weekly = rule({ what: 'reading', when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' } });
    expect(occurrencesOf(weekly, facts('secondary', [racking('rk1', '2026-03-15')]), '2026-04-30').map((o) => [o.dueOn, o.endsOn])).toEqual([
      ['2026-03-08', '2026-03-15'],
    ]);
  });
});

describe('the gravity has held', () => {
  // Common practice: the gravity holding within one hydrometer division (0.001) for some days.
  const read = (on: string, sg: number) => ({ on, sg });

  it('counts from the first reading of the run, and holds at a change of exactly 0.001', () => {
    expect(gravityHeldOn([read('2026-03-01', 1.0), read('2026-03-06', 1.0)], 5)).toBe('2026-03-06');
    expect(gravityHeldOn([read('2026-03-01', 1.001), read('2026-03-03', 1.0), read('2026-03-06', 1.0)], 5)).toBe('2026-03-06');
    expect(gravityHeldOn([read('2026-03-01', 1.0), read('2026-03-05', 1.0)], 5)).toBeNull();
  });

  it('does not hold across a change of more than 0.001', () => {
    expect(gravityHeldOn([read('2026-03-01', 1.002), read('2026-03-04', 1.0), read('2026-03-06', 1.0)], 5)).toBeNull();
    expect(gravityHeldOn([read('2026-03-01', 1.002), read('2026-03-04', 1.0), read('2026-03-09', 1.0)], 5)).toBe('2026-03-09');
  });

  it('looks only at readings while the condition holds', () => {
    const heldInSecondary = rule({ what: 'racking', when: { type: 'gravity-held', days: 5, while: 'secondary' } });
    // Steady in primary (1–6 March) does not count; in secondary from 10 March, steady from 11 to 16 March.
    const events: FactEvent[] = [
      { kind: 'reading', id: 'a', on: '2026-03-01', sg: 1.0 },
      { kind: 'reading', id: 'b', on: '2026-03-06', sg: 1.0 },
      racking('rk1', '2026-03-10'),
      { kind: 'reading', id: 'c', on: '2026-03-11', sg: 0.998 },
      { kind: 'reading', id: 'd', on: '2026-03-13', sg: 0.998 },
      { kind: 'reading', id: 'e', on: '2026-03-16', sg: 0.998 },
    ];
    expect(listed(heldInSecondary, facts('secondary', events))).toEqual([['secondary.held', '2026-03-16', 'the gravity has held for 5 days']]);
    expect(listed(heldInSecondary, facts('secondary', events.slice(0, 5)))).toEqual([]);
    // A reading on the racking day is the span's first.
    const fromRackingDay = [...events.slice(0, 3), { kind: 'reading', id: 'r', on: '2026-03-10', sg: 0.998 } as FactEvent, ...events.slice(4, 5)];
    expect(listed(heldInSecondary, facts('secondary', fromRackingDay))).toEqual([]);
    expect(listed(heldInSecondary, facts('secondary', [...fromRackingDay, { kind: 'reading', id: 's', on: '2026-03-15', sg: 0.998 }]))).toEqual([
      ['secondary.held', '2026-03-15', 'the gravity has held for 5 days'],
    ]);
  });
});

describe('repeats over a long life', () => {
  /** Repeat number and due date of each occurrence. */
  const repeats = (r: PlanRule, f: BatchFacts, horizon: string, from: string) =>
    occurrencesOf(r, f, horizon, from).map((o) => [Number(o.occurrence.split('.').at(-1)), o.dueOn] as const);

  /** Numbers run on by one, the first is due within two periods before `from`, and the last is as worked out. */
  function expectWindow(got: (readonly [number, string])[], from: string, earliest: string, last: readonly [number, string]) {
    expect(got.at(-1)).toEqual(last);
    expect(got.every(([n], i) => n === got[0]![0] + i)).toBe(true);
    expect(got[0]![1] <= from && got[0]![1] >= earliest, `first repeat ${got[0]![1]} between ${earliest} and ${from}`).toBe(true);
  }

  it('numbers weekly repeats from the first, unrolling only the last weeks', () => {
    // First due 8 June 2025; 1 March 2026 is 266 days = 38 weeks later (Python's datetime).
    const weekly = rule({ what: 'reading', when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' } });
    expectWindow(repeats(weekly, facts('primary', [], '2025-06-01'), '2026-03-02', '2026-01-29'), '2026-01-29', '2026-01-15', [38, '2026-03-01']);
  });

  it('numbers repeats of some days the same way', () => {
    // Every 10 days from 11 January 2025: 25 February 2026 is 410 days on, repeat 41 (Python's datetime).
    const tenDays = rule({ what: 'headspace-check', when: { type: 'every', every: { count: 10, unit: 'days' }, while: 'in-vessels' } });
    expectWindow(repeats(tenDays, facts('primary', [], '2025-01-01'), '2026-03-01', '2026-01-29'), '2026-01-29', '2026-01-09', [41, '2026-02-25']);
  });

  it('numbers monthly repeats from the first, on its day of the month', () => {
    // Racked 31 January 2024: first due 29 February 2024 (a leap year), then the 29th (or the month's last day).
    // 24 months after it: 28 February 2026.
    const monthly = rule({ what: 'headspace-check', when: { type: 'every', every: { count: 1, unit: 'months' }, while: 'racked' } });
    const racked = facts('secondary', [racking('rk1', '2024-01-31')], '2024-01-01');
    expectWindow(repeats(monthly, racked, '2026-03-01', '2026-01-29'), '2026-01-29', '2025-11-29', [24, '2026-02-28']);
    // Without a history window every repeat is given, from the first.
    expect(repeats(monthly, racked, '2024-05-01', '0000-01-01')).toEqual([
      [0, '2024-02-29'],
      [1, '2024-03-29'],
      [2, '2024-04-29'],
    ]);
  });

  it('unrolls a repeat of several months from about one period before the history window', () => {
    // Racked 15 January 2025, every 2 months: first due 15 March 2025, repeat n on the 15th, 2n months on.
    // Ten calendar months from March 2025 to January 2026: five periods, so repeats from the fourth
    // (15 November 2025, 75 days before 29 January: Python's datetime) up to the fifth (15 January 2026).
    const everyTwoMonths = rule({ what: 'headspace-check', when: { type: 'every', every: { count: 2, unit: 'months' }, while: 'racked' } });
    const racked = facts('bulk-ageing', [racking('rk1', '2025-01-15'), racking('rk2', '2025-01-16')], '2024-12-01');
    expect(repeats(everyTwoMonths, racked, '2026-03-01', '2026-01-29')).toEqual([
      [4, '2025-11-15'],
      [5, '2026-01-15'],
    ]);
  });

  it('names what a repeat is while, in words', () => {
    const oakChecks = rule({ what: 'oak-check', when: { type: 'every', every: { count: 3, unit: 'days' }, while: 'oak-in' } });
    const oakIn = facts('secondary', [racking('rk1', '2026-03-10'), addition('oak', '2026-03-12', 'oak')]);
    expect(listed(oakChecks, oakIn, '2026-03-18')).toEqual([
      ['oak.0', '2026-03-15', 'every 3 days while Oak spiral is in'],
      ['oak.1', '2026-03-18', 'every 3 days while Oak spiral is in'],
    ]);
    expect(occurrencesOf(oakChecks, oakIn, '2026-03-18').map((o) => o.group)).toEqual(['oak-check:oak', 'oak-check:oak']);
  });
});
