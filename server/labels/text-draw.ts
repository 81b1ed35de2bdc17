import type { Measure, FittedText } from './text-fit';

/**
 * Work Sans (latin) has no "≈" glyph. It is measured as "=" and drawn as two small
 * vector tildes in the same space, so "ABV ≈ 12.4 %" prints everywhere without a
 * fallback font.
 */
const APPROX = '≈';

/** Widths at 1 pt by font and text: shaping is the slow part of printing, and texts repeat. */
const widths = new Map<string, number>();
const WIDTH_CACHE_LIMIT = 50_000;

/** A measure (width at 1 pt) in one of the document's registered fonts, memoised per process. */
export function measureWith(doc: PDFKit.PDFDocument, font: string): Measure {
  return (text) => {
    const key = `${font}\u0000${text}`;
    let width = widths.get(key);
    if (width === undefined) {
      doc.font(font).fontSize(1);
      width = doc.widthOfString(text.replaceAll(APPROX, '='));
      if (widths.size >= WIDTH_CACHE_LIMIT) widths.clear();
      widths.set(key, width);
    }
    return width;
  };
}

/** Where a fitted text goes: its box in pt on the page, and how lines align in it. */
export interface DrawTarget {
  x: number;
  y: number;
  w: number;
  align: 'left' | 'center' | 'right';
  font: string;
}

/** Draws fitted lines from the top of the box, each aligned inside the box's width. */
export function drawFitted(doc: PDFKit.PDFDocument, fitted: FittedText, target: DrawTarget): void {
  doc.font(target.font).fontSize(fitted.size).fillColor('black');
  fitted.lines.forEach((line, i) => {
    const width = fitted.widths[i]!;
    const offset = target.align === 'center' ? (target.w - width) / 2 : target.align === 'right' ? target.w - width : 0;
    drawLine(doc, line, target.x + offset, target.y + i * fitted.lineHeight, fitted.size);
  });
}

/** One line at (x, y = top of the line), with "≈" drawn by hand. */
function drawLine(doc: PDFKit.PDFDocument, line: string, x: number, y: number, size: number): void {
  if (!line.includes(APPROX)) {
    doc.text(line, x, y, { lineBreak: false });
    return;
  }
  const parts = line.split(APPROX);
  let cx = x;
  parts.forEach((part, i) => {
    if (part) {
      doc.text(part, cx, y, { lineBreak: false });
      cx += doc.widthOfString(part);
    }
    if (i < parts.length - 1) {
      const w = doc.widthOfString('=');
      drawApprox(doc, cx, y, w, size);
      cx += w;
    }
  });
}

/** Two tildes where "=" would sit: its bars are about 0.27 and 0.45 em above the baseline. */
function drawApprox(doc: PDFKit.PDFDocument, x: number, top: number, w: number, size: number): void {
  const font = (doc as unknown as { _font: { ascender: number } })._font;
  const baseline = top + (font.ascender / 1000) * size;
  const a = 0.045 * size;
  const x0 = x + w * 0.08;
  const x1 = x + w * 0.92;
  const span = x1 - x0;
  doc
    .save()
    .lineWidth(0.085 * size)
    .lineCap('round')
    .strokeColor('black');
  for (const lift of [0.26, 0.45]) {
    const yc = baseline - lift * size;
    doc
      .moveTo(x0, yc + a)
      .bezierCurveTo(x0 + span * 0.3, yc - 2.2 * a, x0 + span * 0.7, yc + 2.2 * a, x1, yc - a)
      .stroke();
  }
  doc.restore();
}
