import type { EntityManager } from 'typeorm';
import type { BatchSummary } from '../../shared/schemas/batches';
import { placesOf } from '../places/placement';

type Whereabouts = NonNullable<BatchSummary['whereabouts']>;

/**
 * Where each batch is: the vessels holding it, by name, each with the rack slot it stands in
 * (or none). Two statements for a whole page of batches.
 */
export async function whereaboutsOf(tx: EntityManager, batchIds: string[]): Promise<Map<string, Whereabouts>> {
  if (batchIds.length === 0) return new Map();
  const vessels: { id: string; name: string; batch_id: string }[] = await tx.query(
    `SELECT id, name, batch_id FROM vessels WHERE batch_id = ANY($1::uuid[]) ORDER BY lower(name), id`,
    [batchIds],
  );
  const places = await placesOf(
    tx,
    'vessel',
    vessels.map((v) => v.id),
  );
  const byBatch = new Map<string, Whereabouts>();
  for (const v of vessels) byBatch.set(v.batch_id, [...(byBatch.get(v.batch_id) ?? []), { vesselName: v.name, place: places.get(v.id) ?? null }]);
  return byBatch;
}
