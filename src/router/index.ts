import { createRouter, createWebHistory, type Router, type RouterHistory } from 'vue-router';
import { useSessionStore } from '@/stores/session';
import { routeTo } from './locations';
import { routes } from './routes';

/**
 * Builds the router with its sign-in guard. Tests pass a memory history.
 * @param history - web history in the app, memory history in tests
 */
export function createAppRouter(history: RouterHistory = createWebHistory()): Router {
  const router = createRouter({ history, routes, scrollBehavior: () => ({ top: 0 }) });

  router.beforeEach(async (to) => {
    const session = useSessionStore();
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
    document.title = to.meta.title ? `${to.meta.title} · Cellarwright` : 'Cellarwright';
  });

  return router;
}
