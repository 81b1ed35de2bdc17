import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { labelPdfQuerySchema } from '../../shared/schemas/labels';
import { requireRole, type Actor } from '../core/actor';
import { BadRequestError } from '../http/errors';
import { labelItemsFor } from './label-data.service';
import { labelsPerPage } from './layout';
import { renderLabelsPdf } from './render';
import { labelTemplates } from './templates';

type PdfQuery = z.output<typeof labelPdfQuerySchema>;

/**
 * A label PDF for a selection: checks the template and the skip, gathers the cellar's
 * labels, renders them.
 * @throws BadRequestError for an unknown template or a skip past the first sheet
 */
export async function printLabels(
  actor: Actor,
  tx: EntityManager,
  query: PdfQuery,
  publicUrl: string,
): Promise<{ pdf: Buffer; filename: string; count: number }> {
  requireRole(actor, 'guest');
  const template = labelTemplates().get(query.template);
  if (!template) {
    throw new BadRequestError(`No label template "${query.template}". Choose one of: ${[...labelTemplates().keys()].join(', ')}.`);
  }
  const perPage = labelsPerPage(template);
  if (query.skip >= perPage) {
    throw new BadRequestError(
      perPage === 1
        ? `A roll has no used labels to skip (${template.name}).`
        : `skip: a sheet of ${template.name} has ${perPage} labels; skip at most ${perPage - 1}.`,
    );
  }
  const { template: _t, skip, download: _d, ...selection } = query;
  const items = await labelItemsFor(actor, tx, selection);
  const pdf = await renderLabelsPdf(template, items, { publicUrl, skip, title: `Cellarwright labels · ${template.name}` });
  return { pdf, filename: `cellarwright-labels-${template.id}.pdf`, count: items.length };
}
