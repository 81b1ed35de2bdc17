import type { Stage } from '../../schemas/batches';
import type { Condition } from '../../schemas/plans';
import { deriveStage, RACKINGS_FOR_BULK_AGEING, type StageEvent } from '../stage';

/**
 * What the rule engine knows of a batch: its start, its stage now and the journal events that
 * anchor or complete tasks, each on a local date in the cellar's time zone. Amendments are
 * already applied; events come oldest first.
 */
export type FactEvent =
  | { kind: 'racking'; id: string; on: string }
  | { kind: 'reading'; id: string; on: string; sg: number }
  | {
      kind: 'addition';
      id: string;
      on: string;
      category: string;
      name: string;
      /** The take-out date the maker set, if any. */
      removeOn: string | null;
    }
  | { kind: 'removed'; id: string; on: string; additionId: string }
  | { kind: 'topped-up'; id: string; on: string }
  | { kind: 'tasted'; id: string; on: string }
  | { kind: 'bottled'; id: string; on: string };

export interface BatchFacts {
  batchId: string;
  startedOn: string;
  stage: Stage;
  events: FactEvent[];
}

/** A stretch of the batch's life: `to` is the first day it no longer holds (null: it still does). */
export interface Span {
  /** Names the span in task keys: the condition, or the addition it belongs to. */
  ref: string;
  from: string;
  to: string | null;
  /** The addition an oak span belongs to. */
  addition?: Extract<FactEvent, { kind: 'addition' }>;
}

const STAGE_RANK: Record<Stage, number> = { primary: 0, secondary: 1, 'bulk-ageing': 2, bottled: 3, finished: 4 };

const asStageEvent = (e: FactEvent): StageEvent =>
  e.kind === 'racking' ? { kind: 'racked' } : e.kind === 'addition' ? { kind: 'addition', category: e.category } : { kind: 'note' };

/**
 * Rackings a split or blend carried from its parents: the fewest that bring its own entries to
 * the stage it is in now. A batch started from a must carries none, and neither is assumed of
 * one bottled or finished (its stage no longer says how far along it was).
 */
function inheritedRackings(facts: BatchFacts): number {
  if (STAGE_RANK[facts.stage] >= STAGE_RANK.bottled) return 0;
  const events = facts.events.map(asStageEvent);
  for (let rackings = 0; rackings < RACKINGS_FOR_BULK_AGEING; rackings += 1) {
    const reached = deriveStage({ events, inherited: { rackings, stabilised: false }, volumeInVesselsL: 1, bottlesLeft: 0 });
    if (STAGE_RANK[reached] >= STAGE_RANK[facts.stage]) return rackings;
  }
  return RACKINGS_FOR_BULK_AGEING;
}

/** When the batch reached each stage, from its own events (stage rules of shared/domain/stage). */
export function stageStarts(facts: BatchFacts): Partial<Record<Stage, string>> {
  const starts: Partial<Record<Stage, string>> = { primary: facts.startedOn };
  let rackings = inheritedRackings(facts);
  if (rackings >= 1) starts.secondary = facts.startedOn;
  if (rackings >= RACKINGS_FOR_BULK_AGEING) starts['bulk-ageing'] = facts.startedOn;
  let stabilised = false;
  for (const e of facts.events) {
    if (e.kind === 'racking') rackings += 1;
    else if (e.kind === 'addition' && e.category === 'stabiliser' && rackings >= 1) stabilised = true;
    else if (e.kind === 'bottled' && STAGE_RANK[facts.stage] >= STAGE_RANK.bottled) starts.bottled = e.on;
    if (rackings >= 1) starts.secondary ??= e.on;
    if (rackings >= RACKINGS_FOR_BULK_AGEING || (stabilised && rackings >= 1)) starts['bulk-ageing'] ??= e.on;
  }
  return starts;
}

/** The first day the batch is no longer in vessels, or null while it is. */
export function vesselsEnd(facts: BatchFacts, starts: Partial<Record<Stage, string>> = stageStarts(facts)): string | null {
  if (STAGE_RANK[facts.stage] < STAGE_RANK.bottled) return null;
  return starts.bottled ?? facts.events.at(-1)?.on ?? facts.startedOn;
}

const earliest = (a: string | null | undefined, b: string | null | undefined): string | null => (a && b ? (a < b ? a : b) : (a ?? b ?? null));

/** The spans in which a condition holds (one per oak addition for `oak-in`). */
export function conditionSpans(facts: BatchFacts, condition: Condition): Span[] {
  const starts = stageStarts(facts);
  const end = vesselsEnd(facts, starts);
  /** A span that ends on or before the day it begins holds no day at all. */
  const span = (ref: string, from: string, to: string | null): Span[] => (to !== null && to <= from ? [] : [{ ref, from, to }]);
  const stageSpan = (stage: 'primary' | 'secondary' | 'bulk-ageing', next: string | null | undefined): Span[] => {
    const from = starts[stage];
    return from ? span(stage, from, earliest(next, end)) : [];
  };
  switch (condition) {
    case 'primary':
      return stageSpan('primary', starts.secondary);
    case 'secondary':
      return stageSpan('secondary', starts['bulk-ageing']);
    case 'bulk-ageing':
      return stageSpan('bulk-ageing', null);
    case 'racked':
      return starts.secondary ? span('racked', starts.secondary, end) : [];
    case 'in-vessels':
      return span('in-vessels', facts.startedOn, end);
    case 'oak-in':
      return facts.events.flatMap((e) => {
        if (e.kind !== 'addition' || e.category !== 'oak') return [];
        const removed = facts.events.find((r) => r.kind === 'removed' && r.additionId === e.id)?.on;
        return span(e.id, e.on, earliest(removed, end)).map((s) => ({ ...s, addition: e }));
      });
  }
}
