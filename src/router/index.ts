import { createRouter, createWebHistory, type RouteLocationNormalized, type Router, type RouterHistory } from 'vue-router';
import { useSessionStore } from '@/stores/session';
import { routeTo } from './locations';
import { routes } from './routes';

/**
 * Starts fetching the route's lazily loaded page while the session is asked for, so the first
 * screen waits for one round trip, not two in a row. The router's own load later finds the
 * module already there.
 */
function preloadPages(to: RouteLocationNormalized): void {
  // The page only: loading the layout's modules before the session is known sent a signed-out
  // visitor under a service worker into a reload loop (e2e sign-in test, "returns to the page").
  for (const record of to.matched.slice(-1)) {
    for (const component of Object.values(record.components ?? {})) {
      // As vue-router tells a lazy loader from a functional component.
      if (typeof component === 'function' && !('displayName' in component)) {
        void (component as () => Promise<unknown>)().catch(() => undefined);
      }
    }
  }
}

/** The layout's fixed header: a section scrolled to lands just below it. */
const HEADER_HEIGHT_PX = 56;

/**
 * Builds the router with its sign-in guard. Tests pass a memory history.
 * @param history - web history in the app, memory history in tests
 */
export function createAppRouter(history: RouterHistory = createWebHistory()): Router {
  // A new page starts at its top; an address with #section (Settings' jump list) scrolls to it, below the fixed header.
  const router = createRouter({ history, routes, scrollBehavior: (to) => (to.hash ? { el: to.hash, top: HEADER_HEIGHT_PX } : { top: 0 }) });

  router.beforeEach(async (to) => {
    const session = useSessionStore();
    preloadPages(to);
    if (!session.loaded) await session.load().catch(() => undefined);
    if (!to.meta.public && !session.user) {
      return routeTo('sign-in', {}, to.fullPath === '/' ? {} : { next: to.fullPath });
    }
    const cellarId = to.params.cellarId;
    if (typeof cellarId === 'string') {
      if (!session.cellars.some((c) => c.cellarId === cellarId)) {
        return routeTo('not-found', { pathMatch: to.path.slice(1).split('/') });
      }
      session.openCellar(cellarId);
    }
    return true;
  });

  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title}\u00a0· Cellarwright` : 'Cellarwright';
  });

  return router;
}
