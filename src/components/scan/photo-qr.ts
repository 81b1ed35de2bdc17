import { loadQrReader } from './qr-reader';
import { readWithSecondReader } from './second-reader';

/** Longest side, in pixels, a photo is drawn at for the second reader: a phone's 12 MP photo would take seconds. */
const SECOND_LOOK_MAX_SIDE = 1600;

/**
 * Reads the QR code in a photo, in the browser (nothing is uploaded): html5-qrcode first, and
 * the second reader when it finds nothing. A screenshot of a label sheet is just the kind of
 * sharp picture the first one can miss.
 * @param workId - the id of an element html5-qrcode may draw into (it stays hidden)
 * @returns the text the code holds
 */
export async function readQrInPhoto(file: File, workId: string): Promise<string> {
  const { Html5Qrcode } = await loadQrReader();
  const decoder = new Html5Qrcode(workId, false);
  try {
    return await decoder.scanFile(file, false);
  } catch (firstMiss) {
    const bitmap = await createImageBitmap(file).catch(() => null);
    if (!bitmap) throw firstMiss; // not an image the browser can open
    try {
      const text = await readWithSecondReader(bitmap, bitmap.width, bitmap.height, SECOND_LOOK_MAX_SIDE);
      if (text === null) throw firstMiss;
      return text;
    } finally {
      bitmap.close();
    }
  } finally {
    decoder.clear();
  }
}
