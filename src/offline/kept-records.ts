import { fetchBatch } from '@/api/batches';
import { fetchToday } from '@/api/today';
import { fetchVessel, listVessels } from '@/api/vessels';
import { indexedDbAvailable, offlineDb, type KeptLabel } from './offline-db';

/** In-use vessels whose page and batch are fetched ahead, so they open in the cellar without signal. */
const MOST_VESSELS_KEPT = 20;
/** A cellar's records are fetched ahead at most this often. */
const KEEP_EVERY_MS = 10 * 60_000;

const lastKept = new Map<string, number>();

/**
 * Fetches Today, the vessel list and the in-use vessels and their batches once in a while, so
 * the service worker keeps them (it keeps what passes through it), and notes each vessel's
 * label code: a label scanned without signal then opens its record. Only while a service
 * worker controls the page (otherwise nothing would be kept) and never more than one request
 * at a time.
 */
export async function keepRecordsOf(cellarId: string, now = Date.now()): Promise<void> {
  if (!navigator.serviceWorker?.controller || !indexedDbAvailable()) return;
  if (now - (lastKept.get(cellarId) ?? 0) < KEEP_EVERY_MS) return;
  lastKept.set(cellarId, now);
  await fetchToday(cellarId);
  const page = await listVessels(cellarId, { pageSize: 200 });
  const labels: KeptLabel[] = page.items.map((v) => ({ code: v.code, kind: 'vessel', id: v.id, cellarId, url: `/c/${cellarId}/vessels/${v.id}` }));
  const db = await offlineDb();
  const tx = db.transaction('labels', 'readwrite');
  await Promise.all([...labels.map((label) => tx.store.put(label)), tx.done]);
  const inUse = page.items.filter((v) => v.batch).slice(0, MOST_VESSELS_KEPT);
  const batchIds = new Set<string>();
  for (const vessel of inUse) {
    await fetchVessel(cellarId, vessel.id);
    if (vessel.batch && !batchIds.has(vessel.batch.id)) {
      batchIds.add(vessel.batch.id);
      await fetchBatch(cellarId, vessel.batch.id);
    }
  }
}

/** The record a label opens, as last kept on this phone; null when it was never seen here. */
export async function keptLabel(code: string): Promise<KeptLabel | null> {
  if (!indexedDbAvailable()) return null;
  return (await (await offlineDb()).get('labels', code.toUpperCase())) ?? null;
}
