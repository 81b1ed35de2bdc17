import { headspace } from '@shared/calc';

/** "Carboy 23 · 23 L · glass" — how a vessel is named in pickers. */
export function vesselOptionLabel(
  vessel: { name: string; code: string; capacityL: number; material?: string },
  volume: (litres: number) => string,
): string {
  return [vessel.name, volume(vessel.capacityL), vessel.material, vessel.code].filter(Boolean).join('\u00a0· ');
}

/**
 * Headspace words for a planned fill, or a message when it does not fit.
 * @param capacityL - the vessel's capacity
 * @param volumeL - what goes in
 */
export function fillHeadspaceHint(capacityL: number, volumeL: number | null, volume: (litres: number) => string): string | null {
  if (volumeL === null || volumeL <= 0) return null;
  if (volumeL > capacityL + 1e-6) return `More than it holds (${volume(capacityL)}).`;
  const space = headspace({ capacityL, volumeL: Math.min(volumeL, capacityL) }); // a hair over, within the tolerance above, counts as full
  return `Headspace ${volume(space.litres)} (${space.percent.toFixed(1)}\u00a0%)`;
}
