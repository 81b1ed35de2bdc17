import type { Pool } from 'pg';
import type { EntityManager } from 'typeorm';
import type { BottleCard, ScanResult } from '../../shared/schemas/scan';
import { labelCodeSchema } from '../../shared/schemas/vessels';
import { NotFoundError } from '../http/errors';
import { currentAbv } from '../labels/content';

/**
 * Label codes as printed on QR labels, resolved before any cellar is known: a visitor (a
 * signed-in user, or nobody) is told only what their memberships allow.
 */

/** Where unknown codes and other cellars' codes lead: the same page for both. */
export const NO_SUCH_LABEL = '/no-such-label';

interface CodeTarget {
  kind: 'vessel' | 'case' | 'lot';
  id: string;
  cellarId: string;
  lotId: string | null;
  publicCards: boolean;
  /** Whether the visitor is a member of the code's cellar (false when signed out). */
  member: boolean;
}

/**
 * The vessel, case or lot a (normalised) code belongs to, whatever the cellar, and whether the
 * visitor belongs to that cellar — one statement; null if no such code.
 */
async function findCode(tx: EntityManager, code: string, userId: string | undefined): Promise<CodeTarget | null> {
  const text = `SELECT t.kind, t.id, t.cellar_id AS "cellarId", t.lot_id AS "lotId", c.public_bottle_cards AS "publicCards",
            EXISTS (SELECT 1 FROM memberships m WHERE m.cellar_id = t.cellar_id AND m.user_id = $2) AS member
       FROM (SELECT 'vessel' AS kind, id, cellar_id, NULL::uuid AS lot_id FROM vessels WHERE code = $1
             UNION ALL SELECT 'lot', id, cellar_id, id FROM bottle_lots WHERE code = $1
             UNION ALL SELECT 'case', id, cellar_id, lot_id FROM bottle_cases WHERE code = $1) t
       JOIN cellars c ON c.id = t.cellar_id
      LIMIT 1`;
  const values = [code, userId ?? null];
  // Outside a transaction (every scan), as a named statement on the pool: each connection plans
  // it once, as it does the session read that comes before it (server/http/session-store.ts).
  if (!tx.queryRunner) {
    const pool = (tx.connection.driver as unknown as { master: Pool }).master;
    const { rows } = await pool.query<CodeTarget>({ name: 'cellarwright-code-lookup', text, values });
    return rows[0] ?? null;
  }
  const [row] = await tx.query(text, values);
  return row ?? null;
}

/** The client route that shows a thing: a vessel's page, or the Bottles page on its lot (and, for a case, on that case). */
function clientPath(t: CodeTarget): string {
  if (t.kind === 'vessel') return `/c/${t.cellarId}/vessels/${t.id}`;
  return t.kind === 'case' ? `/c/${t.cellarId}/bottles?case=${t.id}` : `/c/${t.cellarId}/bottles?lot=${t.lotId}`;
}

/**
 * Where a printed label URL (/s/:code) sends this visitor. Members go to the record; a
 * signed-out visitor signs in first; anyone else learns only that there is no such label
 * here — unless the cellar shows public bottle cards and the code is a case or lot.
 * @param userId - the signed-in user, undefined when signed out
 */
export async function scanDestination(tx: EntityManager, userId: string | undefined, rawCode: string): Promise<string> {
  const parsed = labelCodeSchema.safeParse(rawCode);
  if (!parsed.success) return userId ? NO_SUCH_LABEL : `/sign-in?next=/s/${encodeURIComponent(rawCode.slice(0, 16))}`;
  const code = parsed.data;
  const target = await findCode(tx, code, userId);
  const card = target !== null && target.kind !== 'vessel' && target.publicCards;
  if (!userId) return card ? `/card/${code}` : `/sign-in?next=/s/${code}`;
  if (target?.member) return clientPath(target);
  return card ? `/card/${code}` : NO_SUCH_LABEL;
}

/**
 * A code as the Scan page resolves it, for a signed-in member of its cellar.
 * @throws NotFoundError for unknown codes and codes of other cellars alike
 */
export async function resolveCode(tx: EntityManager, userId: string, code: string): Promise<ScanResult> {
  const target = await findCode(tx, code, userId);
  if (!target?.member) throw new NotFoundError('No such label here.');
  return { kind: target.kind, id: target.id, cellarId: target.cellarId, url: clientPath(target) };
}

/**
 * The public bottle card of a case or lot code, only while its cellar shows public cards.
 * Exactly the card's fields, nothing else of the cellar.
 * @throws NotFoundError otherwise (vessel codes, unknown codes, cards off)
 */
export async function bottleCard(tx: EntityManager, code: string): Promise<BottleCard> {
  const [row] = await tx.query(
    `SELECT b.name AS "batchName", b.kind, l.bottled_on::text AS "bottledOn", l.abv_estimate::float8 AS "lotAbv",
            b.og::float8 AS og, b.last_reading_sg::float8 AS "lastSg", l.sulfite_added AS "sulfiteAdded", l.note
       FROM bottle_lots l JOIN batches b ON b.id = l.batch_id JOIN cellars c ON c.id = l.cellar_id
      WHERE c.public_bottle_cards
        AND (l.code = $1 OR l.id = (SELECT lot_id FROM bottle_cases WHERE code = $1))`,
    [code],
  );
  if (!row) throw new NotFoundError('No such bottle card.');
  return {
    batchName: row.batchName,
    kind: row.kind,
    bottledOn: row.bottledOn,
    abvEstimate: row.lotAbv ?? currentAbv(row.og, row.lastSg),
    sulfiteAdded: row.sulfiteAdded,
    note: row.note,
  };
}
