import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import type { BottleCase } from '@shared/schemas/bottles';
import DrawDownDialog from '@/components/bottles/DrawDownDialog.vue';
import AdditionDialog from '@/components/operations/AdditionDialog.vue';
import RemovalDialog from '@/components/operations/RemovalDialog.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, ENTRY_ID, VESSEL_ID, batchDetail, operationResult, signIn } from './support/fixtures';
import { fieldMessage, mountInApp, pick } from './support/mount-in-app';

const type = (selector: string, text: string) => new DOMWrapper(pick<HTMLInputElement>(selector)).setValue(text);
/** Midday of 25 November 2026 on this device, as a moment: what a form means by "that day". */
const NOV_25_MIDDAY = new Date(2026, 10, 25, 12).toISOString();

describe('dating oak taken out and bottles that left', () => {
  let api: FakeApi;

  beforeEach(() => {
    localStorage.setItem('cellarwright.dateStyle', 'dd/mm/yyyy');
    api = fakeApi();
    signIn(api);
  });

  it('takes oak out on the day typed in the user’s date style, and today by default without a date', async () => {
    const removals = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/removals`;
    api.on('POST', removals, { status: 201, body: operationResult() });
    const props = { modelValue: true, batchId: BATCH_ID, addition: { entryId: ENTRY_ID, name: 'Oak cubes' } };
    const { wrapper } = await mountInApp(RemovalDialog, `/c/${CELLAR_ID}/tasks`, { props });
    await vi.waitFor(() => pick('[data-test=occurred-on]'));

    pick('[data-test=removal-submit]').click();
    await flushPromises();
    // Today: no `at`, the server records the moment it receives it.
    expect(api.callsTo('POST', removals)[0].body).toEqual({ additionEntryId: ENTRY_ID });

    await wrapper.setProps({ modelValue: false });
    await wrapper.setProps({ modelValue: true });
    await flushPromises();
    await type('[data-test=occurred-on]', '25/11/2026');
    pick('[data-test=removal-submit]').click();
    await flushPromises();
    const body = api.callsTo('POST', removals)[1].body as { additionEntryId: string; at: string };
    expect(body.additionEntryId).toBe(ENTRY_ID);
    expect(new Date(body.at).toISOString()).toBe(NOV_25_MIDDAY);
  });

  it('takes the take-out date of an addition in the user’s date style, as the day it happened beside it', async () => {
    const additions = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/additions`;
    api.on('GET', `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}`, { status: 200, body: batchDetail() });
    api.on('POST', additions, { status: 201, body: operationResult() });
    await mountInApp(AdditionDialog, `/c/${CELLAR_ID}/batches/${BATCH_ID}`, { props: { modelValue: true, batchId: BATCH_ID } });
    await vi.waitFor(() => pick('[data-test=addition-remove-on]'));
    expect(pick<HTMLInputElement>('[data-test=addition-remove-on]').placeholder).toBe('dd/mm/yyyy');

    await type('[data-test=addition-name]', 'Raspberries');
    await type('[data-test=addition-amount]', '500');
    await type('[data-test=addition-remove-on]', '31/02/2099');
    expect(fieldMessage('[data-test=addition-remove-on]')).toBe('Write the date as dd/mm/yyyy (e.g. 02/12/2026), or pick it on the calendar.');
    await type('[data-test=addition-remove-on]', '14/03/2099');
    pick('[data-test=addition-submit]').click();
    await flushPromises();
    expect(api.callsTo('POST', additions)[0].body).toMatchObject({ name: 'Raspberries', amount: 500, removeOn: '2099-03-14' });
  });

  it('logs bottles leaving a case on the day typed', async () => {
    const bottleCase: BottleCase = {
      id: VESSEL_ID,
      code: 'ABCDEFGH',
      lotId: BATCH_ID,
      number: 1,
      bottlesInitial: 12,
      bottlesLeft: 12,
      place: null,
      version: 3,
    };
    const departures = `/api/cellars/${CELLAR_ID}/cases/${VESSEL_ID}/departures`;
    api.on('POST', departures, { status: 201, body: { ...bottleCase, bottlesLeft: 10 } });
    await mountInApp(DrawDownDialog, `/c/${CELLAR_ID}/bottles`, { props: { modelValue: true, bottleCase, lotName: 'Test cider' } });
    await vi.waitFor(() => pick('[data-test=occurred-on]'));
    await type('[data-test=draw-down-count]', '2');
    await type('[data-test=occurred-on]', '25/11/2026');
    pick('[data-test=draw-down-submit]').click();
    await flushPromises();
    const body = api.callsTo('POST', departures)[0].body as Record<string, unknown>;
    expect(body).toMatchObject({ count: 2, reason: 'drunk', note: '', expectedVersion: 3 });
    expect(new Date(body.at as string).toISOString()).toBe(NOV_25_MIDDAY);
  });
});
