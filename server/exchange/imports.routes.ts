import { Router, type Request } from 'express';
import type { DataSource } from 'typeorm';
import { importOptionsSchema, previewQuerySchema, readingImportQuerySchema } from '../../shared/schemas/exchange';
import { UnsupportedMediaError } from '../http/errors';
import { cellarHandler } from '../http/handle';
import { MAX_IMPORT_BYTES, UploadTooLargeError } from './csv-upload';
import { importReadings, importVessels, previewImport } from './import.service';

/**
 * The request body itself, streamed: the file is sent as `text/csv` (options in the query
 * string), so a 100,000-row file is read as it arrives, never held whole.
 */
function csvUpload(req: Request): Request {
  if (!req.is(['text/csv', 'text/plain', 'application/octet-stream'])) {
    throw new UnsupportedMediaError('Send the file as text/csv.');
  }
  if (Number(req.get('content-length') ?? 0) > MAX_IMPORT_BYTES) throw new UploadTooLargeError(MAX_IMPORT_BYTES);
  return req;
}

/** /api/cellars/:cellarId/imports — CSV imports (Keepers; the services check). */
export function importRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.post(
    '/preview',
    cellar({ query: previewQuerySchema }, ({ query }, actor, tx, req) => previewImport(actor, tx, query.target, csvUpload(req))),
  );
  router.post(
    '/readings',
    cellar({ query: readingImportQuerySchema }, ({ query }, actor, tx, req) => importReadings(actor, tx, query, csvUpload(req))),
  );
  router.post(
    '/vessels',
    cellar({ query: importOptionsSchema }, ({ query }, actor, tx, req) => importVessels(actor, tx, query, csvUpload(req))),
  );
  return router;
}
