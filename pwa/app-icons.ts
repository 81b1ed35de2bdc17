import fs from 'node:fs/promises';
import sharp from 'sharp';
import type { Plugin } from 'vite';

/** The mark every icon is drawn from (our own drawing; see pwa/app-icon.svg). */
const SOURCE = new URL('./app-icon.svg', import.meta.url);
/** The background behind the maskable icon: the header's dusk indigo. */
const MASKABLE_BACKGROUND = '#33304f';
/**
 * A maskable icon may be cut to a circle of 80 % of its width: the mark is drawn at 72 %
 * so the vessel and its notch stay inside that safe zone on every launcher shape.
 */
const MASKABLE_MARK_SHARE = 0.72;

export interface AppIcon {
  src: string;
  sizes: string;
  type: 'image/png';
  purpose: 'any' | 'maskable';
}

/** The icons the manifest names; `appIcons()` writes each of them into the build. */
export const APP_ICONS: AppIcon[] = [
  { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
  { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
  { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
];

/** One icon as PNG bytes, drawn from the SVG at its own size (never scaled from another PNG). */
export async function renderIcon(svg: Buffer, icon: AppIcon): Promise<Buffer> {
  const size = Number(icon.sizes.split('x')[0]);
  if (icon.purpose === 'any') {
    return sharp(svg, { density: 72 * (size / 512) * 4 })
      .resize(size, size)
      .png()
      .toBuffer();
  }
  const markSize = Math.round(size * MASKABLE_MARK_SHARE);
  const mark = await sharp(svg, { density: 72 * (markSize / 512) * 4 })
    .resize(markSize, markSize)
    .png()
    .toBuffer();
  return sharp({ create: { width: size, height: size, channels: 4, background: MASKABLE_BACKGROUND } })
    .composite([{ input: mark, gravity: 'centre' }])
    .png()
    .toBuffer();
}

/**
 * Draws the app's icons from pwa/app-icon.svg with sharp at build time and adds them to the
 * bundle (dist/icons/), where the service worker's precache and the manifest find them. Nothing
 * generated is kept in the repository.
 */
export function appIcons(): Plugin {
  return {
    name: 'cellarwright-app-icons',
    apply: 'build',
    async generateBundle() {
      const svg = await fs.readFile(SOURCE);
      for (const icon of APP_ICONS) {
        this.emitFile({ type: 'asset', fileName: icon.src.slice(1), source: await renderIcon(svg, icon) });
      }
      this.emitFile({ type: 'asset', fileName: 'icons/app-icon.svg', source: svg });
    },
  };
}
