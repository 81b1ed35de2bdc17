import type { EntityManager } from 'typeorm';
import type { ReadingView } from '../../shared/domain/journal';
import { batchReadings } from '../journal/journal-queries';
import { startedAt } from '../journal/lineage-queries';

/**
 * The cellar's rule for splits: a batch split off another is the same must, so its age and its
 * figures follow the must it came from — it keeps its parent's start date, and its gravity and
 * ABV follow the parent's readings up to the moment of the split — while it says since when it
 * has been a batch of its own. A blend is a new must of several parents: it inherits no readings.
 */

// Lineages are a handful of generations; the cap only guards against a corrupted cycle.
const MAX_GENERATIONS = 30;

export interface InheritedReading extends ReadingView {
  /** The batch the reading was taken in, before this batch was split off it. */
  inheritedFrom: { batchId: string; name: string };
}

/** The single parent a split came from, and when it became its own batch; null for a must or a blend. */
export async function splitParent(tx: EntityManager, batchId: string): Promise<{ id: string; name: string; at: Date } | null> {
  const parents: { id: string; name: string }[] = await tx.query(
    `SELECT b.id, b.name FROM batch_parents bp JOIN batches b ON b.id = bp.parent_id WHERE bp.child_id = $1`,
    [batchId],
  );
  if (parents.length !== 1) return null;
  const at = await ownSince(tx, batchId);
  return at ? { ...parents[0]!, at } : null;
}

/** When a split or blend became a batch of its own (its 'started' entry); null for a batch started from a must. */
export async function ownSince(tx: EntityManager, batchId: string): Promise<Date | null> {
  const [parent]: { found: number }[] = await tx.query(`SELECT 1 AS found FROM batch_parents WHERE child_id = $1 LIMIT 1`, [batchId]);
  return parent ? startedAt(tx, batchId) : null;
}

/**
 * The readings a split inherits: its parent's up to the split (and, for a split of a split, the
 * grandparent's before that), oldest first. Empty for a batch started from a must or a blend.
 */
export async function inheritedReadings(tx: EntityManager, batchId: string, generation = 0): Promise<InheritedReading[]> {
  if (generation >= MAX_GENERATIONS) return [];
  const parent = await splitParent(tx, batchId);
  if (!parent) return [];
  const before = await inheritedReadings(tx, parent.id, generation + 1);
  const own = (await batchReadings(tx, parent.id)).filter((r) => new Date(r.at) <= parent.at);
  const from = { batchId: parent.id, name: parent.name };
  return [...before.filter((r) => new Date(r.at) <= parent.at), ...own.map((r) => ({ ...r, inheritedFrom: from }))];
}

/** The latest reading a new split starts with (the batch's cached figures): its parent's latest up to the split, or none. */
export async function readingCachesForSplit(
  tx: EntityManager,
  parentId: string,
  at: Date,
): Promise<{ lastReadingSg: number | null; lastReadingAt: Date | null }> {
  const latest = (await batchReadings(tx, parentId)).filter((r) => new Date(r.at) <= at).at(-1);
  return { lastReadingSg: latest?.correctedSg ?? null, lastReadingAt: latest ? new Date(latest.at) : null };
}
