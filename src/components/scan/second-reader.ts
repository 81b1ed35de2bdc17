import { loadSecondReader } from './qr-reader';

/**
 * Reads a QR code with jsQR, the second reader: html5-qrcode's finder misses some sharp,
 * perfectly printed codes (17 of 700 random label codes in a picture; on a camera's clean feed
 * it missed the two such codes tried, for as long as it looked), and jsQR reads them. The
 * picture is first drawn at most `maxSide` pixels long, which keeps a large photo from taking seconds.
 * @returns the code's text, or null when jsQR finds none either
 */
export async function readWithSecondReader(picture: CanvasImageSource, width: number, height: number, maxSide: number): Promise<string | null> {
  const jsQR = await loadSecondReader();
  if (width <= 0 || height <= 0) return null;
  const scale = Math.min(1, maxSide / Math.max(width, height));
  const w = Math.max(1, Math.round(width * scale));
  const h = Math.max(1, Math.round(height * scale));
  const canvas = document.createElement('canvas');
  canvas.width = w;
  canvas.height = h;
  const context = canvas.getContext('2d', { willReadFrequently: true });
  if (!context) return null;
  context.drawImage(picture, 0, 0, w, h);
  return jsQR(context.getImageData(0, 0, w, h).data, w, h)?.data ?? null;
}
