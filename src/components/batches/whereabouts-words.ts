import type { BatchSummary } from '@shared/schemas/batches';

type Whereabouts = NonNullable<BatchSummary['whereabouts']>;

/**
 * Where a batch is, in a line: "Carboy 3 · Rack A, shelf 2, slot 4; Jug 1 (no place)".
 * Empty when the list did not say (an older answer) or the batch is in no vessel.
 */
export function whereaboutsWords(whereabouts: Whereabouts | undefined): string {
  return (whereabouts ?? [])
    .map((w) =>
      w.place ? `${w.vesselName} · ${w.place.rackName}, shelf ${w.place.shelfNumber}, slot ${w.place.slot}` : `${w.vesselName} (no place set)`,
    )
    .join('; ');
}
