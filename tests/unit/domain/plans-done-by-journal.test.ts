import { describe, expect, it } from 'vitest';
import type { FactEvent } from '../../../shared/domain/plans/batch-facts';
import { computeTasks } from '../../../shared/domain/plans/compute-tasks';
import { TASK_WHATS, type TaskWhat } from '../../../shared/schemas/plans';
import { B, after, facts, rules } from './plan-test-kit';

describe('what the journal shows done', () => {
  // One rule due 11 March (10 days after a start on 1 March), shown from 9 March; one entry on 10 March.
  const oneRule = (what: TaskWhat) =>
    rules({
      id: 'w',
      what,
      title: what === 'custom' ? 'Order more corks' : '',
      when: after('start', 10),
      showDaysAhead: 2,
    });
  const on = '2026-03-10';
  const ENTRIES: Record<string, FactEvent> = {
    reading: { kind: 'reading', id: 'e', on, sg: 1.02 },
    racking: { kind: 'racking', id: 'e', on },
    'topping up': { kind: 'topped-up', id: 'e', on },
    'a take-out': { kind: 'removed', id: 'e', on, additionId: 'oak-a' },
    'a stabiliser': { kind: 'addition', id: 'e', on, category: 'stabiliser', name: 'Potassium sorbate', removeOn: null },
    'oak going in': { kind: 'addition', id: 'e', on, category: 'oak', name: 'Oak cubes', removeOn: null },
    'fruit going in': { kind: 'addition', id: 'e', on, category: 'fruit', name: 'Blackcurrants', removeOn: null },
    bottling: { kind: 'bottled', id: 'e', on },
    tasting: { kind: 'tasted', id: 'e', on },
  };
  /** The entries that do each kind of work; checks and custom tasks are closed by hand only. */
  const DONE_BY: Record<TaskWhat, string[]> = {
    reading: ['reading'],
    racking: ['racking'],
    'headspace-check': ['topping up'],
    'oak-check': [],
    'oak-out': ['a take-out'],
    stabilise: ['a stabiliser'],
    bottle: ['bottling'],
    tasting: ['tasting'],
    milestone: ['tasting'],
    custom: [],
  };

  for (const what of TASK_WHATS) {
    it(`closes a ${what} task with ${DONE_BY[what].join(' or ') || 'no entry'}, and with nothing else`, () => {
      const closedBy = Object.entries(ENTRIES)
        .filter(([, entry]) => {
          const task = computeTasks(oneRule(what), facts('primary', [entry]), { today: on, lookaheadDays: 7 }).find((t) => t.ruleId === 'w');
          return task?.doneByJournal?.entryId === 'e';
        })
        .map(([name]) => name);
      expect(closedBy).toEqual(DONE_BY[what]);
    });
  }

  // Two fruit additions, each to be tasted 14 days after it went in, shown a day ahead.
  const tastingAfterEach = rules({
    id: 'taste',
    what: 'tasting',
    when: after('addition-in', 14),
    showDaysAhead: 1,
  });
  const fruit = (id: string, day: string): FactEvent => ({ kind: 'addition', id, on: day, category: 'fruit', name: `Fruit ${id}`, removeOn: null });
  const tastingsDone = (events: FactEvent[], today: string) =>
    computeTasks(tastingAfterEach, facts('secondary', events), { today, lookaheadDays: 0 }).map((t) => [
      t.key.slice(B.length + 1),
      t.dueOn,
      t.doneByJournal?.entryId ?? 'open',
    ]);

  it('counts work after an addition only from when its task shows, not from when the addition went in', () => {
    const added = fruit('a', '2026-03-01');
    const early: FactEvent = { kind: 'tasted', id: 't1', on: '2026-03-05' };
    const shown: FactEvent = { kind: 'tasted', id: 't2', on: '2026-03-14' };
    expect(tastingsDone([added, early], '2026-03-14')).toEqual([['taste/a', '2026-03-15', 'open']]);
    expect(tastingsDone([added, early, shown], '2026-03-14')).toEqual([['taste/a', '2026-03-15', 't2']]);
  });

  it('lets one tasting close the tasks of two additions, each in its own group', () => {
    const events = [fruit('a', '2026-03-01'), fruit('b', '2026-03-03'), { kind: 'tasted', id: 't', on: '2026-03-18' } as FactEvent];
    expect(tastingsDone(events, '2026-03-18')).toEqual([
      ['taste/a', '2026-03-15', 't'],
      ['taste/b', '2026-03-17', 't'],
    ]);
  });

  it('closes a take-out with the removal of that addition only, even one made before the task shows', () => {
    // Common practice: oak comes out on the date the maker set; here 20 March, shown 2 days ahead.
    const takeOut = rules({
      id: 'out',
      what: 'oak-out',
      when: after('take-out-date', 0),
      showDaysAhead: 2,
    });
    const oak = (id: string): FactEvent => ({ kind: 'addition', id, on: '2026-03-01', category: 'oak', name: `Oak ${id}`, removeOn: '2026-03-20' });
    const removed = (additionId: string): FactEvent => ({ kind: 'removed', id: `out-${additionId}`, on: '2026-03-05', additionId });
    const done = computeTasks(takeOut, facts('secondary', [oak('a'), oak('b'), removed('b')]), { today: '2026-03-06', lookaheadDays: 30 });
    expect(done.map((t) => [t.key.slice(B.length + 1), t.doneByJournal?.entryId ?? 'open'])).toEqual([
      ['out/a', 'open'],
      ['out/b', 'out-b'],
    ]);
  });
});
