import type { Pinia } from 'pinia';
import { setOfflineHooks } from '@/api/http';
import { registerAppWorker } from './app-update';
import { useOutboxStore } from './outbox-store';

/**
 * Turns on what lets the app work in a cellar without signal: the service worker, the queue
 * the API layer keeps writes in, and the connection watch behind the offline banner.
 */
export function startOffline(pinia: Pinia): void {
  const outbox = useOutboxStore(pinia);
  setOfflineHooks({ queue: (write) => outbox.keep(write), reached: (ok) => outbox.noteReached(ok) });
  outbox.start();
  void registerAppWorker();
}
