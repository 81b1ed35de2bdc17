import type { BatchKind } from '../../schemas/batches';
import type { PlanRuleInput } from '../../schemas/plans';
import { RACK_AGAIN_AFTER_DAYS, RACK_PRIMARY_AFTER_DAYS } from '../racking-due';

/**
 * The plans every cellar starts with, one per family of batch. Every interval here is common
 * practice among makers, not a published rule; each rule's note says so. The racking rules
 * are the ones the Batches list's "needs racking" filter uses (shared/domain/racking-due).
 */

export interface DefaultPlan {
  name: string;
  defaultFor: BatchKind[];
  rules: PlanRuleInput[];
}

const CP = 'Common practice';

/** Rules every default plan shares; `bottleAfterMonths` is when bulk ageing usually ends. */
function commonRules(bulkMilestones: number[], bottleAfterMonths: number): PlanRuleInput[] {
  return [
    {
      id: 'weekly-reading',
      what: 'reading',
      when: { type: 'every', every: { count: 1, unit: 'weeks' }, while: 'primary' },
      showDaysAhead: 1,
      note: `${CP}: a reading a week after pitching, then weekly until the gravity holds.`,
    },
    {
      id: 'rack-when-held',
      what: 'racking',
      when: { type: 'gravity-held', days: 5, while: 'primary' },
      showDaysAhead: 0,
      note: `${CP}: rack off the lees once the gravity has held for several days.`,
    },
    {
      id: 'rack-off-primary',
      what: 'racking',
      when: { type: 'after', anchor: 'start', after: { count: RACK_PRIMARY_AFTER_DAYS, unit: 'days' } },
      until: { stage: 'secondary' },
      showDaysAhead: 3,
      note: `${CP}: rack off the gross lees after about a month in primary.`,
    },
    {
      id: 're-rack',
      what: 'racking',
      when: { type: 'after', anchor: 'each-racking', after: { count: RACK_AGAIN_AFTER_DAYS, unit: 'days' } },
      until: { stage: 'bottled' },
      showDaysAhead: 7,
      note: `${CP}: rack again every few months while it clears; most batches need at least two rackings.`,
    },
    {
      id: 'headspace-after-racking',
      what: 'headspace-check',
      when: { type: 'after', anchor: 'each-racking', after: { count: 3, unit: 'days' } },
      until: { stage: 'bottled' },
      showDaysAhead: 1,
      note: `${CP}: check the headspace a few days after each racking and top up to the neck.`,
    },
    {
      id: 'headspace-monthly',
      what: 'headspace-check',
      when: { type: 'every', every: { count: 1, unit: 'months' }, while: 'racked' },
      showDaysAhead: 2,
      note: `${CP}: check the headspace and airlock monthly while it ages in bulk.`,
    },
    {
      id: 'oak-check',
      what: 'oak-check',
      when: { type: 'every', every: { count: 3, unit: 'days' }, while: 'oak-in' },
      showDaysAhead: 0,
      note: `${CP}: taste every few days while oak is in; it can overwhelm quickly.`,
    },
    {
      id: 'oak-out',
      what: 'oak-out',
      when: { type: 'after', anchor: 'take-out-date', after: { count: 0, unit: 'days' } },
      showDaysAhead: 2,
      note: `${CP}: pull the oak (or anything else) by the date set when it went in.`,
    },
    {
      id: 'stabilise',
      what: 'stabilise',
      when: { type: 'after', anchor: 'start', after: { count: Math.max(2, bottleAfterMonths - 2), unit: 'months' } },
      until: { event: 'stabilised' },
      showDaysAhead: 7,
      note: `${CP}: stabilise before back-sweetening or bottling.`,
    },
    {
      id: 'bottle',
      what: 'bottle',
      when: { type: 'after', anchor: 'start', after: { count: bottleAfterMonths, unit: 'months' } },
      until: { event: 'bottling' },
      showDaysAhead: 14,
      note: `${CP}: bottle once it is clear and stable (check the gravity has held first).`,
    },
    ...bulkMilestones.map(
      (months): PlanRuleInput => ({
        id: `bulk-${months}-months`,
        what: 'milestone',
        title: `Taste it at ${months} months old`,
        when: { type: 'after', anchor: 'start', after: { count: months, unit: 'months' } },
        until: { stage: 'bottled' },
        showDaysAhead: 0,
        note: `${CP}: taste at each ageing milestone and note how it changes.`,
      }),
    ),
    ...[6, 12].map(
      (months): PlanRuleInput => ({
        id: `bottle-${months}-months`,
        what: 'milestone',
        title: `Open one at ${months} months in bottle`,
        when: { type: 'after', anchor: 'bottling', after: { count: months, unit: 'months' } },
        showDaysAhead: 0,
        note: `${CP}: open a bottle at each milestone in bottle.`,
      }),
    ),
  ];
}

export const DEFAULT_PLANS: readonly DefaultPlan[] = [
  {
    name: 'Mead',
    defaultFor: ['traditional-mead', 'melomel', 'metheglin', 'cyser', 'pyment', 'braggot', 'bochet', 'other'],
    rules: commonRules([3, 6, 12], 12),
  },
  { name: 'Fruit wine', defaultFor: ['fruit-wine'], rules: commonRules([3, 6, 12], 9) },
  { name: 'Cider', defaultFor: ['cider', 'perry'], rules: commonRules([3, 6], 4) },
];
