import { describe, expect, it } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import PendingWrites from '@/offline/PendingWrites.vue';
import { useOutboxStore } from '@/offline/outbox-store';
import { useSessionStore } from '@/stores/session';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, VESSEL_ID, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

const button = (label: string) => [...document.querySelectorAll<HTMLButtonElement>('.q-dialog button')].find((b) => b.textContent?.trim() === label);

/** The header's list with one reading the server refused (invented wording), opened. */
async function mountWithRefusedReading() {
  const api = fakeApi();
  signIn(api);
  const { wrapper, pinia } = await mountInApp(PendingWrites, `/c/${CELLAR_ID}/today`);
  await useSessionStore(pinia).load();
  const outbox = useOutboxStore(pinia);
  outbox.useSender(async () => ({ status: 400, message: 'That vessel no longer holds this batch.' }));
  await outbox.keep({
    id: 'key-refused',
    kind: 'reading',
    label: 'Reading on Big Glass',
    method: 'POST',
    url: `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/readings`,
    body: { sg: 1.012, vesselId: VESSEL_ID, at: '2026-12-03T08:15:00.000Z' },
    madeAt: '2026-12-03T08:15:00.000Z',
    cellarId: CELLAR_ID,
  });
  await outbox.flush();
  await flushPromises();
  await wrapper.get('[data-test=pending-writes]').trigger('click');
  await flushPromises();
  return { wrapper, outbox };
}

describe('the list of changes waiting to send', () => {
  it('drops a refused change only after "Drop it" is confirmed; "Keep it" keeps it', async () => {
    const { wrapper, outbox } = await mountWithRefusedReading();
    expect(pick('[data-test=pending-problem]').textContent).toContain('Not accepted: That vessel no longer holds this batch.');

    pick<HTMLButtonElement>('[data-test=pending-drop]').click();
    // The confirmation's code loads on first use (src/plugins/lazy-dialog.ts).
    await expect.poll(() => document.body.textContent).toContain('Drop this change?');
    expect(document.body.textContent).toContain('“Reading on Big Glass” will not be sent and is gone from this phone.');
    button('Keep it')!.click();
    await flushPromises();
    expect(outbox.writes.map((w) => w.id)).toEqual(['key-refused']);

    pick<HTMLButtonElement>('[data-test=pending-drop]').click();
    await expect.poll(() => document.querySelector('[data-test=confirm-drop]')).not.toBeNull();
    pick<HTMLButtonElement>('[data-test=confirm-drop]').click();
    await expect.poll(() => outbox.writes.length).toBe(0);
    wrapper.unmount();
  });
});
