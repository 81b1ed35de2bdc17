import { z } from 'zod';
import {
  labelChoicesSchema,
  labelTemplateSummarySchema,
  shelfCheckSchema,
  shelfContentsSchema,
  shelfDirectorySchema,
  type LabelChoices,
  type LabelTemplateSummary,
  type ShelfCheck,
  type ShelfContents,
  type ShelfDirectory,
} from '@shared/schemas/labels';
import { ApiError, offlineError, request, cellarPath, withQuery } from './http';

/** What to print, as the PDF endpoint takes it. */
export interface LabelPrintRequest {
  template: string;
  vessels?: string[];
  cases?: string[];
  lots?: string[];
  shelf?: string | null;
  lotCases?: string | null;
  batch?: string | null;
  skip?: number;
  download?: boolean;
}

export const fetchLabelTemplates = (cellarId: string): Promise<LabelTemplateSummary[]> =>
  request('GET', cellarPath(cellarId, 'labels', 'templates'), z.array(labelTemplateSummarySchema));

/** The PDF's address (for the preview frame, download and print). */
export function labelPdfUrl(cellarId: string, req: LabelPrintRequest): string {
  const params = new URLSearchParams({ template: req.template });
  const lists = { vessels: req.vessels, cases: req.cases, lots: req.lots };
  for (const [key, ids] of Object.entries(lists)) if (ids?.length) params.set(key, ids.join(','));
  for (const key of ['shelf', 'lotCases', 'batch'] as const) if (req[key]) params.set(key, req[key]!);
  if (req.skip) params.set('skip', String(req.skip));
  if (req.download) params.set('download', 'true');
  return `${cellarPath(cellarId, 'labels', 'pdf')}?${params}`;
}

/**
 * Fetches the PDF once: the preview shows this copy (no second rendering for the frame);
 * rejects with the server's message (unknown template, nothing to print…).
 */
export async function fetchLabelPdf(url: string): Promise<{ pdf: Blob; count: number }> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: 'same-origin' });
  } catch {
    throw offlineError();
  }
  if (!res.ok) {
    const body = await res.json().catch(() => ({}));
    throw new ApiError(res.status, body.error ?? 'http_error', body.message ?? `The server answered ${res.status}.`);
  }
  return { pdf: await res.blob(), count: Number(res.headers.get('x-label-count') ?? 0) };
}

/** Vessels, lots with their cases and batches to pick from, matching `q`. */
export const fetchLabelChoices = (cellarId: string, q = ''): Promise<LabelChoices> =>
  request('GET', withQuery(cellarPath(cellarId, 'labels', 'choices'), { q }), labelChoicesSchema);

/** Racks and shelves with how full each shelf is. */
export const fetchShelfDirectory = (cellarId: string): Promise<ShelfDirectory> =>
  request('GET', cellarPath(cellarId, 'labels', 'shelves'), shelfDirectorySchema);

/** What the record says sits on a shelf, with label codes. */
export const fetchShelfContents = (cellarId: string, shelfId: string): Promise<ShelfContents> =>
  request('GET', cellarPath(cellarId, 'labels', 'shelf', shelfId, 'contents'), shelfContentsSchema);

/** Compares the codes scanned on a shelf with the record. */
export const checkShelf = (cellarId: string, shelfId: string, codes: string[]): Promise<ShelfCheck> =>
  request('GET', withQuery(cellarPath(cellarId, 'labels', 'shelf', shelfId, 'check'), { codes: codes.join(',') }), shelfCheckSchema);
