import { afterEach, describe, expect, it } from 'vitest';
import { shelfSchema } from '@shared/schemas/places';
import SlotTile from '@/components/racks/SlotTile.vue';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

// Two occupants as GET /racks sends them, checked against the shared schema so they cannot drift.
const [caseOccupant, vesselOccupant] = shelfSchema.parse({
  id: '6a7b8c9d-0e1f-4a2b-8c3d-4e5f6a7b8c9d',
  number: 1,
  slotCount: 5,
  occupants: [
    {
      slot: 1,
      vesselId: null,
      caseId: '1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f',
      label: 'Case 2 of Orchard Gate Cider',
      state: '11 bottles',
      caseNumber: 2,
      batchName: 'Orchard Gate Cider',
    },
    {
      slot: 2,
      vesselId: '2d3e4f5a-6b7c-4d8e-9f0a-1b2c3d4e5f6a',
      caseId: null,
      label: 'Jug B',
      state: 'sanitised',
      caseNumber: null,
      batchName: null,
    },
  ],
}).occupants;

/** An element's text as a screen reader takes it: icons (aria-hidden) left out, spaces as written. */
function nameOf(element: Element): string {
  const copy = element.cloneNode(true) as Element;
  copy.querySelectorAll('[aria-hidden=true]').forEach((e) => e.remove());
  return (copy.textContent ?? '').replace(/\s+/g, ' ').trim();
}

/** What a sighted person reads: the text without the words kept for screen readers. */
function visibleText(element: Element): string {
  const copy = element.cloneNode(true) as Element;
  copy.querySelectorAll('.cw-visually-hidden').forEach((e) => e.remove());
  return (copy.textContent ?? '').trim();
}

afterEach(() => {
  document.body.innerHTML = '';
});

describe('a slot on the cellar map', () => {
  it('shows a case by its batch first, then its number and bottles left', async () => {
    signIn(fakeApi());
    const { wrapper } = await mountInApp(SlotTile, `/c/${CELLAR_ID}/map`, { props: { slotNumber: 1, occupant: caseOccupant } });
    const shown = (selector: string) => wrapper.findAll(selector).map((l) => visibleText(l.element));
    expect(shown('.slot-tile__label, .slot-tile__state')).toEqual(['Orchard Gate Cider', 'Case 2', '11 bottles']);
    // The button's name holds what it shows, in parts a screen reader keeps apart, and says what kind of thing it is.
    expect(nameOf(wrapper.element)).toBe('Slot 1: Orchard Gate Cider, Case 2, 11 bottles, Bottle case');
  });

  it('shows a vessel by its name alone (its state is the tile’s colour and icon)', async () => {
    signIn(fakeApi());
    const { wrapper } = await mountInApp(SlotTile, `/c/${CELLAR_ID}/map`, { props: { slotNumber: 2, occupant: vesselOccupant } });
    expect(wrapper.findAll('.slot-tile__label, .slot-tile__state').map((l) => l.text())).toEqual(['Jug B']);
    expect(wrapper.attributes('data-test')).toBe('slot-vessel');
  });
});
