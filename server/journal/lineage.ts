import type { EntityManager } from 'typeorm';

/** What the liquid went through before a split or blend made it a batch of its own. */
export interface InheritedHistory {
  rackings: number;
  stabilised: boolean;
  lastRackedAt: Date | null;
}

const NONE: InheritedHistory = { rackings: 0, stabilised: false, lastRackedAt: null };
// Lineages are a handful of generations; the cap only guards against a corrupted cycle.
const MAX_GENERATIONS = 30;

const later = (a: Date | null, b: Date | null) => (a && b ? (a > b ? a : b) : (a ?? b));

/**
 * The rackings and stabilising a split or blended batch inherits from its parents, counted
 * up to the moment it began. A split carries its parent's history on; a blend moves every
 * parent off its lees into fresh vessels, so it counts one racking more than its most-racked
 * parent and was last racked when it was blended. A batch started from a must inherits nothing.
 */
export async function inheritedHistory(tx: EntityManager, batchId: string, generation = 0): Promise<InheritedHistory> {
  if (generation >= MAX_GENERATIONS) return NONE;
  const parents: { parent_id: string }[] = await tx.query(`SELECT parent_id FROM batch_parents WHERE child_id = $1`, [batchId]);
  if (parents.length === 0) return NONE;
  const [started]: { occurred_at: Date }[] = await tx.query(
    `SELECT occurred_at FROM journal_entries WHERE batch_id = $1 AND kind = 'started' ORDER BY occurred_at LIMIT 1`,
    [batchId],
  );
  const begun = started?.occurred_at ?? new Date();

  const histories: InheritedHistory[] = [];
  for (const { parent_id: parentId } of parents) {
    const [own]: { rackings: number; last_racked_at: Date | null; stabilised: boolean; stabilised_after_racking: boolean }[] = await tx.query(
      `SELECT COUNT(*) FILTER (WHERE kind = 'racked')::int AS rackings,
              MAX(occurred_at) FILTER (WHERE kind = 'racked') AS last_racked_at,
              COALESCE(BOOL_OR(kind = 'addition' AND payload->>'category' = 'stabiliser'), false) AS stabilised,
              COALESCE(BOOL_OR(kind = 'addition' AND payload->>'category' = 'stabiliser'
                AND occurred_at > (SELECT MIN(r.occurred_at) FROM journal_entries r WHERE r.batch_id = $1 AND r.kind = 'racked')), false) AS stabilised_after_racking
         FROM journal_entries WHERE batch_id = $1 AND occurred_at <= $2`,
      [parentId, begun],
    );
    const before = await inheritedHistory(tx, parentId, generation + 1);
    histories.push({
      rackings: own.rackings + before.rackings,
      // Sulfite in a must before its first racking does not count as stabilising (common practice).
      stabilised: own.stabilised_after_racking || (own.stabilised && before.rackings >= 1) || before.stabilised,
      lastRackedAt: later(own.last_racked_at, before.lastRackedAt),
    });
  }
  const stabilised = histories.some((h) => h.stabilised);
  if (parents.length > 1) {
    return { rackings: Math.max(...histories.map((h) => h.rackings)) + 1, stabilised, lastRackedAt: begun };
  }
  return { ...histories[0], stabilised };
}
