import { daysWords, everyWords, periodWords } from '@shared/domain/plans/period-words';
import { ANCHOR_LABELS, CONDITION_LABELS, TASK_WHAT_LABELS, type PlanRule } from '@shared/schemas/plans';

/** A rule in a sentence: "Rack off the lees — 30 days after the start, until secondary; shows 3 days ahead". */
export function ruleWords(rule: PlanRule): string {
  const what = rule.title || TASK_WHAT_LABELS[rule.what];
  const w = rule.when;
  const when =
    w.type === 'after'
      ? `${w.after.count === 0 ? 'on the day of' : `${periodWords(w.after)} after`} ${ANCHOR_LABELS[w.anchor]}`
      : w.type === 'every'
        ? `${everyWords(w.every)} while ${CONDITION_LABELS[w.while]}`
        : `once the gravity has held ${daysWords(w.days)} while ${CONDITION_LABELS[w.while]}`;
  const until = rule.until ? (`stage` in rule.until ? `, until ${rule.until.stage}` : `, until ${rule.until.event}`) : '';
  return `${what}: ${when}${until}`;
}
