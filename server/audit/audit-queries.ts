import type { EntityManager } from 'typeorm';
import type { AuditKind } from '../../shared/schemas/exchange';
import type { JournalPayload } from '../../shared/schemas/journal';
import { JOURNAL_AUDIT_SOURCE } from '../journal/journal-audit';

/**
 * The audit trail read from where each change is recorded: journal entries (author and time
 * on every entry), bottle departures (the same), and `audit_events` for the changes that have
 * no record of their own (vessel cleaning, moves, retiring; imports). One UNION, filtered,
 * counted and paged in SQL.
 */

export interface AuditFilter {
  personId?: string;
  kind?: AuditKind;
  from?: string;
  to?: string;
  batchId?: string;
  vesselId?: string;
}

export interface AuditRow {
  id: string;
  kind: AuditKind;
  action: string;
  at: Date;
  personId: string | null;
  personName: string | null;
  batchId: string | null;
  batchName: string | null;
  vesselId: string | null;
  vesselName: string | null;
  detail: JournalPayload | null;
  summary: string | null;
}

const SOURCES = `
  ${JOURNAL_AUDIT_SOURCE}
  UNION ALL
  SELECT 'departure:' || d.id, 'departure', d.reason::text, d.occurred_at, d.author_id, l.batch_id, NULL::uuid, NULL::jsonb,
         d.count || CASE WHEN d.count = 1 THEN ' bottle' ELSE ' bottles' END || ' from case ' || c.code || ' (lot ' || l.code || ')'
           || CASE WHEN d.note <> '' THEN ': ' || d.note ELSE '' END,
         NULL::text
    FROM bottle_departures d JOIN bottle_cases c ON c.id = d.case_id JOIN bottle_lots l ON l.id = c.lot_id
   WHERE d.cellar_id = $1
  UNION ALL
  SELECT 'event:' || e.id, e.kind::text, e.action::text, e.recorded_at, e.actor_id, e.batch_id, e.vessel_id, NULL::jsonb, e.summary::text, NULL::text
    FROM audit_events e WHERE e.cellar_id = $1`;

function whereOf(filter: AuditFilter, timeZone: string, params: unknown[]): string {
  const add = (value: unknown) => {
    params.push(value);
    return `$${params.length}`;
  };
  const conditions = ['TRUE'];
  if (filter.personId) conditions.push(`a.person_id = ${add(filter.personId)}::uuid`);
  if (filter.kind) conditions.push(`a.kind = ${add(filter.kind)}`);
  if (filter.from) conditions.push(`a.at >= (${add(filter.from)}::date)::timestamp AT TIME ZONE ${add(timeZone)}`);
  if (filter.to) conditions.push(`a.at < (${add(filter.to)}::date + 1)::timestamp AT TIME ZONE ${add(timeZone)}`);
  if (filter.batchId) conditions.push(`a.batch_id = ${add(filter.batchId)}::uuid`);
  if (filter.vesselId) {
    // Two parameters: PostgreSQL types each one once (uuid here, text for the pattern).
    conditions.push(`(a.vessel_id = ${add(filter.vesselId)}::uuid OR a.search LIKE ${add(`%${filter.vesselId}%`)})`);
  }
  return conditions.join(' AND ');
}

/** One page of the cellar's audit trail, newest first, and how many records match. */
export async function auditPage(
  tx: EntityManager,
  cellarId: string,
  timeZone: string,
  filter: AuditFilter,
  page: { limit: number; offset: number },
): Promise<{ rows: AuditRow[]; total: number }> {
  const params: unknown[] = [cellarId];
  const where = whereOf(filter, timeZone, params);
  const [{ total }]: { total: number }[] = await tx.query(`SELECT count(*)::int AS total FROM (${SOURCES}) a WHERE ${where}`, params);
  const rows: AuditRow[] = await tx.query(
    `SELECT a.id, a.kind, a.action, a.at, a.person_id AS "personId", u.display_name AS "personName", a.batch_id AS "batchId",
            b.name AS "batchName", a.vessel_id AS "vesselId", v.name AS "vesselName", a.detail, a.summary
       FROM (${SOURCES}) a
       LEFT JOIN users u ON u.id = a.person_id
       LEFT JOIN batches b ON b.id = a.batch_id
       LEFT JOIN vessels v ON v.id = a.vessel_id
      WHERE ${where}
      ORDER BY a.at DESC, a.id
      LIMIT ${Number(page.limit)} OFFSET ${Number(page.offset)}`,
    params,
  );
  return { rows, total };
}

/** Everyone who has ever been a member, for the person filter: the cellar's members now. */
export function auditPeople(tx: EntityManager, cellarId: string): Promise<{ id: string; name: string }[]> {
  return tx.query(
    `SELECT u.id, u.display_name AS name FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.cellar_id = $1 ORDER BY lower(u.display_name), u.id`,
    [cellarId],
  );
}
