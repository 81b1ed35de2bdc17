import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { labelChoicesQuerySchema, labelPdfQuerySchema, shelfCheckQuerySchema } from '../../shared/schemas/labels';
import { printLabels } from '../labels/print';
import { labelTemplates, templateSummary } from '../labels/templates';
import { handle } from '../middleware/handle';
import { labelChoices } from '../services/label-data.service';
import { checkShelf, shelfContents, shelfDirectory } from '../services/scan.service';
import { cellarContext } from './cellar-context';

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
  router.get('/templates', handle({}, () => [...templates.values()].map(templateSummary)));
  router.get(
    '/pdf',
    handle({ query: labelPdfQuerySchema }, async ({ query }, req, res) => {
      const { pdf, filename, count } = await printLabels(ds, cellarContext(req), query, options.publicUrl);
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
  router.get('/choices', handle({ query: labelChoicesQuerySchema }, ({ query }, req) => labelChoices(ds, cellarContext(req), query.q)));
  router.get('/shelves', handle({}, (_input, req) => shelfDirectory(ds, cellarContext(req))));
  router.get(
    '/shelf/:shelfId/contents',
    handle({ params: shelfParams }, ({ params }, req) => shelfContents(ds, cellarContext(req), params.shelfId)),
  );
  router.get(
    '/shelf/:shelfId/check',
    handle({ params: shelfParams, query: shelfCheckQuerySchema }, ({ params, query }, req) =>
      checkShelf(ds, cellarContext(req), params.shelfId, query.codes),
    ),
  );
  return router;
}
