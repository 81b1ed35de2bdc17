import { ANCHOR_LABELS, CONDITION_LABELS, TASK_WHAT_LABELS, type PlanRule } from '@shared/schemas/plans';

/** A rule in a sentence: "Rack off the lees — 30 days after the start, until secondary; shows 3 days ahead". */
export function ruleWords(rule: PlanRule): string {
  const what = rule.title || TASK_WHAT_LABELS[rule.what];
  const w = rule.when;
  const when =
    w.type === 'after'
      ? `${w.after.count} ${w.after.unit} after ${ANCHOR_LABELS[w.anchor]}`
      : w.type === 'every'
        ? `every ${w.every.count} ${w.every.unit} while ${CONDITION_LABELS[w.while]}`
        : `once the gravity has held ${w.days} days while ${CONDITION_LABELS[w.while]}`;
  const until = rule.until ? (`stage` in rule.until ? `, until ${rule.until.stage}` : `, until ${rule.until.event}`) : '';
  return `${what}: ${when}${until}`;
}
