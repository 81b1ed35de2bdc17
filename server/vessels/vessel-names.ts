import type { EntityManager } from 'typeorm';
import { ConflictError } from '../http/errors';

/**
 * Refuses a vessel name the cellar already uses (letter case aside, retired vessels
 * included: a label or a journal line must name one vessel). The database holds the same
 * rule (unique index uq_vessels_cellar_name); this check answers first, in plain words. Takes a per-cellar lock for the
 * rest of the transaction, so two people naming vessels at once are checked one after the
 * other and cannot both win.
 * @param exceptId - the vessel being renamed, which may keep its own name
 */
export async function requireFreeVesselName(tx: EntityManager, cellarId: string, name: string, exceptId?: string): Promise<void> {
  await tx.query(`SELECT pg_advisory_xact_lock(hashtext('vessel-names:' || $1))`, [cellarId]);
  const [taken]: { name: string }[] = await tx.query(
    `SELECT name FROM vessels WHERE cellar_id = $1 AND lower(name) = lower($2) AND ($3::uuid IS NULL OR id <> $3::uuid) LIMIT 1`,
    [cellarId, name, exceptId ?? null],
  );
  if (taken) {
    const message = `This cellar already has a vessel called "${taken.name}". Choose another name.`;
    // The issue puts the message under the form's name field.
    throw new ConflictError(message, { field: 'name', issues: [{ path: 'body.name', message }] });
  }
}
