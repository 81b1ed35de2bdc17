import { offlineDb } from './offline-db';
import type { QueueStorage } from './queue-storage';

/** Queued writes in IndexedDB: they outlive a closed tab, a restarted phone and a new version. */
export function idbQueueStorage(): QueueStorage {
  return {
    list: async () => (await offlineDb()).getAll('writes'),
    put: async (write) => void (await (await offlineDb()).put('writes', write)),
    remove: async (id) => (await offlineDb()).delete('writes', id),
  };
}
