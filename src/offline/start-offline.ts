import type { Pinia } from 'pinia';
import { setOfflineHooks } from '@/api/http';
import { registerAppWorker } from './app-update';
import { useOutboxStore } from './outbox-store';

/**
 * Turns on what lets the app work in a cellar without signal: the service worker, the queue
 * the API layer keeps writes in, and the connection watch behind the offline banner.
 * The API layer's hooks are set at once; reading the queue from IndexedDB and registering the
 * worker wait for `firstPageShown`, so they do not hold back the page a scanned label opens.
 */
export function startOffline(pinia: Pinia, firstPageShown: Promise<unknown>): void {
  const outbox = useOutboxStore(pinia);
  setOfflineHooks({ queue: (write) => outbox.keep(write), reached: (ok) => outbox.noteReached(ok) });
  void firstPageShown.then(() => {
    outbox.start();
    void registerAppWorker();
  });
}
