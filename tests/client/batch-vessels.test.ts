import { afterEach, describe, expect, it } from 'vitest';
import BatchVessels from '@/components/batches/BatchVessels.vue';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, VESSEL_ID, batchDetail, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

afterEach(() => {
  document.body.innerHTML = '';
});

/** A 4.5 L jug holding 4.3 L: (4.5 − 4.3) / 4.5 = 4.44 %, shown to one place as 4.4 %. */
const jug = {
  id: VESSEL_ID,
  code: 'K7M2P9QX',
  name: 'Jug 2',
  capacityL: 4.5,
  volumeL: 4.3,
  filledAt: '2026-05-13T10:00:00Z',
  place: {
    rackId: '0b7c3a3e-1d2f-4e5a-9b8c-7d6e5f4a3b2c',
    rackName: 'Pantry rack',
    shelfId: '1c8d4b4f-2e3a-4f6b-8c9d-8e7f6a5b4c3d',
    shelfNumber: 3,
    slot: 3,
  },
  version: 2,
};

describe('a batch’s vessels column', () => {
  it('words headspace as the Vessels list does, and keeps each dot at the end of a line', async () => {
    signIn(fakeApi());
    const { vessels } = batchDetail({ vessels: [jug] });
    await mountInApp(BatchVessels, `/c/${CELLAR_ID}/batches/${BATCH_ID}`, { props: { vessels, cellarId: CELLAR_ID } });
    const item = pick(`[data-test=batch-vessel-${VESSEL_ID}]`);
    expect(item.textContent).toContain('4.4\u00a0%\u00a0headspace');
    // A no-break space before every dot: the browser may break after a dot, never before one.
    expect(item.textContent).toContain('Pantry rack\u00a0· shelf\u00a03\u00a0· slot\u00a03');
    expect(item.textContent).not.toMatch(/[ \t\n]\u00a0?·/);
  });
});
