import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { defineComponent, h } from 'vue';
import { noteRequestSchema } from '@shared/schemas/journal';
import { addNote } from '@/api/batches';
import { setOfflineHooks, type OfflineHooks } from '@/api/http';
import { useOperationDialog } from '@/components/operations/useOperationDialog';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, operationResult, signIn } from './support/fixtures';
import { mountInApp, notificationsFrom } from './support/mount-in-app';

const notesPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/notes`;

/** A note dialog reduced to the composable, with the offline queue replaced by a list. */
async function mountNoteDialog(answer: 'network-down' | 'ok') {
  const api = fakeApi();
  signIn(api);
  api.on('POST', notesPath, () => {
    if (answer === 'network-down') throw new TypeError('Failed to fetch');
    return { status: 201, body: operationResult() };
  });
  const kept: Parameters<OfflineHooks['queue']>[0][] = [];
  setOfflineHooks({ queue: async (write) => void kept.push(write), reached: () => undefined });
  let submit!: () => Promise<void>;
  const Harness = defineComponent({
    props: { modelValue: { type: Boolean, required: true } },
    emits: ['update:modelValue', 'done'],
    setup(props, { emit }) {
      ({ submit } = useOperationDialog({
        props,
        emit,
        schema: noteRequestSchema,
        request: () => ({ text: 'Racked off the gross lees.' }),
        send: (cellarId, request) => addNote(cellarId, BATCH_ID, request),
        success: 'Note saved.',
      }));
      return () => h('div');
    },
  });
  const { wrapper } = await mountInApp(Harness, `/c/${CELLAR_ID}/tasks`, { props: { modelValue: true } });
  return { api, kept, wrapper, submit: () => submit() };
}

/** The Idempotency-Key header of every request from here on (null where it has none), the fake API still answering. */
function recordIdempotencyKeys(): (string | null)[] {
  const keys: (string | null)[] = [];
  const fakeFetch = globalThis.fetch;
  vi.stubGlobal('fetch', (input: RequestInfo | URL, init: RequestInit = {}) => {
    keys.push(new Headers(init.headers).get('Idempotency-Key'));
    return fakeFetch(input, init);
  });
  return keys;
}

afterEach(() => {
  setOfflineHooks(undefined);
  vi.useRealTimers();
});

describe('a write made without a connection', () => {
  it('is kept with its key and the moment it was made, and the dialog says so and closes without "done"', async () => {
    const { kept, wrapper, submit, api } = await mountNoteDialog('network-down');
    const before = Date.now();
    const shown = await notificationsFrom(async () => {
      await submit();
      await flushPromises();
    });
    expect(shown).toEqual(['Saved on this phone — will send when back online.']);
    expect(wrapper.emitted('update:modelValue')).toEqual([[false]]);
    expect(wrapper.emitted()).not.toHaveProperty('done');
    expect(api.callsTo('POST', notesPath)).toHaveLength(1);
    expect(kept).toHaveLength(1);
    const [write] = kept;
    expect(write).toMatchObject({ kind: 'note', method: 'POST', url: notesPath, cellarId: CELLAR_ID });
    expect(write.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    // Today's note has no `at` of its own: the queue gives it the moment it was made.
    expect(write.body).toEqual({ text: 'Racked off the gross lees.', at: write.madeAt });
    expect(Date.parse(write.madeAt)).toBeGreaterThanOrEqual(before);
    expect(Date.parse(write.madeAt)).toBeLessThanOrEqual(Date.now());
  });

  it('with a connection is sent at once with an Idempotency-Key and nothing is kept', async () => {
    const api = fakeApi();
    const headersSeen = recordIdempotencyKeys();
    signIn(api);
    api.on('POST', notesPath, { status: 201, body: operationResult() });
    const kept: unknown[] = [];
    setOfflineHooks({ queue: async (write) => void kept.push(write), reached: () => undefined });
    await addNote(CELLAR_ID, BATCH_ID, { text: 'Clear at last.' });
    expect(kept).toEqual([]);
    expect(api.callsTo('POST', notesPath).map((c) => c.body)).toEqual([{ text: 'Clear at last.' }]);
    expect(headersSeen.at(-1)).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('gets a version-4 UUID as its key where the page has no crypto.randomUUID (plain HTTP on the local network)', async () => {
    const api = fakeApi();
    const keys = recordIdempotencyKeys();
    signIn(api);
    api.on('POST', notesPath, { status: 201, body: operationResult() });
    setOfflineHooks({ queue: async () => undefined, reached: () => undefined });
    // Browsers leave randomUUID out of insecure contexts; an own property hides the prototype's.
    Object.defineProperty(crypto, 'randomUUID', { value: undefined, configurable: true });
    try {
      await addNote(CELLAR_ID, BATCH_ID, { text: 'First.' });
      await addNote(CELLAR_ID, BATCH_ID, { text: 'Second.' });
    } finally {
      Reflect.deleteProperty(crypto, 'randomUUID');
    }
    expect(typeof crypto.randomUUID).toBe('function');
    const sent = keys.filter((k) => k !== null);
    expect(sent).toHaveLength(2);
    // RFC 9562 (formerly RFC 4122): version nibble 4, variant bits 10xx.
    for (const key of sent) expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(sent[0]).not.toBe(sent[1]);
  });
});
