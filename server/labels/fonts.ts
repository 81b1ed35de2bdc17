import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** Weights a template field may ask for. */
export type FontWeight = 'regular' | 'medium' | 'semibold' | 'bold';

const WEIGHT_NUMBERS: Record<FontWeight, number> = { regular: 400, medium: 500, semibold: 600, bold: 700 };

/** Work Sans as shipped by @fontsource (latin subset, WOFF, which pdfkit's fontkit reads). */
const FONT_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../node_modules/@fontsource/work-sans/files');

let buffers: Map<FontWeight, Buffer> | undefined;

/** The font files, read once per process; a missing file fails loudly. */
function fontBuffers(): Map<FontWeight, Buffer> {
  buffers ??= new Map(
    (Object.keys(WEIGHT_NUMBERS) as FontWeight[]).map((w) => {
      const file = path.join(FONT_DIR, `work-sans-latin-${WEIGHT_NUMBERS[w]}-normal.woff`);
      return [w, fs.readFileSync(file)];
    }),
  );
  return buffers;
}

/** The name a weight is registered under in a document. */
export const fontName = (weight: FontWeight): string => `WorkSans-${weight}`;

/** Registers every weight of Work Sans with a pdfkit document (embedded, subset). */
export function registerFonts(doc: PDFKit.PDFDocument): void {
  for (const [weight, data] of fontBuffers()) doc.registerFont(fontName(weight), data);
}
