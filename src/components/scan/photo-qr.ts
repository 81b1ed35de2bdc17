import { loadQrReader, loadSecondReader } from './qr-reader';

/** Longest side, in pixels, a photo is drawn at for the second reader: a phone's 12 MP photo would take seconds. */
const SECOND_LOOK_MAX_SIDE = 1600;

/**
 * Reads the QR code in a photo, in the browser (nothing is uploaded). html5-qrcode reads it
 * first; when it finds nothing, jsQR looks again. html5-qrcode's finder misses some sharp,
 * perfectly printed codes (17 of 700 random label codes when measured), and a screenshot of a
 * label sheet is exactly such a picture.
 * @param workId - the id of an element html5-qrcode may draw into (it stays hidden)
 * @returns the text the code holds
 */
export async function readQrInPhoto(file: File, workId: string): Promise<string> {
  const { Html5Qrcode } = await loadQrReader();
  const decoder = new Html5Qrcode(workId, false);
  try {
    return await decoder.scanFile(file, false);
  } catch (firstMiss) {
    const text = await secondLook(file);
    if (text === null) throw firstMiss;
    return text;
  } finally {
    decoder.clear();
  }
}

async function secondLook(file: File): Promise<string | null> {
  const jsQR = await loadSecondReader();
  const bitmap = await createImageBitmap(file).catch(() => null);
  if (!bitmap) return null; // not an image the browser can open
  const scale = Math.min(1, SECOND_LOOK_MAX_SIDE / Math.max(bitmap.width, bitmap.height));
  const width = Math.max(1, Math.round(bitmap.width * scale));
  const height = Math.max(1, Math.round(bitmap.height * scale));
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const context = canvas.getContext('2d', { willReadFrequently: true });
  if (!context) return null;
  context.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  return jsQR(context.getImageData(0, 0, width, height).data, width, height)?.data ?? null;
}
