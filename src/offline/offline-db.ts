import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { QueuedWrite } from './queued-write';

/** A label code and the record it opens, kept for scanning without signal. */
export interface KeptLabel {
  code: string;
  kind: 'vessel';
  /** The vessel's id. */
  id: string;
  cellarId: string;
  /** Client path of the record, e.g. /c/<cellarId>/vessels/<id>. */
  url: string;
}

interface OfflineSchema extends DBSchema {
  writes: { key: string; value: QueuedWrite };
  labels: { key: string; value: KeptLabel };
}

const DB_NAME = 'cellarwright-offline';
const DB_VERSION = 1;

let opened: Promise<IDBPDatabase<OfflineSchema>> | null = null;

/** The phone's offline store: queued writes, and label codes of the records kept. */
export function offlineDb(): Promise<IDBPDatabase<OfflineSchema>> {
  opened ??= openDB<OfflineSchema>(DB_NAME, DB_VERSION, {
    upgrade(db) {
      db.createObjectStore('writes', { keyPath: 'id' });
      db.createObjectStore('labels', { keyPath: 'code' });
    },
  });
  return opened;
}

/** True where IndexedDB can be used (not in some private windows, not in happy-dom). */
export function indexedDbAvailable(): boolean {
  return typeof indexedDB !== 'undefined';
}
