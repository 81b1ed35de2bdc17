import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { addNote } from '@/api/batches';
import { setUnitsShown } from '@/api/http';
import { useUnitsInRequests } from '@/composables/useUnits';
import { sendQueuedWrite } from '@/offline/send-queued-write';
import { useCellarStore } from '@/stores/cellar';
import { usePreferencesStore } from '@/stores/preferences';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, cellarSettings, operationResult } from './support/fixtures';

const notesPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/notes`;

describe('the units a request names for the server’s messages', () => {
  let api: FakeApi;

  beforeEach(() => {
    setActivePinia(createPinia());
    api = fakeApi();
    api.on('POST', notesPath, { status: 201, body: operationResult() });
    useUnitsInRequests();
  });

  afterEach(() => {
    // Back to no source: requests name no units, as before the app starts.
    setUnitsShown(undefined);
  });

  async function openCellar(unitSystem: 'metric' | 'us'): Promise<void> {
    api.on('GET', `/api/cellars/${CELLAR_ID}/settings`, { body: cellarSettings(unitSystem) });
    await useCellarStore().load(CELLAR_ID);
  }

  const lastNoteHeader = () => api.callsTo('POST', notesPath).at(-1)!.headers.get('Units-Shown');

  it('names the cellar’s units, then the person’s own choice on this device', async () => {
    await openCellar('us');
    await addNote(CELLAR_ID, BATCH_ID, { text: 'Racked off the gross lees.' });
    expect(lastNoteHeader()).toBe('us');
    // The write keeps its own headers beside it (the offline-safe key).
    expect(api.callsTo('POST', notesPath).at(-1)!.headers.get('Idempotency-Key')).toMatch(/^[0-9a-f-]{36}$/);

    usePreferencesStore().setUnits('metric');
    await addNote(CELLAR_ID, BATCH_ID, { text: 'Topped up with spare must.' });
    expect(lastNoteHeader()).toBe('metric');
  });

  it('names them when a write kept on the phone is sent later, so a refusal reads in them too', async () => {
    usePreferencesStore().setUnits('us');
    await sendQueuedWrite({
      id: '7b1f0c2e-9d4a-4e8b-a6c5-3f2e1d0c9b8a',
      kind: 'note',
      label: 'Note',
      method: 'POST',
      url: notesPath,
      body: { text: 'Racked off the gross lees.' },
      madeAt: '2026-12-04T09:00:00.000Z',
      userId: '0f1e2d3c-4b5a-4968-8776-655443322110',
      cellarId: CELLAR_ID,
      problem: null,
      attempts: 0,
      order: 0,
    });
    expect(lastNoteHeader()).toBe('us');
  });
});
