/** The smallest region html5-qrcode accepts, in pixels. */
const MIN_REGION_PX = 50;
/** The share of the viewfinder the decoder reads: nearly all of it, so a label is read anywhere in the frame. */
export const SCAN_REGION_SHARE = 0.96;

/**
 * The region of the viewfinder the in-app camera decodes (html5-qrcode's `qrbox`): almost the
 * whole frame, keeping its shape, so a code is read near the edges too and not only at the centre.
 * @param width - the viewfinder's width in pixels
 * @param height - the viewfinder's height in pixels
 */
export function scanRegion(width: number, height: number): { width: number; height: number } {
  const side = (px: number) => Math.max(MIN_REGION_PX, Math.floor(px * SCAN_REGION_SHARE));
  return { width: side(width), height: side(height) };
}
