/**
 * The journal's part of the audit trail: every entry already says who wrote it and when, so
 * the audit reads it here rather than copying it. A SELECT for the audit's UNION, with the
 * columns `server/audit/audit-queries.ts` expects; `$1` is the cellar.
 * `search` lets the audit find entries naming a vessel anywhere in their payload (from, to,
 * vesselId): ids are UUIDs, so a match in the text is a match of the id.
 */
export const JOURNAL_AUDIT_SOURCE = `
  SELECT 'journal:' || j.id AS id, 'journal'::text AS kind, j.kind::text AS action, j.recorded_at AS at, j.author_id AS person_id,
         j.batch_id, NULL::uuid AS vessel_id, j.payload AS detail, NULL::text AS summary, j.payload::text AS search
    FROM journal_entries j WHERE j.cellar_id = $1`;
