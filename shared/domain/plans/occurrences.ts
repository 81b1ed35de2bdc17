import { STABLE_TOLERANCE_SG } from '../../calc';
import { CONDITION_LABELS, type Anchor, type PlanRule } from '../../schemas/plans';
import type { Stage } from '../../schemas/batches';
import { conditionSpans, stageStarts, vesselsEnd, type BatchFacts, type FactEvent } from './batch-facts';
import { addPeriod, daysBetween } from './local-dates';
import { daysWords, everyWords, periodWords } from './period-words';

/** One dated occurrence of a rule, before the journal and people have had their say. */
export interface Occurrence {
  /** Unique within the rule: the anchor (and the repeat's number). */
  occurrence: string;
  dueOn: string;
  /** What it counts from, in words. */
  reason: string;
  /** The addition it concerns (oak checks, take-outs). */
  addition?: Extract<FactEvent, { kind: 'addition' }>;
  /** Occurrences in one group replace each other: only the latest due one stays open. */
  group: string;
  /** The first day the rule no longer applies to it (null: it still does); an open task is moot from then on. */
  endsOn: string | null;
}

/** Work on the liquid itself: moot once the batch has left its vessels. */
const VESSEL_WORK = new Set<PlanRule['what']>(['reading', 'racking', 'headspace-check', 'oak-check', 'oak-out', 'stabilise', 'bottle']);

const earliest = (...dates: (string | null)[]): string | null => dates.filter((d): d is string => d !== null).sort()[0] ?? null;

type Addition = Extract<FactEvent, { kind: 'addition' }>;

/** Anchors of an "after" rule (its `when.anchor`): the dated moments it counts from. */
function anchorsOf(rule: PlanRule, anchor: Anchor, facts: BatchFacts): { ref: string; on: string; words: string; addition?: Addition }[] {
  const rackings = facts.events.filter((e) => e.kind === 'racking');
  const additions = facts.events.filter((e): e is Addition => e.kind === 'addition');
  // Oak rules follow oak; any other rule follows every addition.
  const concerns = (a: Addition) => !(rule.what === 'oak-check' || rule.what === 'oak-out') || a.category === 'oak' || a.removeOn !== null;
  switch (anchor) {
    case 'start':
      return [{ ref: 'start', on: facts.startedOn, words: `the start (${facts.startedOn})` }];
    case 'first-racking':
      return rackings.slice(0, 1).map((r) => ({ ref: r.id, on: r.on, words: `the first racking (${r.on})` }));
    case 'each-racking':
      return rackings.map((r) => ({ ref: r.id, on: r.on, words: `the racking of ${r.on}` }));
    case 'addition-in':
      return additions.filter(concerns).map((a) => ({ ref: a.id, on: a.on, words: `${a.name} went in (${a.on})`, addition: a }));
    case 'take-out-date':
      return additions
        .filter((a) => a.removeOn !== null && concerns(a))
        .map((a) => ({ ref: a.id, on: a.removeOn!, words: `${a.name}'s take-out date (${a.removeOn})`, addition: a }));
    case 'bottling':
      return facts.events.filter((e) => e.kind === 'bottled').map((b) => ({ ref: b.id, on: b.on, words: `bottling (${b.on})` }));
  }
}

const STAGE_RANK: Record<Stage, number> = { primary: 0, secondary: 1, 'bulk-ageing': 2, bottled: 3, finished: 4 };

/** The first day on or after `from` that the rule's "until" has come (null: not yet). */
export function untilDate(rule: PlanRule, facts: BatchFacts, from: string): string | null {
  const until = rule.until;
  if (!until) return null;
  if ('stage' in until) {
    const starts = stageStarts(facts);
    const reached = (Object.entries(starts) as [Stage, string][])
      .filter(([stage]) => STAGE_RANK[stage] >= STAGE_RANK[until.stage])
      .map(([, on]) => on)
      .sort();
    return reached[0] ?? null;
  }
  const ends = facts.events.filter((e) => {
    if (until.event === 'racking') return e.kind === 'racking';
    if (until.event === 'bottling') return e.kind === 'bottled';
    return e.kind === 'addition' && e.category === 'stabiliser';
  });
  // An anchor that is itself an end event (a racking) does not end its own rule.
  return ends.find((e) => e.on > from || (e.on === from && rule.when.type !== 'after'))?.on ?? null;
}

/** Whether an occurrence due on `dueOn` still belongs to the rule (the rule had not ended). */
const beforeEnd = (dueOn: string, end: string | null) => end === null || dueOn < end;

/**
 * The first date in the span on which the gravity has held within STABLE_TOLERANCE_SG (common
 * practice, shared/calc) for at least `days` days, or null.
 */
export function gravityHeldOn(readings: { on: string; sg: number }[], days: number): string | null {
  for (let j = 1; j < readings.length; j += 1) {
    let low = readings[j]!.sg;
    let high = low;
    for (let i = j - 1; i >= 0; i -= 1) {
      low = Math.min(low, readings[i]!.sg);
      high = Math.max(high, readings[i]!.sg);
      if (high - low > STABLE_TOLERANCE_SG + 1e-9) break;
      if (daysBetween(readings[i]!.on, readings[j]!.on) >= days) return readings[j]!.on;
    }
  }
  return null;
}

/** The repeat number whose due date falls about one period before `from` (0 at the earliest). */
function firstRepeatNear(first: string, every: PlanRule['when'] & { type: 'every' }, from: string): number {
  if (from <= first) return 0;
  const period = every.every;
  if (period.unit === 'months') {
    const months = (Number(from.slice(0, 4)) - Number(first.slice(0, 4))) * 12 + (Number(from.slice(5, 7)) - Number(first.slice(5, 7)));
    return Math.max(0, Math.floor(months / period.count) - 1);
  }
  const step = period.count * (period.unit === 'weeks' ? 7 : 1);
  return Math.max(0, Math.floor(daysBetween(first, from) / step) - 1);
}

/**
 * Every occurrence of one rule for one batch whose due date is on or before `horizon`
 * (an "after" rule's single occurrences are given whatever their date). Repeats due long
 * before `from` are skipped (they are history no screen shows); repeat numbers, and so task
 * keys, still count from the first.
 */
export function occurrencesOf(rule: PlanRule, facts: BatchFacts, horizon: string, from = '0000-01-01'): Occurrence[] {
  const when = rule.when;
  const leftVessels = VESSEL_WORK.has(rule.what) ? vesselsEnd(facts) : null;
  if (when.type === 'after') {
    return anchorsOf(rule, when.anchor, facts).flatMap((anchor) => {
      const dueOn = addPeriod(anchor.on, when.after);
      const endsOn = earliest(untilDate(rule, facts, anchor.on), leftVessels);
      if (!beforeEnd(dueOn, endsOn)) return [];
      const group = anchor.addition ? `${rule.what}:${anchor.addition.id}` : rule.what;
      const amount = when.after.count === 0 ? 'on the day of' : `${periodWords(when.after)} after`;
      return [{ occurrence: anchor.ref, dueOn, reason: `${amount} ${anchor.words}`, addition: anchor.addition, group, endsOn }];
    });
  }
  return conditionSpans(facts, when.while).flatMap((span) => {
    const end = earliest(span.to, untilDate(rule, facts, span.from), leftVessels);
    const group = span.addition ? `${rule.what}:${span.addition.id}` : rule.what;
    if (when.type === 'gravity-held') {
      const readings = facts.events.filter(
        (e): e is Extract<FactEvent, { kind: 'reading' }> => e.kind === 'reading' && e.on >= span.from && beforeEnd(e.on, end),
      );
      const held = gravityHeldOn(readings, when.days);
      if (!held) return [];
      return [
        {
          occurrence: `${span.ref}.held`,
          dueOn: held,
          reason: `the gravity has held for ${daysWords(when.days)}`,
          addition: span.addition,
          group,
          endsOn: end,
        },
      ];
    }
    const out: Occurrence[] = [];
    const first = when.firstAfter ? addPeriod(span.from, when.firstAfter) : addPeriod(span.from, when.every);
    for (let n = firstRepeatNear(first, when, from); ; n += 1) {
      const dueOn = addPeriod(first, when.every, n);
      if (dueOn > horizon || !beforeEnd(dueOn, end) || n > 40_000) break;
      out.push({
        occurrence: `${span.ref}.${n}`,
        dueOn,
        reason: `${everyWords(when.every)} while ${span.addition ? `${span.addition.name} is in` : CONDITION_LABELS[when.while]}`,
        addition: span.addition,
        group,
        endsOn: end,
      });
    }
    return out;
  });
}
