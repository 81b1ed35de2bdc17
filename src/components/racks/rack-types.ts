import type { Rack, Shelf } from '@shared/schemas/places';

/** What sits in one slot, as GET /racks reports it. */
export type Occupant = Shelf['occupants'][number];

/** One slot of a shelf, occupied or not. */
export interface SlotView {
  rack: Rack;
  shelf: Shelf;
  slot: number;
  occupant: Occupant | null;
}

/** The slots of a shelf in order, 1..slotCount, with their occupants. */
export function slotsOf(rack: Rack, shelf: Shelf): SlotView[] {
  const bySlot = new Map(shelf.occupants.map((o) => [o.slot, o]));
  return Array.from({ length: shelf.slotCount }, (_, i) => ({ rack, shelf, slot: i + 1, occupant: bySlot.get(i + 1) ?? null }));
}

/**
 * "Rack A · shelf 2 · slot 4". No-break spaces after "shelf" and "slot" keep each word with its number,
 * and before each dot keep it at the end of a line, so a narrow line never starts with one.
 */
export function placeText(place: { rackName: string; shelfNumber: number; slot: number } | null): string {
  return place ? `${place.rackName}\u00a0· shelf\u00a0${place.shelfNumber}\u00a0· slot\u00a0${place.slot}` : 'Not on a shelf';
}
