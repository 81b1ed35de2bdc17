import type { VesselDetail } from '@shared/schemas/vessels';
import { fetchVessel } from '@/api/vessels';

/** How long opening a Vessel page waits for its record before showing the page to fill in later. */
const PREFETCH_WAIT_MS = 1500;

const prefetched = new Map<string, VesselDetail>();

/**
 * Fetches a vessel's record while the route resolves (route guard), so the Vessel page's first
 * paint is the record rather than a spinner followed by it — one render, not two, on the path a
 * scanned label takes. Waits at most PREFETCH_WAIT_MS; a record that comes later is dropped and
 * the page fetches its own, so nothing stale is ever handed on.
 */
export async function prefetchVessel(cellarId: string, vesselId: string): Promise<void> {
  let waiting = true;
  const fetched = fetchVessel(cellarId, vesselId).then(
    (record) => {
      if (waiting) prefetched.set(vesselId, record);
    },
    () => undefined, // the page fetches again and says what went wrong
  );
  await Promise.race([fetched, new Promise((resolve) => setTimeout(resolve, PREFETCH_WAIT_MS))]);
  waiting = false;
}

/** The record fetched for this navigation, taken once; undefined when there is none. */
export function takePrefetchedVessel(vesselId: string): VesselDetail | undefined {
  const record = prefetched.get(vesselId);
  prefetched.delete(vesselId);
  return record;
}
