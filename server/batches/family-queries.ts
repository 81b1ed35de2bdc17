import type { EntityManager } from 'typeorm';

/**
 * The batches related to one by splits and blends, nearest first (itself, then its parents and
 * children, then theirs…), within the cellar; at most `limit`.
 * @returns the ids and whether more were related than the limit
 */
export async function familyMemberIds(
  tx: EntityManager,
  cellarId: string,
  batchId: string,
  limit: number,
): Promise<{ ids: string[]; truncated: boolean }> {
  const seen = new Set<string>([batchId]);
  let frontier = [batchId];
  let truncated = false;
  while (frontier.length && !truncated) {
    const links: { id: string }[] = await tx.query(
      `SELECT bp.parent_id AS id FROM batch_parents bp JOIN batches b ON b.id = bp.parent_id
        WHERE bp.child_id = ANY($1::uuid[]) AND b.cellar_id = $2
       UNION
       SELECT bp.child_id AS id FROM batch_parents bp JOIN batches b ON b.id = bp.child_id
        WHERE bp.parent_id = ANY($1::uuid[]) AND b.cellar_id = $2
       ORDER BY id`,
      [frontier, cellarId],
    );
    const next: string[] = [];
    for (const { id } of links) {
      if (seen.has(id)) continue;
      if (seen.size >= limit) {
        truncated = true;
        break;
      }
      seen.add(id);
      next.push(id);
    }
    frontier = next;
  }
  return { ids: [...seen], truncated };
}
