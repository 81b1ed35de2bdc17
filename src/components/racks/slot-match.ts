import type { SlotView } from './rack-types';

/** What the map's filter picks out. */
export type MapFilterKind = 'sanitised' | 'holding' | 'cases' | 'free';

export interface MapFilter {
  text: string;
  kind: MapFilterKind | null;
}

export const MAP_FILTER_OPTIONS: { value: MapFilterKind; label: string; icon: string }[] = [
  { value: 'sanitised', label: 'Free and sanitised', icon: 'verified' },
  { value: 'holding', label: 'Holding a batch', icon: 'water_drop' },
  { value: 'cases', label: 'Bottle cases', icon: 'wine_bar' },
  { value: 'free', label: 'Empty slots', icon: 'crop_free' },
];

function kindMatches(kind: MapFilterKind, view: SlotView): boolean {
  const o = view.occupant;
  switch (kind) {
    case 'sanitised':
      // A vessel whose state is sanitised is empty by definition.
      return !!o?.vesselId && o.state === 'sanitised';
    case 'holding':
      return !!o?.vesselId && o.state === 'holding';
    case 'cases':
      return !!o?.caseId;
    case 'free':
      return !o;
  }
}

/**
 * Turns the map's filter into a per-slot answer: true highlights, false dims; null when no
 * filter is on, so the map shows as it is.
 */
export function slotMatcher(filter: MapFilter): ((view: SlotView) => boolean) | null {
  const needle = filter.text.trim().toLowerCase();
  if (!needle && !filter.kind) return null;
  return (view) => {
    if (filter.kind && !kindMatches(filter.kind, view)) return false;
    if (!needle) return true;
    return !!view.occupant && view.occupant.label.toLowerCase().includes(needle);
  };
}
