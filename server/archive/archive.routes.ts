import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { restoreQuerySchema } from '../../shared/schemas/archive';
import { UnsupportedMediaError } from '../http/errors';
import { cellarHandler } from '../http/handle';
import { exportArchive, restoreCellar } from './archive.service';

/** /api/cellars/:cellarId/archive — download this cellar whole; restore an archive as a new cellar. */
export function archiveRoutes(ds: DataSource): Router {
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/',
    cellar({}, async (_input, actor, tx, _req, res) => {
      const day = new Date().toISOString().slice(0, 10);
      res.setHeader('content-type', 'application/gzip');
      res.setHeader('content-disposition', `attachment; filename="cellarwright-archive-${day}.tar.gz"`);
      res.setHeader('cache-control', 'no-store');
      await exportArchive(actor, tx, res);
    }),
  );
  router.post(
    '/restorations',
    cellar({ query: restoreQuerySchema }, async ({ query }, actor, tx, req, res) => {
      if (!req.is(['application/gzip', 'application/x-gzip', 'application/octet-stream']))
        throw new UnsupportedMediaError('Send the archive as application/gzip.');
      const restored = await restoreCellar(actor, tx, req, { name: query.name });
      res.status(201);
      return restored;
    }),
  );
  return router;
}
