import { Notify } from 'quasar';
import type { RouteLocationRaw } from 'vue-router';
import { keptLabel } from './kept-records';

const TRIED_KEY = 'cellarwright.labelTried';
/** A label URL that comes back to the app this soon after it was sent to the server met no server. */
const LOOP_WINDOW_MS = 15_000;

/**
 * A printed label's URL (/s/<code>) reached inside the app. With a connection the server
 * decides where it leads (a full page load). Without one — the phone says so, or the page load
 * just came back here because the service worker found no server — the record kept on this
 * phone opens, where one was kept; else Today, with a message.
 */
export async function openLabelUrl(code: string, fullPath: string): Promise<RouteLocationRaw | false> {
  const tried = JSON.parse(sessionStorage.getItem(TRIED_KEY) ?? 'null') as { path: string; at: number } | null;
  const cameBack = tried?.path === fullPath && Date.now() - tried.at < LOOP_WINDOW_MS;
  if (navigator.onLine && !cameBack) {
    sessionStorage.setItem(TRIED_KEY, JSON.stringify({ path: fullPath, at: Date.now() }));
    window.location.replace(fullPath);
    return false;
  }
  sessionStorage.removeItem(TRIED_KEY);
  const kept = await keptLabel(code);
  if (kept) return kept.url;
  Notify.create({ type: 'warning', message: `No record for label ${code} is kept on this phone. Open it again when there is signal.` });
  return '/';
}
