import type { BatchSummary } from '@shared/schemas/batches';
import { placeText } from '@/components/racks/rack-types';

type Whereabouts = NonNullable<BatchSummary['whereabouts']>;

/**
 * Where a batch is, in a line: "Carboy 3 · Rack A · shelf 2 · slot 4; Jug 1 (no place set)", each place
 * worded as everywhere else (`placeText`).
 * Empty when the list did not say (an older answer) or the batch is in no vessel.
 */
export function whereaboutsWords(whereabouts: Whereabouts | undefined): string {
  return (whereabouts ?? []).map((w) => (w.place ? `${w.vesselName}\u00a0· ${placeText(w.place)}` : `${w.vesselName} (no place set)`)).join('; ');
}
