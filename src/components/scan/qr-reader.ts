import type * as Html5QrcodeModule from 'html5-qrcode';
import type jsQR from 'jsqr';

/** The QR reader's code could not be fetched (no signal in the cellar, a server hiccup): not a fault of the label. */
export class QrReaderUnavailable extends Error {
  constructor(cause: unknown) {
    super('Could not load the QR reader. Check the connection and try again, or type the code.', { cause });
    this.name = 'QrReaderUnavailable';
  }
}

async function load<M>(importer: () => Promise<M>): Promise<M> {
  try {
    return await importer();
  } catch (err) {
    throw new QrReaderUnavailable(err);
  }
}

/**
 * Loads html5-qrcode on first use (it is large, and most pages never scan). A failed load is
 * told apart from a failed decode, so the person is not asked to retake a good photo.
 */
export function loadQrReader(): Promise<typeof Html5QrcodeModule> {
  return load(() => import('html5-qrcode'));
}

/** Loads jsQR, the second reader, for a photo or a camera frame html5-qrcode finds no code in. */
export async function loadSecondReader(): Promise<typeof jsQR> {
  return (await load(() => import('jsqr'))).default;
}
