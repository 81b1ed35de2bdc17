import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { labelChoicesQuerySchema, labelPdfQuerySchema, shelfCheckQuerySchema } from '../../shared/schemas/labels';
import { cellarHandler, handle } from '../http/handle';
import { checkShelf, shelfContents, shelfDirectory } from '../scan/shelf-check.service';
import { labelChoices } from './label-data.service';
import { printLabels } from './print.service';
import { labelTemplates, templateSummary } from './templates';

export interface LabelRouteOptions {
  /** Base URL printed into QR codes. */
  publicUrl: string;
}

const shelfParams = z.object({ shelfId: uuidSchema });

/**
 * /api/cellars/:cellarId/labels — templates, label PDFs, and the small read endpoints the
 * Labels page and the shelf check need. Every member may print.
 */
export function labelRoutes(ds: DataSource, options: LabelRouteOptions = { publicUrl: 'http://127.0.0.1:8460' }): Router {
  // Loaded (and validated) when the app is built: a bad template file stops the start.
  const templates = labelTemplates();
  const router = Router({ mergeParams: true });
  const cellar = cellarHandler(ds);
  router.get(
    '/templates',
    handle({}, () => [...templates.values()].map(templateSummary)),
  );
  router.get(
    '/pdf',
    cellar({ query: labelPdfQuerySchema }, async ({ query }, actor, tx, req, res) => {
      const { pdf, filename, count } = await printLabels(actor, tx, query, options.publicUrl);
      res
        .status(200)
        .type('application/pdf')
        .set({
          'Content-Disposition': `${query.download ? 'attachment' : 'inline'}; filename="${filename}"`,
          'Cache-Control': 'private, no-store',
          'X-Label-Count': String(count),
        })
        .send(pdf);
    }),
  );
  router.get(
    '/choices',
    cellar({ query: labelChoicesQuerySchema }, ({ query }, actor, tx) => labelChoices(actor, tx, query.q)),
  );
  router.get(
    '/shelves',
    cellar({}, (_input, actor, tx) => shelfDirectory(actor, tx)),
  );
  router.get(
    '/shelf/:shelfId/contents',
    cellar({ params: shelfParams }, ({ params }, actor, tx) => shelfContents(actor, tx, params.shelfId)),
  );
  router.get(
    '/shelf/:shelfId/check',
    cellar({ params: shelfParams, query: shelfCheckQuerySchema }, ({ params, query }, actor, tx) =>
      checkShelf(actor, tx, params.shelfId, query.codes),
    ),
  );
  return router;
}
