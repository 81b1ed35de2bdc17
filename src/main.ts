import { createApp, nextTick } from 'vue';
import { createPinia } from 'pinia';
import { Notify, Quasar } from 'quasar';
import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
import '@quasar/extras/material-icons/material-icons.css';
import 'quasar/dist/quasar.css';
import './css/app.css';
import App from './App.vue';
import { setUnauthorizedHandler } from './api/http';
import { afterNextPaint } from './composables/after-next-paint';
import { startOffline } from './offline/start-offline';
import { lazyDialog } from './plugins/lazy-dialog';
import { createAppRouter } from './router';
import { removeFirstGlance } from './router/first-glance';
import { routeTo } from './router/locations';
import { useSessionStore } from './stores/session';
import { brandColours } from '@shared/palette';

// When the app's own code starts: what index.html's early requests are measured against (tests/e2e/scan.test.ts).
performance.mark('cellarwright:app-start');

const app = createApp(App);
const pinia = createPinia();
app.use(pinia);
app.use(Quasar, {
  plugins: { Notify },
  config: { brand: brandColours, notify: { position: 'top', timeout: 3500 } },
});
// $q.dialog: the confirmations' code loads on the first one, not with the first page.
app.use(lazyDialog);
const router = createAppRouter();
app.use(router);

// A session that ended on the server (expired, signed out elsewhere) sends the user to sign in.
setUnauthorizedHandler(() => {
  useSessionStore(pinia).forget();
  const here = router.currentRoute.value;
  // Before the first navigation settles the route is the bare start location: the guard decides then.
  if (here.matched.length > 0 && !here.meta.public) void router.push(routeTo('sign-in', {}, { next: here.fullPath }));
});

// Once the first page is rendered, a scanned label's first glance (drawn over the empty page by
// index.html's script) goes: the browser's next paint shows the page in its place. Once that page
// has painted, the offline set-up starts — the queue of writes made without signal (IndexedDB)
// and the service worker's registration (src/offline/).
const firstPageRendered = router
  .isReady()
  .catch(() => undefined)
  .then(() => nextTick());
void firstPageRendered.then(removeFirstGlance);
startOffline(pinia, firstPageRendered.then(afterNextPaint));

app.mount('#app');
