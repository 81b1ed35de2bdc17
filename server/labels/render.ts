import PDFDocument from 'pdfkit';
import { fontName, registerFonts } from './fonts';
import { mm, placeLabels } from './layout';
import { drawQr } from './qr';
import { drawFitted, measureWith } from './text-draw';
import { fitText, type Measure } from './text-fit';
import type { LabelTemplate } from './template-schema';
import type { LabelItem, TextReport } from './types';

export interface RenderOptions {
  /** Base of the printed URLs: the QR encodes `${publicUrl}/s/${code}`. */
  publicUrl: string;
  /** Cells of the first sheet already used. */
  skip?: number;
  /** Document title (shown by PDF viewers). */
  title?: string;
  /** Test hook: called for every text drawn, with its box and fitted lines. */
  onText?: (report: TextReport) => void;
}

/** The URL a label's QR code carries. */
export const labelUrl = (publicUrl: string, code: string): string => `${publicUrl.replace(/\/$/, '')}/s/${code}`;

/**
 * Renders labels onto a template's pages as a PDF: vector QR codes with their quiet zone,
 * Work Sans embedded, every text fitted into its box.
 * @param items - labels in print order; each uses its kind's layout
 */
export function renderLabelsPdf(template: LabelTemplate, items: LabelItem[], options: RenderOptions): Promise<Buffer> {
  const doc = new PDFDocument({
    autoFirstPage: false,
    margin: 0,
    compress: true,
    info: { Title: options.title ?? `Labels (${template.name})`, Creator: 'Cellarwright', Producer: 'Cellarwright' },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  registerFonts(doc);
  const measures = new Map<string, Measure>();
  const measureFor = (font: string) => {
    let m = measures.get(font);
    if (!m) measures.set(font, (m = measureWith(doc, font)));
    return m;
  };

  const size: [number, number] = [mm(template.page.width), mm(template.page.height)];
  let page = -1;
  placeLabels(template, items.length, options.skip ?? 0).forEach((place, i) => {
    while (page < place.page) {
      doc.addPage({ size, margin: 0 });
      page++;
    }
    const item = items[i]!;
    const layout = template.layouts[item.kind];
    drawQr(doc, labelUrl(options.publicUrl, item.code), mm(place.x + layout.qr.x), mm(place.y + layout.qr.y), mm(layout.qr.size));
    for (const spec of layout.fields) {
      const text = item.texts[spec.field];
      if (!text) continue;
      const font = fontName(spec.weight);
      const box = { x: mm(place.x + spec.box.x), y: mm(place.y + spec.box.y), w: mm(spec.box.w), h: mm(spec.box.h) };
      const fitted = fitText(text, box, spec.maxPt, spec.minPt, measureFor(font));
      drawFitted(doc, fitted, { x: box.x, y: box.y, w: box.w, align: spec.align, font });
      options.onText?.({ page, cell: place.cell, field: spec.field, box, ...fitted });
    }
  });
  if (page < 0) doc.addPage({ size, margin: 0 });
  doc.end();
  return done;
}
