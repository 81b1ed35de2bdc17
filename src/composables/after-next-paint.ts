/**
 * Resolves once the browser has painted the frame that is being prepared now: two animation
 * frames (the first runs before that paint, the second after it). For work a page or the app
 * can leave until what the person came for is on screen.
 */
export function afterNextPaint(): Promise<void> {
  return new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(() => resolve())));
}
