import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { AuditPage, auditQuerySchema } from '../../shared/schemas/exchange';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { auditPage, auditPeople } from './audit-queries';
import { entrySummary } from './entry-summary';

type AuditQuery = z.output<typeof auditQuerySchema>;

/** Who changed what, when: Keepers only (it names every member's work). Newest first. */
export async function listAudit(actor: Actor, tx: EntityManager, query: AuditQuery): Promise<AuditPage> {
  requireRole(actor, 'keeper');
  const { page, pageSize, ...filter } = query;
  const cellar = await loadCellar(tx, actor.cellarId);
  const { rows, total } = await auditPage(tx, actor.cellarId, cellar.timeZone, filter, { limit: pageSize, offset: (page - 1) * pageSize });
  return {
    items: rows.map((r) => ({
      id: r.id,
      kind: r.kind,
      action: r.action,
      at: r.at.toISOString(),
      person: r.personId ? { id: r.personId, name: r.personName ?? 'A former member' } : null,
      batch: r.batchId ? { id: r.batchId, name: r.batchName ?? 'A deleted batch' } : null,
      vessel: r.vesselId ? { id: r.vesselId, name: r.vesselName ?? 'A deleted vessel' } : null,
      summary: r.detail ? entrySummary(r.detail) : (r.summary ?? ''),
    })),
    total,
    page,
    pageSize,
    people: await auditPeople(tx, actor.cellarId),
  };
}
