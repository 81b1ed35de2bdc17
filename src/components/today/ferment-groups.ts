import type { Today } from '@shared/schemas/today';

type Ferment = Today['ferments'][number];

/**
 * Today's ferments in two lists: those still fermenting (or not yet judged), and those whose
 * readings say fermentation has finished — a Finished batch is never shown as fermenting.
 */
export function groupFerments(ferments: readonly Ferment[]): { fermenting: Ferment[]; finished: Ferment[] } {
  return {
    fermenting: ferments.filter((f) => f.state !== 'finished'),
    finished: ferments.filter((f) => f.state === 'finished'),
  };
}
