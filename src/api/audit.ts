import { auditPageSchema, type AuditPage, type AuditQuery } from '@shared/schemas/exchange';
import { request, cellarPath, withQuery } from './http';

/** One page of the cellar's audit trail (Keepers only), newest first. */
export const fetchAudit = (cellarId: string, query: AuditQuery = {}): Promise<AuditPage> =>
  request('GET', withQuery(cellarPath(cellarId, 'audit'), query), auditPageSchema);
