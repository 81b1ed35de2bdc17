import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { auditQuerySchema } from '../../shared/schemas/exchange';
import { cellarHandler } from '../http/handle';
import { listAudit } from './audit.service';

/** /api/cellars/:cellarId/audit — the audit trail (the service lets only Keepers read it). */
export function auditRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({ query: auditQuerySchema }, ({ query }, actor, tx) => listAudit(actor, tx, query)),
  );
  return router;
}
