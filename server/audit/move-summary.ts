import type { EntityManager } from 'typeorm';

/** "Moved Tall carboy to Rack A, shelf 2, slot 3" (or off its shelf), for the audit record. */
export async function moveSummary(tx: EntityManager, thingName: string, to: { shelfId: string; slot: number } | null): Promise<string> {
  if (!to) return `Took ${thingName} off its shelf`;
  const [shelf]: { rackName: string; number: number }[] = await tx.query(
    `SELECT r.name AS "rackName", s.number FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE s.id = $1`,
    [to.shelfId],
  );
  return shelf ? `Moved ${thingName} to ${shelf.rackName}, shelf ${shelf.number}, slot ${to.slot}` : `Moved ${thingName}`;
}
