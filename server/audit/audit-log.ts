import type { EntityManager } from 'typeorm';
import type { Actor } from '../core/actor';

/** What an audit event is about; the journal and bottle departures are read where they are. */
export type AuditEventKind = 'vessel' | 'import';

export interface AuditEvent {
  kind: AuditEventKind;
  /** A short verb phrase: "sanitised", "moved", "imported readings". */
  action: string;
  vesselId?: string;
  batchId?: string;
  /** One line for people: what changed. */
  summary: string;
}

/**
 * Records who changed what, in the change's own transaction (it commits or rolls back with
 * it). For changes the journal does not already hold; the table refuses updates.
 */
export async function recordAudit(tx: EntityManager, actor: Actor, event: AuditEvent): Promise<void> {
  await tx.query(`INSERT INTO audit_events (cellar_id, actor_id, kind, action, vessel_id, batch_id, summary) VALUES ($1, $2, $3, $4, $5, $6, $7)`, [
    actor.cellarId,
    actor.userId,
    event.kind,
    event.action,
    event.vesselId ?? null,
    event.batchId ?? null,
    event.summary.slice(0, 300),
  ]);
}
