import { TASK_WHAT_LABELS, type PlanRule, type TaskWhat } from '../../schemas/plans';
import type { BatchFacts, FactEvent } from './batch-facts';
import { addDays, maxDate } from './local-dates';
import { occurrencesOf, type Occurrence } from './occurrences';

/**
 * The rule engine: a plan's rules and a batch's facts give the batch's dated tasks. Pure and
 * deterministic: the same plan, journal and day always give the same tasks with the same keys,
 * so what people did to a task (stored under its key) finds it again at every computation.
 */

export interface ComputedTask {
  /** `<batch id>/<rule id>/<occurrence>`: the same task however often it is computed. */
  key: string;
  ruleId: string;
  what: TaskWhat;
  title: string;
  dueOn: string;
  /** The day it starts to show (due date minus the rule's days ahead). */
  showFrom: string;
  reason: string;
  note: string;
  /** The journal entry that shows the work was done, or null. */
  doneByJournal: { entryId: string; on: string } | null;
}

/** A task before the moot pass, with what that pass needs. */
interface Candidate extends ComputedTask {
  group: string;
  endsOn: string | null;
  /** A repeat unrolled only to settle what is moot, beyond what the caller asked for. */
  pastHorizon: boolean;
}

/** Repeats due longer ago than this are not computed: no screen shows them, and a later repeat replaces a missed one. */
const HISTORY_DAYS = 31;

export interface ComputeOptions {
  /** The cellar's local date. */
  today: string;
  /** Repeating rules are unrolled this many days past today. */
  lookaheadDays: number;
  /** Keys of tasks people marked done: the work was done, as if the journal showed it. */
  doneByHand?: ReadonlySet<string>;
}

/** Tasks that are done by themselves when this entry appears in the journal. */
function completes(what: TaskWhat, event: FactEvent, occurrence: Occurrence): boolean {
  switch (what) {
    case 'reading':
      return event.kind === 'reading';
    case 'racking':
      return event.kind === 'racking';
    case 'headspace-check':
      return event.kind === 'topped-up';
    case 'oak-out':
      return event.kind === 'removed' && (!occurrence.addition || event.additionId === occurrence.addition.id);
    case 'stabilise':
      return event.kind === 'addition' && event.category === 'stabiliser';
    case 'bottle':
      return event.kind === 'bottled';
    case 'tasting':
    case 'milestone':
      return event.kind === 'tasted';
    case 'oak-check':
    case 'custom':
      return false;
  }
}

function titleOf(rule: PlanRule, occurrence: Occurrence): string {
  if (rule.title) return rule.title;
  const name = occurrence.addition?.name;
  if (rule.what === 'oak-out') return name ? `Take out ${name}` : 'Take the oak out';
  if (rule.what === 'oak-check' && name) return `Check ${name}`;
  return TASK_WHAT_LABELS[rule.what];
}

/**
 * The batch's tasks under these rules, soonest first. A repeating task's window runs until the
 * next one's starts, and the first journal entry of the right kind in its window completes it;
 * an open task is dropped once a later task of the same group (the same kind of work, or the
 * same addition) has fallen due or been done (by the journal, or by hand once it shows), so a
 * missed check never piles up behind the next one nor stays overdue after the work was done,
 * and once its rule has ended (its "until" came, or the batch left its vessels).
 */
export function computeTasks(rules: readonly PlanRule[], facts: BatchFacts, options: ComputeOptions): ComputedTask[] {
  if (facts.stage === 'finished') return [];
  const horizon = addDays(options.today, options.lookaheadDays);
  const historyFrom = addDays(options.today, -HISTORY_DAYS);
  const all: Candidate[] = [];
  for (const rule of rules) {
    // Repeats are unrolled at least until the next one's window has opened, so the windows (and
    // what the journal completes) are the same whatever the lookahead: a reminder mail (none)
    // and the Tasks screen (two weeks) never disagree. Repeats past the horizon count for what is
    // moot, and are left out of the answer.
    const windowHorizon = maxDate(horizon, addDays(options.today, rule.showDaysAhead));
    const occurrences = occurrencesOf(rule, facts, windowHorizon, historyFrom).sort((a, b) => (a.dueOn < b.dueOn ? -1 : a.dueOn > b.dueOn ? 1 : 0));
    occurrences.forEach((occurrence, i) => {
      const showFrom = addDays(occurrence.dueOn, -rule.showDaysAhead);
      // Work on an addition counts from when it went in; other work from when the task shows.
      const opens = occurrence.addition && rule.what === 'oak-out' ? occurrence.addition.on : showFrom;
      const next = occurrences.slice(i + 1).find((o) => o.group === occurrence.group);
      const closes = next ? addDays(next.dueOn, -rule.showDaysAhead) : null;
      const done = facts.events.find((e) => e.on >= opens && (closes === null || e.on < closes) && completes(rule.what, e, occurrence));
      all.push({
        key: `${facts.batchId}/${rule.id}/${occurrence.occurrence}`,
        ruleId: rule.id,
        what: rule.what,
        title: titleOf(rule, occurrence),
        dueOn: occurrence.dueOn,
        showFrom,
        reason: occurrence.reason,
        note: rule.note,
        doneByJournal: done ? { entryId: done.id, on: done.on } : null,
        group: occurrence.group,
        endsOn: occurrence.endsOn,
        pastHorizon: rule.when.type === 'every' && occurrence.dueOn > horizon,
      });
    });
  }
  // Per group, the latest due date up to today and the latest task done (by the journal or by
  // hand): an open task due before the first, or not after the second, is moot (a later one fell
  // due, or the same work was done since; two rackings on one day give two re-racks due the same day).
  // Only a hand-done task that already shows counts: every caller unrolls that far, so a mail
  // and a screen agree (one marked done weeks early moots nothing until it shows).
  const doneByHand = options.doneByHand ?? new Set<string>();
  const isDone = (t: Candidate) => t.doneByJournal !== null || doneByHand.has(t.key);
  const countsDone = (t: Candidate) => t.doneByJournal !== null || (doneByHand.has(t.key) && t.showFrom <= options.today);
  const latestDue = new Map<string, string>();
  const latestDone = new Map<string, string>();
  const keepLatest = (latest: Map<string, string>, t: Candidate) => latest.set(t.group, maxDate(latest.get(t.group) ?? t.dueOn, t.dueOn));
  for (const t of all) {
    if (t.dueOn <= options.today) keepLatest(latestDue, t);
    if (countsDone(t)) keepLatest(latestDone, t);
  }
  const moot = (t: Candidate) => t.dueOn < (latestDue.get(t.group) ?? '') || t.dueOn <= (latestDone.get(t.group) ?? '');
  return all
    .filter((t) => !t.pastHorizon)
    .filter((t) => isDone(t) || (!moot(t) && (t.endsOn === null || t.endsOn > options.today)))
    .map(({ group: _group, endsOn: _endsOn, pastHorizon: _pastHorizon, ...task }) => task)
    .sort((a, b) => (a.dueOn < b.dueOn ? -1 : a.dueOn > b.dueOn ? 1 : a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
}
