import type { Plugin } from 'vite';
import { EARLY_REQUESTS_SCRIPT, PAGE_FILES_ELEMENT_ID } from '../shared/early-requests';

/** The pages whose code index.html's early script preloads, by the module that starts each. */
const PAGES: Record<string, string> = {
  layout: '/src/layouts/MainLayout.vue',
  vessel: '/src/pages/VesselPage.vue',
  batch: '/src/pages/BatchPage.vue',
  today: '/src/pages/TodayPage.vue',
  bottles: '/src/pages/BottlesPage.vue',
};

/**
 * Fonts every screen shows at once — body text (400), buttons and labels (500), titles (600),
 * the icons — fetched with the HTML instead of when the first layout finds them, which would
 * lay the page out a second time when they arrive.
 */
const FIRST_PAINT_FONTS = [/work-sans-latin-(400|500|600)-normal/, /material-icons/];

interface BundleAsset {
  type: 'asset';
  fileName: string;
  originalFileNames?: string[];
}

interface BundleChunk {
  type: 'chunk';
  fileName: string;
  isEntry: boolean;
  facadeModuleId: string | null;
  imports: string[];
  viteMetadata?: { importedCss: Set<string> };
}

/** A chunk's file, its static imports' files, and their CSS, leaving out what index.html already loads. */
function filesOf(start: BundleChunk, byFile: Map<string, BundleChunk>, loaded: Set<string>): string[] {
  const files = new Set<string>();
  const visit = (chunk: BundleChunk) => {
    if (files.has(chunk.fileName) || loaded.has(chunk.fileName)) return;
    files.add(chunk.fileName);
    for (const css of chunk.viteMetadata?.importedCss ?? []) files.add(css);
    for (const imported of chunk.imports) {
      const next = byFile.get(imported);
      if (next) visit(next);
    }
  };
  visit(start);
  return [...files];
}

/**
 * The first load of a page, at build: puts the early-requests script (shared/early-requests.ts)
 * where index.html marks it — before the stylesheet, which would hold it back — and, in a build,
 * the JSON list of each page's files it preloads.
 */
export function firstLoad(): Plugin {
  return {
    name: 'cellarwright-first-load',
    transformIndexHtml: {
      order: 'post',
      handler(html, context) {
        let pageFiles = '';
        if (context.bundle) {
          const chunks = Object.values(context.bundle).filter((c) => c.type === 'chunk') as unknown as BundleChunk[];
          const byFile = new Map(chunks.map((c) => [c.fileName, c]));
          const loaded = new Set<string>();
          for (const entry of chunks.filter((c) => c.isEntry)) for (const file of filesOf(entry, byFile, new Set())) loaded.add(file);
          const listed: Record<string, string[]> = {};
          for (const [page, module] of Object.entries(PAGES)) {
            const chunk = chunks.find((c) => c.facadeModuleId?.endsWith(module));
            if (!chunk) throw new Error(`first-load: no chunk starts at ${module}`);
            listed[page] = filesOf(chunk, byFile, loaded);
          }
          const fonts = (Object.values(context.bundle) as unknown as (BundleAsset | BundleChunk)[]).filter(
            (a): a is BundleAsset =>
              a.type === 'asset' &&
              a.fileName.endsWith('.woff2') &&
              FIRST_PAINT_FONTS.some((font) => [a.fileName, ...(a.originalFileNames ?? [])].some((name) => font.test(name))),
          );
          if (fonts.length !== 4) throw new Error(`first-load: expected 4 fonts to preload, found ${fonts.map((f) => f.fileName).join(', ')}`);
          const fontLinks = fonts.map((f) => `<link rel="preload" href="/${f.fileName}" as="font" type="font/woff2" crossorigin>\n    `).join('');
          pageFiles = `${fontLinks}<script type="application/json" id="${PAGE_FILES_ELEMENT_ID}">${JSON.stringify(listed)}</script>\n    `;
        }
        // A function, so `$'` and the like in the script are not read as replacement patterns.
        return html.replace('<script>/* early-requests */</script>', () => `${pageFiles}<script>${EARLY_REQUESTS_SCRIPT}</script>`);
      },
    },
  };
}
