import { auditPageSchema, type AuditPage, type AuditQuery } from '@shared/schemas/exchange';
import { request } from './http';
import { cellarPath, withQuery } from './paths';

/** One page of the cellar's audit trail (Keepers only), newest first. */
export const fetchAudit = (cellarId: string, query: AuditQuery = {}): Promise<AuditPage> =>
  request('GET', withQuery(cellarPath(cellarId, 'audit'), query), auditPageSchema);
