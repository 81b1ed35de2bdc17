import { describe, expect, it } from 'vitest';
import type { FactEvent } from '../../../shared/domain/plans/batch-facts';
import { computeTasks } from '../../../shared/domain/plans/compute-tasks';
import { DEFAULT_PLANS } from '../../../shared/domain/plans/default-plans';
import type { PlanRuleInput } from '../../../shared/schemas/plans';
import { B, after, facts, keysDue, mead, rules } from './plan-test-kit';

describe('the default plans (common practice, pinned so a change is deliberate)', () => {
  const rule = (id: string) => mead.find((r) => r.id === id)!;

  it('racks off primary after 30 days and again 90 days after each racking (common practice, same as "needs racking")', () => {
    expect(rule('rack-off-primary').when).toEqual({ type: 'after', anchor: 'start', after: { count: 30, unit: 'days' } });
    expect(rule('re-rack').when).toEqual({ type: 'after', anchor: 'each-racking', after: { count: 90, unit: 'days' } });
  });

  it('reads weekly in primary, checks headspace 3 days after a racking then monthly, oak every 3 days (common practice)', () => {
    expect(rule('weekly-reading').when).toEqual({ type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' });
    expect(rule('headspace-after-racking').when).toEqual({ type: 'after', anchor: 'each-racking', after: { count: 3, unit: 'days' } });
    expect(rule('headspace-monthly').when).toEqual({ type: 'every', every: { count: 1, unit: 'months' }, while: 'racked' });
    expect(rule('oak-check').when).toEqual({ type: 'every', every: { count: 3, unit: 'days' }, while: 'oak-in' });
  });

  it('marks milestones at 3, 6 and 12 months from the start and 6 and 12 in bottle (common practice)', () => {
    const milestones = mead.filter((r) => r.what === 'milestone').map((r) => [r.id, r.when.type === 'after' ? r.when.after.count : null]);
    expect(milestones).toEqual([
      ['bulk-3-months', 3],
      ['bulk-6-months', 6],
      ['bulk-12-months', 12],
      ['bottle-6-months', 6],
      ['bottle-12-months', 12],
    ]);
  });

  it('says on every rule of every default plan that it is common practice', () => {
    for (const plan of DEFAULT_PLANS) for (const r of plan.rules) expect(r.note).toMatch(/^Common practice: /);
    expect(DEFAULT_PLANS.map((p) => p.name)).toEqual(['Mead', 'Fruit wine', 'Cider']);
  });
});

describe('computeTasks', () => {
  it('gives a new batch its weekly readings, its first racking and its milestones, with stable keys', () => {
    const tasks = computeTasks(mead, facts('primary', []), { today: '2026-03-10', lookaheadDays: 30 });
    expect(keysDue(tasks)).toEqual([
      ['weekly-reading/primary.0', '2026-03-08'],
      ['weekly-reading/primary.1', '2026-03-15'],
      ['weekly-reading/primary.2', '2026-03-22'],
      ['weekly-reading/primary.3', '2026-03-29'],
      ['rack-off-primary/start', '2026-03-31'],
      ['weekly-reading/primary.4', '2026-04-05'],
      ['bulk-3-months/start', '2026-06-01'],
      ['bulk-6-months/start', '2026-09-01'],
      ['stabilise/start', '2027-01-01'],
      ['bottle/start', '2027-03-01'],
      ['bulk-12-months/start', '2027-03-01'],
    ]);
    const racking = tasks.find((t) => t.ruleId === 'rack-off-primary')!;
    expect(racking).toMatchObject({
      what: 'racking',
      title: 'Rack off the lees',
      showFrom: '2026-03-28',
      reason: '30 days after the start (2026-03-01)',
    });
    expect(racking.note).toMatch(/^Common practice/);
    // Computing again gives the same keys and dates.
    expect(keysDue(computeTasks(mead, facts('primary', []), { today: '2026-03-10', lookaheadDays: 30 }))).toEqual(keysDue(tasks));
  });

  it('words a period of one unit in the singular in a task’s reason, and a repeat of one unit without the number', () => {
    const plan = rules(
      { id: 'after-a-month', what: 'milestone', when: after('start', 1, 'months'), showDaysAhead: 0 },
      { id: 'weekly', what: 'reading', when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' }, showDaysAhead: 0 },
    );
    const tasks = computeTasks(plan, facts('primary', []), { today: '2026-03-10', lookaheadDays: 60 });
    expect(tasks.find((t) => t.ruleId === 'after-a-month')!.reason).toBe('1 month after the start (2026-03-01)');
    expect(tasks.find((t) => t.ruleId === 'weekly')!.reason).toMatch(/^every week while /);
  });

  it('marks the open reading task done when a reading is logged in its window', () => {
    const tasks = computeTasks(mead, facts('primary', [{ kind: 'reading', id: 'r1', on: '2026-03-09', sg: 1.05 }]), {
      today: '2026-03-10',
      lookaheadDays: 7,
    });
    expect(tasks.find((t) => t.key.endsWith('weekly-reading/primary.0'))!.doneByJournal).toEqual({ entryId: 'r1', on: '2026-03-09' });
    expect(tasks.find((t) => t.key.endsWith('weekly-reading/primary.1'))!.doneByJournal).toBeNull();
  });

  it('counts a reading logged the day the next reading task shows for that one, and the missed one is then moot', () => {
    // Mead plan (common practice): weekly readings in primary, each shown a day ahead. Started
    // 1 March: due 8 March (missed), then 15 March, shown from 14 March, the day of the reading.
    const logged = facts('primary', [{ kind: 'reading', id: 'r1', on: '2026-03-14', sg: 1.05 }]);
    const readingTasks = (lookaheadDays: number) =>
      computeTasks(mead, logged, { today: '2026-03-14', lookaheadDays })
        .filter((t) => t.ruleId === 'weekly-reading')
        .map((t) => [t.key.slice(B.length + 1), t.dueOn, t.doneByJournal?.entryId ?? 'open']);
    expect(readingTasks(14)).toEqual([
      ['weekly-reading/primary.1', '2026-03-15', 'r1'],
      ['weekly-reading/primary.2', '2026-03-22', 'open'],
    ]);
    // A reminder looks no further than today: the same windows, so nothing is left to remind of.
    expect(readingTasks(0)).toEqual([]);
    expect(readingTasks(1)).toEqual([['weekly-reading/primary.1', '2026-03-15', 'r1']]);
  });

  it('leaves no re-rack open after a racking when two rackings fell on one day', () => {
    // Mead plan (common practice): rack again 90 days after each racking, shown 7 days ahead.
    // Two rackings on 1 January give two re-racks due 1 April; a racking on 25 March does both.
    const twice: FactEvent[] = [
      { kind: 'racking', id: 'rk1', on: '2026-01-01' },
      { kind: 'racking', id: 'rk2', on: '2026-01-01' },
      { kind: 'racking', id: 'rk3', on: '2026-03-25' },
    ];
    const reRacks = computeTasks(mead, facts('secondary', twice, '2025-12-01'), { today: '2026-03-25', lookaheadDays: 14 })
      .filter((t) => t.ruleId === 're-rack')
      .map((t) => [t.key.slice(B.length + 1), t.dueOn, t.doneByJournal?.entryId ?? 'open']);
    expect(reRacks).toEqual([
      ['re-rack/rk2', '2026-04-01', 'rk3'],
      ['re-rack/rk3', '2026-06-23', 'open'],
    ]);
  });

  it('keeps only the latest missed task of a kind open (older ones are moot)', () => {
    const tasks = computeTasks(mead, facts('primary', []), { today: '2026-03-20', lookaheadDays: 3 });
    expect(keysDue(tasks).filter(([k]) => k!.startsWith('weekly-reading'))).toEqual([
      ['weekly-reading/primary.1', '2026-03-15'],
      ['weekly-reading/primary.2', '2026-03-22'],
    ]);
  });

  it('lets the latest task of a kind moot older ones whichever of two rules gave it', () => {
    // Common practice: a headspace check 3 days after each racking, and monthly while racked.
    // Racked 1 April and 21 May: checks due 4 April and 24 May, and monthly 1 May.
    const checks = rules(
      { id: 'after-racking', what: 'headspace-check', when: after('each-racking', 3), showDaysAhead: 0 },
      { id: 'monthly', what: 'headspace-check', when: { type: 'every', every: { count: 1, unit: 'months' }, while: 'racked' }, showDaysAhead: 0 },
    );
    const racked: FactEvent[] = [
      { kind: 'racking', id: 'rk1', on: '2026-04-01' },
      { kind: 'racking', id: 'rk2', on: '2026-05-21' },
    ];
    // On 25 May only the check of 24 May is left open; the missed ones of 4 April and 1 May are moot.
    expect(keysDue(computeTasks(checks, facts('secondary', racked), { today: '2026-05-25', lookaheadDays: 0 }))).toEqual([
      ['after-racking/rk2', '2026-05-24'],
    ]);
  });

  describe('a task marked done by hand', () => {
    // Mead plan (common practice): weekly readings in primary, each shown a day ahead. Started
    // 1 March: due 8 March (missed, nothing logged), 15 March (shown from 14 March), 22 March.
    const nothingLogged = facts('primary', []);
    const readingKeys = (today: string, doneByHand: string[]) =>
      computeTasks(mead, nothingLogged, { today, lookaheadDays: 14, doneByHand: new Set(doneByHand.map((k) => `${B}/${k}`)) })
        .filter((t) => t.ruleId === 'weekly-reading')
        .map((t) => [t.key.slice(B.length + 1), t.dueOn]);

    it('makes an older open task of its kind moot, as a logged reading would', () => {
      expect(readingKeys('2026-03-14', [])).toEqual([
        ['weekly-reading/primary.0', '2026-03-08'],
        ['weekly-reading/primary.1', '2026-03-15'],
        ['weekly-reading/primary.2', '2026-03-22'],
      ]);
      expect(readingKeys('2026-03-14', ['weekly-reading/primary.1'])).toEqual([
        ['weekly-reading/primary.1', '2026-03-15'],
        ['weekly-reading/primary.2', '2026-03-22'],
      ]);
    });

    it('moots nothing while it does not show yet, so a reminder that looks no further than today agrees', () => {
      // 22 March shows from 21 March: marked done on 14 March, the missed 8 March stays open.
      expect(readingKeys('2026-03-14', ['weekly-reading/primary.2'])).toEqual([
        ['weekly-reading/primary.0', '2026-03-08'],
        ['weekly-reading/primary.1', '2026-03-15'],
        ['weekly-reading/primary.2', '2026-03-22'],
      ]);
    });

    it('stays in the answer after a later one fell due, as one done by the journal does', () => {
      // On 20 March the 15 March task has fallen due; 8 March, marked done, is still history to show.
      // Fourteen days ahead of 20 March reach 29 March.
      expect(readingKeys('2026-03-20', ['weekly-reading/primary.0'])).toEqual([
        ['weekly-reading/primary.0', '2026-03-08'],
        ['weekly-reading/primary.1', '2026-03-15'],
        ['weekly-reading/primary.2', '2026-03-22'],
        ['weekly-reading/primary.3', '2026-03-29'],
      ]);
      expect(readingKeys('2026-03-20', [])).toEqual([
        ['weekly-reading/primary.1', '2026-03-15'],
        ['weekly-reading/primary.2', '2026-03-22'],
        ['weekly-reading/primary.3', '2026-03-29'],
      ]);
    });
  });

  it('completes the racking task with a racking, which anchors a headspace check 3 days on and a re-rack 90 days on', () => {
    const events: FactEvent[] = [{ kind: 'racking', id: 'rk1', on: '2026-04-02' }];
    const tasks = computeTasks(mead, facts('secondary', events), { today: '2026-04-03', lookaheadDays: 30 });
    expect(tasks.find((t) => t.ruleId === 'rack-off-primary')!.doneByJournal).toEqual({ entryId: 'rk1', on: '2026-04-02' });
    expect(keysDue(tasks.filter((t) => t.what === 'headspace-check' || t.ruleId === 're-rack'))).toEqual([
      ['headspace-after-racking/rk1', '2026-04-05'],
      ['headspace-monthly/racked.0', '2026-05-02'],
      ['re-rack/rk1', '2026-07-01'],
    ]);
    // Primary ended with the racking: no reading task falls after it.
    expect(tasks.filter((t) => t.ruleId === 'weekly-reading').every((t) => t.dueOn < '2026-04-02')).toBe(true);
  });

  it('counts monthly headspace checks from the racking of a batch stabilised into bulk ageing after one racking', () => {
    // Common practice (shared/domain/stage): a stabiliser after the first racking moves a batch to bulk ageing.
    const events: FactEvent[] = [
      { kind: 'racking', id: 'rk1', on: '2026-04-10' },
      { kind: 'addition', id: 'st1', on: '2026-05-01', category: 'stabiliser', name: 'Sulfite tablets', removeOn: null },
    ];
    // Started 1 March, racked 10 April: the first monthly check falls on 10 May, not on 1 May.
    const tasks = computeTasks(mead, facts('bulk-ageing', events), { today: '2026-05-12', lookaheadDays: 0 });
    expect(keysDue(tasks.filter((t) => t.ruleId === 'headspace-monthly'))).toEqual([['headspace-monthly/racked.0', '2026-05-10']]);
  });

  it('reminds to take an addition out on its take-out date, and a removal completes it', () => {
    const oak: FactEvent = { kind: 'addition', id: 'oak1', on: '2026-05-01', category: 'oak', name: 'Oak cubes', removeOn: '2026-05-15' };
    const racked: FactEvent = { kind: 'racking', id: 'rk1', on: '2026-04-02' };
    const before = computeTasks(mead, facts('secondary', [racked, oak]), { today: '2026-05-10', lookaheadDays: 10 });
    expect(before.find((t) => t.ruleId === 'oak-out')).toMatchObject({
      key: `${B}/oak-out/oak1`,
      title: 'Take out Oak cubes',
      dueOn: '2026-05-15',
      showFrom: '2026-05-13',
      doneByJournal: null,
    });
    // Oak checks every 3 days from 1 May: 4, 7, 10 (today), 13, 16, 19 May; the missed 4th and 7th are moot.
    expect(before.filter((t) => t.ruleId === 'oak-check').map((t) => t.dueOn)).toEqual(['2026-05-10', '2026-05-13', '2026-05-16', '2026-05-19']);

    const removed: FactEvent = { kind: 'removed', id: 'out1', on: '2026-05-12', additionId: 'oak1' };
    const after = computeTasks(mead, facts('secondary', [racked, oak, removed]), { today: '2026-05-12', lookaheadDays: 10 });
    expect(after.find((t) => t.ruleId === 'oak-out')!.doneByJournal).toEqual({ entryId: 'out1', on: '2026-05-12' });
    // With the oak out, no check is left, not even the missed one of 10 May.
    expect(after.filter((t) => t.ruleId === 'oak-check').map((t) => t.dueOn)).toEqual([]);
  });

  it('asks for a racking once the gravity has held within 0.001 for 5 days', () => {
    const readings: FactEvent[] = [
      { kind: 'reading', id: 'a', on: '2026-03-08', sg: 1.02 },
      { kind: 'reading', id: 'b', on: '2026-03-10', sg: 1.0 },
      { kind: 'reading', id: 'c', on: '2026-03-13', sg: 0.999 },
      { kind: 'reading', id: 'd', on: '2026-03-15', sg: 0.999 },
    ];
    const tasks = computeTasks(mead, facts('primary', readings), { today: '2026-03-16', lookaheadDays: 0 });
    expect(keysDue(tasks.filter((t) => t.ruleId === 'rack-when-held'))).toEqual([['rack-when-held/primary.held', '2026-03-15']]);
  });

  it('dates month rules at the month end (31 January + 1 month = 28 February)', () => {
    const monthly = rules({
      id: 'm',
      what: 'milestone',
      when: after('start', 1, 'months'),
      showDaysAhead: 0,
    });
    expect(computeTasks(monthly, facts('primary', [], '2026-01-31'), { today: '2026-02-01', lookaheadDays: 0 })[0]!.dueOn).toBe('2026-02-28');
  });

  it('gives bottle milestones from the bottling date and nothing to a finished batch', () => {
    const events: FactEvent[] = [
      { kind: 'racking', id: 'r1', on: '2026-04-01' },
      { kind: 'racking', id: 'r2', on: '2026-07-01' },
      { kind: 'bottled', id: 'bt', on: '2026-08-31' },
    ];
    const tasks = computeTasks(mead, facts('bottled', events), { today: '2026-09-01', lookaheadDays: 0 });
    // The bulk milestones ended with the bottling: the missed one of 3 months is moot.
    expect(keysDue(tasks.filter((t) => t.what === 'milestone' && !t.doneByJournal))).toEqual([
      ['bottle-6-months/bt', '2027-02-28'],
      ['bottle-12-months/bt', '2027-08-31'],
    ]);
    expect(tasks.some((t) => t.what === 'headspace-check' && t.dueOn > '2026-08-31')).toBe(false);
    expect(computeTasks(mead, facts('finished', events), { today: '2026-09-01', lookaheadDays: 0 })).toEqual([]);
  });
});

describe('task titles', () => {
  const titleOf = (input: PlanRuleInput, events: FactEvent[] = []) =>
    computeTasks(rules(input), facts('secondary', events), { today: '2026-03-01', lookaheadDays: 60 }).map((t) => t.title)[0];
  const afterStart = after('start', 10);
  const oakSpiral: FactEvent = { kind: 'addition', id: 'oak1', on: '2026-03-01', category: 'oak', name: 'Oak spiral', removeOn: '2026-04-01' };

  it('uses the title a Keeper wrote over the usual words', () => {
    expect(titleOf({ id: 'x', what: 'reading', title: 'Read the big carboy', when: afterStart, showDaysAhead: 0 })).toBe('Read the big carboy');
  });

  it('words each kind of work by the usual label when the rule has no title', () => {
    expect(titleOf({ id: 'x', what: 'reading', when: afterStart, showDaysAhead: 0 })).toBe('Take a reading');
    expect(titleOf({ id: 'x', what: 'oak-check', when: afterStart, showDaysAhead: 0 })).toBe('Check the oak');
    // Counting from an addition does not put its name into other work's words.
    expect(titleOf({ id: 'x', what: 'tasting', when: after('addition-in', 7), showDaysAhead: 0 }, [oakSpiral])).toBe('Taste');
  });

  it('names the addition a take-out or a check is about, and says "the oak" when none is named', () => {
    expect(titleOf({ id: 'x', what: 'oak-out', when: afterStart, showDaysAhead: 0 })).toBe('Take the oak out');
    expect(titleOf({ id: 'x', what: 'oak-out', when: after('take-out-date', 0), showDaysAhead: 0 }, [oakSpiral])).toBe('Take out Oak spiral');
    expect(
      titleOf({ id: 'x', what: 'oak-check', when: { type: 'every', every: { count: 3, unit: 'days' }, while: 'oak-in' }, showDaysAhead: 0 }, [
        oakSpiral,
      ]),
    ).toBe('Check Oak spiral');
  });
});

describe('the order of the answer', () => {
  it('puts the soonest first and, on one day, orders by key whatever the order of the rules', () => {
    const milestone = (id: string, days: number): PlanRuleInput => ({
      id,
      what: 'milestone',
      when: after('start', days),
      showDaysAhead: 0,
    });
    const plan = rules(milestone('a-late', 20), milestone('m-tie', 10), milestone('b-tie', 10), milestone('z-early', 5));
    expect(keysDue(computeTasks(plan, facts('primary', []), { today: '2026-03-01', lookaheadDays: 0 }))).toEqual([
      ['z-early/start', '2026-03-06'],
      ['b-tie/start', '2026-03-11'],
      ['m-tie/start', '2026-03-11'],
      ['a-late/start', '2026-03-21'],
    ]);
  });
});
