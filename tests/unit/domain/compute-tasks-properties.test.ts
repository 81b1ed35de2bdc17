import { fc, test as propTest } from '@fast-check/vitest';
import { isDeepStrictEqual as isDeepEqual } from 'node:util';
import { describe, expect } from 'vitest';
import type { BatchFacts, FactEvent } from '../../../shared/domain/plans/batch-facts';
import { computeTasks } from '../../../shared/domain/plans/compute-tasks';
import { DEFAULT_PLANS } from '../../../shared/domain/plans/default-plans';
import { planRulesSchema } from '../../../shared/schemas/plans';

const B = '00000000-0000-4000-8000-000000000001';
const facts = (stage: BatchFacts['stage'], events: FactEvent[], startedOn: string): BatchFacts => ({ batchId: B, startedOn, stage, events });

// ---- what a screen or a mail sees does not depend on how far ahead it looks --------------------

/** A day of 2026 (day 0 = 1 January), as an ISO date, without the code under test. */
const dayOf2026 = (n: number) => new Date(Date.UTC(2026, 0, 1 + n)).toISOString().slice(0, 10);

const eventArb: fc.Arbitrary<Omit<FactEvent, 'id' | 'on'> & { day: number }> = fc.oneof(
  {
    arbitrary: fc.record({
      kind: fc.constant('reading' as const),
      day: fc.integer({ min: 0, max: 200 }),
      sg: fc.constantFrom(1.1, 1.05, 1.01, 1.0, 0.999),
    }),
    weight: 4,
  },
  fc.record({ kind: fc.constant('racking' as const), day: fc.integer({ min: 0, max: 200 }) }),
  fc.record({ kind: fc.constant('topped-up' as const), day: fc.integer({ min: 0, max: 200 }) }),
  fc.record({ kind: fc.constant('tasted' as const), day: fc.integer({ min: 0, max: 200 }) }),
  fc.record({
    kind: fc.constant('addition' as const),
    day: fc.integer({ min: 0, max: 200 }),
    category: fc.constantFrom('oak' as const, 'stabiliser' as const, 'fruit' as const),
    name: fc.constant('Oak cubes'),
    removeOn: fc.option(fc.integer({ min: 0, max: 260 }).map(dayOf2026), { nil: null }),
  }),
);

const plans = new Map(DEFAULT_PLANS.map((p) => [p.name, planRulesSchema.parse(p.rules)]));

/** A batch's journal up to a day, oldest first, and that day: often the day of its latest entry (a person logs, then looks). */
const journalArb = fc
  .tuple(fc.array(eventArb, { maxLength: 25 }), fc.option(fc.integer({ min: 0, max: 230 }), { nil: undefined, freq: 2 }))
  .map(([drawn, someDay]) => {
    const todayDay = someDay ?? Math.max(0, ...drawn.map((e) => e.day));
    const today = dayOf2026(todayDay);
    const events: FactEvent[] = drawn
      .filter((e) => e.day <= todayDay)
      .sort((a, b) => a.day - b.day)
      .map(({ day, ...e }, i) => ({ ...e, id: `e${i}`, on: dayOf2026(day) }) as FactEvent);
    // The first oak comes out on its date, when that came before today.
    const oak = events.find((e) => e.kind === 'addition' && e.category === 'oak');
    if (oak && oak.kind === 'addition' && oak.removeOn && oak.removeOn <= today)
      events.push({ kind: 'removed', id: 'out', on: oak.removeOn, additionId: oak.id });
    events.sort((a, b) => (a.on < b.on ? -1 : a.on > b.on ? 1 : 0));
    return { todayDay, today, events };
  });

describe('computeTasks over any journal (default plans)', () => {
  propTest.prop(
    [
      fc.constantFrom(...plans.keys()),
      journalArb,
      // A reminder looks no further than today (0); screens look weeks ahead.
      fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 20 })),
      fc.integer({ min: 1, max: 120 }),
    ],
    { numRuns: 400 },
  )('gives the same tasks up to the shorter horizon, done or open alike', (planName, { todayDay, today, events }, shorter, more) => {
    const plan = plans.get(planName)!;
    const batch = facts('primary', events, dayOf2026(0));
    const repeats = new Set(plan.filter((r) => r.when.type === 'every').map((r) => r.id));
    const near = computeTasks(plan, batch, { today, lookaheadDays: shorter });
    const far = computeTasks(plan, batch, { today, lookaheadDays: shorter + more });
    const nearHorizon = dayOf2026(todayDay + shorter);
    expect(near).toEqual(far.filter((t) => !(repeats.has(t.ruleId) && t.dueOn > nearHorizon)));
  });

  propTest.prop([fc.constantFrom(...plans.keys()), journalArb, fc.integer({ min: 1, max: 40 })], { numRuns: 400 })(
    'keeps every task still ahead under the same key and dates on the following days, when nothing is logged',
    (planName, { todayDay, today, events }, daysLater) => {
      // What people did to a task is stored under its key, so a task must not change key or date by itself.
      const plan = plans.get(planName)!;
      const batch = facts('primary', events, dayOf2026(0));
      const later = dayOf2026(todayDay + daysLater);
      const seen = (day: string) => computeTasks(plan, batch, { today: day, lookaheadDays: 60 });
      const ahead = seen(today).filter((t) => t.dueOn > later && t.dueOn <= dayOf2026(todayDay + 60));
      const then = new Map(seen(later).map((t) => [t.key, t]));
      expect(ahead.filter((t) => !isDeepEqual(then.get(t.key), t)).map((t) => [t.key, t.dueOn, then.get(t.key)?.dueOn ?? 'gone'])).toEqual([]);
    },
  );

  propTest.prop(
    [
      fc.constantFrom(...plans.keys()),
      journalArb,
      fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 20 })),
      fc.integer({ min: 1, max: 120 }),
      fc.array(fc.nat(), { maxLength: 4 }),
    ],
    { numRuns: 400 },
  )(
    'gives the same tasks up to the shorter horizon with some of them marked done by hand',
    (planName, { todayDay, today, events }, shorter, more, picks) => {
      // A mail (today only) and the Tasks screen (weeks ahead) read the same stored states.
      const plan = plans.get(planName)!;
      const batch = facts('primary', events, dayOf2026(0));
      const candidates = computeTasks(plan, batch, { today, lookaheadDays: shorter + more }).map((t) => t.key);
      const doneByHand = new Set(picks.flatMap((n) => (candidates.length ? [candidates[n % candidates.length]!] : [])));
      const repeats = new Set(plan.filter((r) => r.when.type === 'every').map((r) => r.id));
      const near = computeTasks(plan, batch, { today, lookaheadDays: shorter, doneByHand });
      const far = computeTasks(plan, batch, { today, lookaheadDays: shorter + more, doneByHand });
      const nearHorizon = dayOf2026(todayDay + shorter);
      expect(near).toEqual(far.filter((t) => !(repeats.has(t.ruleId) && t.dueOn > nearHorizon)));
    },
  );

  propTest.prop([fc.constantFrom(...plans.keys()), journalArb, fc.nat()], { numRuns: 400 })(
    'leaves no older task of its kind open once a task that shows is marked done by hand',
    (planName, { today, events }, pick) => {
      const plan = plans.get(planName)!;
      const batch = facts('primary', events, dayOf2026(0));
      // Oak work is grouped per addition, which a task does not name: left to the examples.
      const showing = computeTasks(plan, batch, { today, lookaheadDays: 14 }).filter(
        (t) => t.doneByJournal === null && t.showFrom <= today && t.what !== 'oak-check' && t.what !== 'oak-out',
      );
      if (showing.length === 0) return;
      const marked = showing[pick % showing.length]!;
      const tasks = computeTasks(plan, batch, { today, lookaheadDays: 14, doneByHand: new Set([marked.key]) });
      const olderOpen = tasks.filter((t) => t.what === marked.what && t.key !== marked.key && t.doneByJournal === null && t.dueOn <= marked.dueOn);
      expect(olderOpen.map((t) => [t.key, t.dueOn])).toEqual([]);
      expect(tasks.map((t) => t.key)).toContain(marked.key);
    },
  );

  /** The work each kind of entry shows done (the "logging a reading completes that batch's open reading task"). */
  const WORK_DONE_BY: Record<'reading' | 'racking' | 'topped-up' | 'tasted', string[]> = {
    reading: ['reading'],
    racking: ['racking'],
    'topped-up': ['headspace-check'],
    tasted: ['tasting', 'milestone'],
  };

  propTest.prop([fc.constantFrom(...plans.keys()), journalArb, fc.constantFrom(...(Object.keys(WORK_DONE_BY) as (keyof typeof WORK_DONE_BY)[]))], {
    numRuns: 400,
  })('leaves no task of that work open that already shows, once the work is logged today', (planName, { today, events }, kind) => {
    const logged = [...events, { kind, id: 'now', on: today, sg: 1.0 } as FactEvent];
    const tasks = computeTasks(plans.get(planName)!, facts('primary', logged, dayOf2026(0)), { today, lookaheadDays: 14 });
    const stillOpen = tasks.filter((t) => WORK_DONE_BY[kind].includes(t.what) && t.doneByJournal === null && t.showFrom <= today);
    expect(stillOpen.map((t) => [t.key, t.dueOn])).toEqual([]);
  });
});
