import QRCode from 'qrcode';

/** Modules of light margin around the code, as the QR specification asks. */
export const QUIET_ZONE_MODULES = 4;

/**
 * Draws a QR code as vector rectangles (one per run of dark modules in a row), scaled so
 * that the code plus its quiet zone fills the square `size` (pt) at (x, y).
 * @returns the number of modules across, without the quiet zone
 */
export function drawQr(doc: PDFKit.PDFDocument, text: string, x: number, y: number, size: number): number {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'M' });
  const n = modules.size;
  const unit = size / (n + 2 * QUIET_ZONE_MODULES);
  const left = x + QUIET_ZONE_MODULES * unit;
  const top = y + QUIET_ZONE_MODULES * unit;
  for (let row = 0; row < n; row++) {
    let col = 0;
    while (col < n) {
      if (!modules.data[row * n + col]) {
        col++;
        continue;
      }
      const start = col;
      while (col < n && modules.data[row * n + col]) col++;
      // A hair taller than a module so rows meet without anti-aliasing seams.
      doc.rect(left + start * unit, top + row * unit, (col - start) * unit, unit + (row < n - 1 ? unit * 0.02 : 0));
    }
  }
  doc.fillColor('black').fill();
  return n;
}
