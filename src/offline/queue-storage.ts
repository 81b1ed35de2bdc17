import type { QueuedWrite } from './queued-write';

/** Where queued writes are kept: IndexedDB on the phone, memory where there is none (and in tests). */
export interface QueueStorage {
  list(): Promise<QueuedWrite[]>;
  put(write: QueuedWrite): Promise<void>;
  remove(id: string): Promise<void>;
}

/** Keeps writes for as long as the page lives: for browsers without IndexedDB (private windows of some). */
export function memoryQueueStorage(): QueueStorage {
  const writes = new Map<string, QueuedWrite>();
  return {
    list: async () => [...writes.values()].map((w) => structuredClone(w)),
    put: async (write) => void writes.set(write.id, structuredClone(write)),
    remove: async (id) => void writes.delete(id),
  };
}
