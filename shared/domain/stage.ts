import type { Stage } from '../schemas/batches';
import type { JournalKind } from '../schemas/journal';

/** Racking this many times means the batch has moved on from secondary (common practice). */
export const RACKINGS_FOR_BULK_AGEING = 2;

/** What of a journal entry the stage depends on. */
export interface StageEvent {
  kind: JournalKind;
  /** An addition's category ('stabiliser' matters). */
  category?: string;
}

/** Where the liquid is now. */
export interface BatchContents {
  /** Litres still in vessels. */
  volumeInVesselsL: number;
  /** Bottles still in cases, across its lots. */
  bottlesLeft: number;
}

/** What a split or blended batch carries over from before it began. */
export interface StageInheritance {
  /**
   * Rackings the liquid had before this batch began (a split keeps its parent's count; a blend
   * moves the liquid off its lees, so it counts one more than its most-racked parent).
   */
  rackings: number;
  /** A parent was stabilised after its first racking. */
  stabilised: boolean;
}

export interface StageInput extends BatchContents {
  /** The batch's own entries, oldest first. */
  events: StageEvent[];
  /** 0 rackings and not stabilised for a batch started from a must. */
  inherited?: StageInheritance;
}

const isStabiliser = (e: StageEvent) => e.kind === 'addition' && e.category === 'stabiliser';

/** The stage from rackings and stabilising alone (the liquid is still in vessels). */
function bulkStage(rackings: number, stabilised: boolean): Stage {
  if (rackings >= RACKINGS_FOR_BULK_AGEING || (stabilised && rackings >= 1)) return 'bulk-ageing';
  return rackings >= 1 ? 'secondary' : 'primary';
}

/** 'bottled' or 'finished' once nothing is left in vessels after a bottling, split, blend or emptying; else null. */
function emptiedStage(ended: { bottled: boolean; movedOn: boolean }, contents: BatchContents): Stage | null {
  if (contents.volumeInVesselsL > 0) return null;
  if (ended.bottled && contents.bottlesLeft > 0) return 'bottled';
  return ended.bottled || ended.movedOn ? 'finished' : null;
}

/**
 * The batch's stage, derived from its whole journal: primary until the first racking;
 * secondary after it; bulk ageing after the second racking, or when stabilised after the
 * first (sulfite in a must before pitching, common practice, leaves it in primary); bottled
 * when a bottling left nothing in vessels; finished when nothing is left in vessels or
 * bottles (a vessel poured out counts as the liquid leaving, like a blend). A split or blend
 * carries on from where its parents were.
 */
export function deriveStage(input: StageInput): Stage {
  const ended = {
    bottled: input.events.some((e) => e.kind === 'bottled'),
    movedOn: input.events.some((e) => e.kind === 'split' || e.kind === 'blended' || e.kind === 'emptied'),
  };
  const emptied = emptiedStage(ended, input);
  if (emptied) return emptied;
  let rackings = input.inherited?.rackings ?? 0;
  let stabilised = input.inherited?.stabilised ?? false;
  for (const event of input.events) {
    if (event.kind === 'racked') rackings += 1;
    else if (isStabiliser(event) && rackings >= 1) stabilised = true;
  }
  return bulkStage(rackings, stabilised);
}

/** How far along the liquid is, as rackings: what `bulkStage` needs to go on from a stage. */
const RACKINGS_AT: Record<'primary' | 'secondary' | 'bulk-ageing', number> = { primary: 0, secondary: 1, 'bulk-ageing': RACKINGS_FOR_BULK_AGEING };

/**
 * The stage after one more entry, from the stage before it: the same answer as `deriveStage`
 * over the whole journal, without reading it again. `event` is null when only the contents
 * changed (bottles drawn down).
 */
export function advanceStage(current: Stage, event: StageEvent | null, contents: BatchContents): Stage {
  const ended = {
    // Bottles left in cases mean a bottling happened, even when the stage has moved past it.
    bottled: current === 'bottled' || event?.kind === 'bottled' || contents.bottlesLeft > 0,
    movedOn: current === 'finished' || event?.kind === 'split' || event?.kind === 'blended' || event?.kind === 'emptied',
  };
  const emptied = emptiedStage(ended, contents);
  if (emptied) return emptied;
  // Bottled or finished with liquid in vessels again cannot follow from one entry.
  if (current === 'bottled' || current === 'finished') return current;
  const rackings = RACKINGS_AT[current] + (event?.kind === 'racked' ? 1 : 0);
  const stabilised = current === 'bulk-ageing' || (event !== null && isStabiliser(event) && RACKINGS_AT[current] >= 1);
  return bulkStage(rackings, stabilised);
}
