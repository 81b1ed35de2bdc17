import type * as Html5QrcodeModule from 'html5-qrcode';

/** The QR reader's code could not be fetched (no signal in the cellar, a server hiccup): not a fault of the label. */
export class QrReaderUnavailable extends Error {
  constructor(cause: unknown) {
    super('Could not load the QR reader. Check the connection and try again, or type the code.', { cause });
    this.name = 'QrReaderUnavailable';
  }
}

/**
 * Loads html5-qrcode on first use (it is large, and most pages never scan). A failed load is
 * told apart from a failed decode, so the person is not asked to retake a good photo.
 */
export async function loadQrReader(): Promise<typeof Html5QrcodeModule> {
  try {
    return await import('html5-qrcode');
  } catch (err) {
    throw new QrReaderUnavailable(err);
  }
}
