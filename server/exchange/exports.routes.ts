import { Router, type Response } from 'express';
import type { DataSource } from 'typeorm';
import {
  batchExportQuerySchema,
  journalExportQuerySchema,
  lotExportQuerySchema,
  vesselExportQuerySchema,
  type ExportTable,
} from '../../shared/schemas/exchange';
import { cellarHandler } from '../http/handle';
import { exportBatches, exportCases, exportDepartures, exportJournal, exportLots, exportReadings, exportVessels } from './export.service';

/** Headers of a CSV download named after the table and today's date. */
function asCsvDownload(res: Response, table: ExportTable): Response {
  const day = new Date().toISOString().slice(0, 10);
  res.setHeader('content-type', 'text/csv; charset=utf-8');
  res.setHeader('content-disposition', `attachment; filename="cellarwright-${table}-${day}.csv"`);
  res.setHeader('cache-control', 'no-store');
  return res;
}

/** /api/cellars/:cellarId/exports/<table> — CSV files; any member may download them. */
export function exportRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/batches',
    cellar({ query: batchExportQuerySchema }, ({ query }, actor, tx, _req, res) => exportBatches(actor, tx, query, asCsvDownload(res, 'batches'))),
  );
  router.get(
    '/vessels',
    cellar({ query: vesselExportQuerySchema }, ({ query }, actor, tx, _req, res) => exportVessels(actor, tx, query, asCsvDownload(res, 'vessels'))),
  );
  router.get(
    '/lots',
    cellar({ query: lotExportQuerySchema }, ({ query }, actor, tx, _req, res) => exportLots(actor, tx, query, asCsvDownload(res, 'lots'))),
  );
  router.get(
    '/cases',
    cellar({ query: lotExportQuerySchema }, ({ query }, actor, tx, _req, res) => exportCases(actor, tx, query, asCsvDownload(res, 'cases'))),
  );
  router.get(
    '/departures',
    cellar({ query: lotExportQuerySchema }, ({ query }, actor, tx, _req, res) =>
      exportDepartures(actor, tx, query, asCsvDownload(res, 'departures')),
    ),
  );
  router.get(
    '/journal',
    cellar({ query: journalExportQuerySchema }, ({ query }, actor, tx, _req, res) => exportJournal(actor, tx, query, asCsvDownload(res, 'journal'))),
  );
  router.get(
    '/readings',
    cellar({ query: journalExportQuerySchema }, ({ query }, actor, tx, _req, res) =>
      exportReadings(actor, tx, query, asCsvDownload(res, 'readings')),
    ),
  );
  return router;
}
