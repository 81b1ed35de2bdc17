import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';

/**
 * Accessibility checks of the screen a page shows: axe-core's rules (injected from the npm
 * package; the Playwright wrapper needs a newer Node), touch-target sizes, the smallest text,
 * and horizontal overflow. Each returns plain findings for the test to print and assert.
 */

const AXE_SOURCE = path.resolve(import.meta.dirname, '../../node_modules/axe-core/axe.min.js');
const ROUTES_SOURCE = path.resolve(import.meta.dirname, '../../src/router/routes.ts');

/** Touch targets: 44 × 44 CSS px (WCAG 2.5.5, the enhanced level; the product asks for it). */
export const MIN_TARGET_PX = 44;
/** The smallest text the product allows. */
export const MIN_FONT_PX = 12;

/**
 * The only targets allowed below 44 px: links running inline within a line of text, which WCAG
 * 2.5.8 exempts (the line's height, not the target, sets their size). Each must also be
 * inline in the page; a new one is added here only if it is a link inside a sentence.
 */
export const INLINE_LINK_EXCEPTIONS = [
  // Audit: "Who · when · <batch> · <vessel>" under each record.
  '[data-test=audit-record] .q-item__label--caption > a',
];

/** Every route name of the client router, read from src/router/routes.ts (the interface and the records). */
export function clientRouteNames(): string[] {
  const source = fs.readFileSync(ROUTES_SOURCE, 'utf8');
  const names = new Set<string>();
  const params = /export interface RouteParams \{([\s\S]*?)\n\}/.exec(source)?.[1] ?? '';
  for (const m of params.matchAll(/^\s*'?([a-z][a-z-]*)'?\s*:/gm)) names.add(m[1]!);
  for (const m of source.matchAll(/\bname:\s*'([a-z][a-z-]*)'(?!\s*satisfies)/g)) names.add(m[1]!);
  return [...names].sort();
}

export interface AxeFinding {
  rule: string;
  impact: string;
  help: string;
  nodes: string[];
}

/** Runs axe-core on the whole document and keeps the serious and critical violations. */
export async function seriousAxeViolations(page: Page): Promise<AxeFinding[]> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe !== 'undefined');
  // Evaluated rather than added as a <script>: the app's Content-Security-Policy refuses inline scripts.
  if (!loaded) await page.evaluate(fs.readFileSync(AXE_SOURCE, 'utf8'));
  return page.evaluate(async () => {
    type AxeResult = { violations: { id: string; impact: string | null; help: string; nodes: { target: unknown[]; failureSummary?: string }[] }[] };
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<AxeResult> } }).axe;
    const result = await axe.run(document, { resultTypes: ['violations'] });
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => ({
        rule: v.id,
        impact: v.impact ?? '',
        help: v.help,
        nodes: v.nodes.map((n) => `${n.target.join(' ')} — ${(n.failureSummary ?? '').replace(/\s+/g, ' ').slice(0, 240)}`),
      }));
  });
}

export interface Measured {
  what: string;
  width: number;
  height: number;
}

export interface ScreenMeasures {
  /** Interactive elements smaller than MIN_TARGET_PX either way. */
  smallTargets: Measured[];
  /** Inline links exempted by INLINE_LINK_EXCEPTIONS (WCAG 2.5.8), for the report. */
  inlineLinks: string[];
  /** Text smaller than MIN_FONT_PX. */
  smallText: { what: string; px: number }[];
  /** The smallest target and text seen, for the report. */
  smallestTarget: Measured | null;
  smallestFontPx: number | null;
}

/**
 * Measures every visible interactive element and every visible piece of text. A Quasar field's
 * input is measured by its whole control (a tap anywhere on it focuses the input). The only
 * exemption is WCAG 2.5.8's: a link that runs inline within a line of text, and is listed in
 * INLINE_LINK_EXCEPTIONS.
 */
export function measureScreen(page: Page): Promise<ScreenMeasures> {
  return page.evaluate(
    ({ minTarget, minFont, inlineExceptions }) => {
      const INTERACTIVE = [
        'a[href]',
        'button',
        'input:not([type=hidden])',
        'select',
        'textarea',
        '[role=button]',
        '[role=link]',
        '[role=checkbox]',
        '[role=switch]',
        '[role=radio]',
        '[role=tab]',
        '[role=menuitem]',
        '[role=option]',
        '[tabindex]:not([tabindex="-1"])',
      ].join(',');
      const describe = (el: Element) => {
        const text = (el.getAttribute('aria-label') ?? el.textContent ?? '').replace(/\s+/g, ' ').trim().slice(0, 40);
        const test = el.closest('[data-test]')?.getAttribute('data-test');
        const cls = typeof el.className === 'string' ? el.className.split(/\s+/).slice(0, 3).join('.') : '';
        return `<${el.tagName.toLowerCase()}${cls ? '.' + cls : ''}>${test ? ` [data-test=${test}]` : ''} "${text}"`;
      };
      const isShown = (el: Element, rect: DOMRect) => {
        if (rect.width < 2 || rect.height < 2) return false;
        if (rect.right <= 0 || rect.left >= window.innerWidth) return false; // a closed drawer sits off-canvas
        if (el.closest('[aria-hidden=true], [inert]')) return false;
        const style = getComputedStyle(el);
        if (style.visibility === 'hidden' || style.display === 'none') return false;
        for (let e: Element | null = el; e; e = e.parentElement) if (Number(getComputedStyle(e).opacity) === 0) return false;
        return true;
      };
      const isInlineLink = (el: Element) => {
        if (el.tagName !== 'A' || getComputedStyle(el).display !== 'inline') return false;
        if (!inlineExceptions.some((selector) => el.matches(selector))) return false;
        const parent = el.parentElement;
        if (!parent) return false;
        return [...parent.childNodes].some((n) => n !== el && n.nodeType === Node.TEXT_NODE && (n.textContent ?? '').trim().length > 0);
      };

      const smallTargets: { what: string; width: number; height: number }[] = [];
      const inlineLinks: string[] = [];
      let smallestTarget: { what: string; width: number; height: number } | null = null;
      const seen = new Set<Element>();
      for (const raw of document.querySelectorAll(INTERACTIVE)) {
        // The hit area of a field's input is its control; of a native input inside a Quasar toggle, the toggle.
        const el = raw.closest('.q-field__control') ?? (raw.matches('input') ? raw.closest('.q-toggle, .q-checkbox, .q-radio') : null) ?? raw;
        if (seen.has(el)) continue;
        seen.add(el);
        const rect = el.getBoundingClientRect();
        if (!isShown(el, rect)) continue;
        const measured = { what: describe(el), width: Math.round(rect.width * 10) / 10, height: Math.round(rect.height * 10) / 10 };
        if (rect.width >= minTarget - 0.5 && rect.height >= minTarget - 0.5) {
          if (!smallestTarget || Math.min(rect.width, rect.height) < Math.min(smallestTarget.width, smallestTarget.height)) smallestTarget = measured;
          continue;
        }
        if (isInlineLink(el)) {
          inlineLinks.push(measured.what);
          continue;
        }
        smallTargets.push(measured);
        if (!smallestTarget || Math.min(rect.width, rect.height) < Math.min(smallestTarget.width, smallestTarget.height)) smallestTarget = measured;
      }

      const smallText: { what: string; px: number }[] = [];
      let smallestFontPx: number | null = null;
      const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        if (!(node.textContent ?? '').trim()) continue;
        const el = node.parentElement;
        if (!el || el.closest('script, style, noscript, svg, .q-icon, .material-icons')) continue;
        const range = document.createRange();
        range.selectNodeContents(node);
        const rect = range.getBoundingClientRect();
        if (!isShown(el, rect)) continue;
        const px = parseFloat(getComputedStyle(el).fontSize);
        smallestFontPx = smallestFontPx === null ? px : Math.min(smallestFontPx, px);
        if (px < minFont - 0.01) smallText.push({ what: describe(el), px });
      }
      return { smallTargets, inlineLinks, smallText, smallestTarget, smallestFontPx };
    },
    { minTarget: MIN_TARGET_PX, minFont: MIN_FONT_PX, inlineExceptions: INLINE_LINK_EXCEPTIONS },
  );
}

/** The document's width and the bottom bar's box, to check nothing runs off a narrow screen. */
export function overflowAt(
  page: Page,
): Promise<{ scrollWidth: number; viewportWidth: number; viewportHeight: number; bottomBar: DOMRectJSON | null }> {
  return page.evaluate(() => {
    const bar = document.querySelector('.bottom-bar');
    const rect = bar && getComputedStyle(bar).display !== 'none' ? bar.getBoundingClientRect() : null;
    return {
      scrollWidth: document.scrollingElement?.scrollWidth ?? document.documentElement.scrollWidth,
      viewportWidth: window.innerWidth,
      viewportHeight: window.innerHeight,
      bottomBar: rect
        ? { x: rect.x, y: rect.y, width: rect.width, height: rect.height, top: rect.top, right: rect.right, bottom: rect.bottom, left: rect.left }
        : null,
    };
  });
}

type DOMRectJSON = { x: number; y: number; width: number; height: number; top: number; right: number; bottom: number; left: number };

/**
 * Buttons and tabs whose words are not shown as written (Quasar capitalises them unless told not
 * to; the app's stylesheet tells it once, for every button). Each as its text.
 */
export function shoutedControls(page: Page): Promise<string[]> {
  return page.$$eval('.q-btn, .q-tab', (els) =>
    els.filter((el) => (el.textContent ?? '').trim() !== '' && getComputedStyle(el).textTransform !== 'none').map((el) => el.textContent!.trim()),
  );
}

/**
 * Field labels cut short with an ellipsis (Quasar keeps a label on one line): a maker would not
 * know what the field asks for. Each as its full text.
 */
export function cutLabels(page: Page): Promise<string[]> {
  return page.$$eval('.q-field__label', (els) =>
    els
      .filter((el) => {
        const box = el.getBoundingClientRect();
        return box.width > 0 && getComputedStyle(el).visibility !== 'hidden' && el.scrollWidth > el.clientWidth + 1;
      })
      .map((el) => (el.textContent ?? '').trim()),
  );
}
