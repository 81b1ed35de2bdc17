import { describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { defineComponent, h, reactive } from 'vue';
import type { ZodType } from 'zod';
import type { OperationResult } from '@shared/schemas/batch-detail';
import { noteRequestSchema, rackRequestSchema } from '@shared/schemas/journal';
import { addNote, rackBatch } from '@/api/batches';
import type { ApiError } from '@/api/http';
import { useOperationDialog, type OperationDialogOptions } from '@/components/operations/useOperationDialog';
import { fakeApi, type FakeAnswer } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, VESSEL_ID, operationResult, signIn } from './support/fixtures';
import { mountInApp, notificationsFrom } from './support/mount-in-app';

const notesPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/notes`;
const rackingsPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/rackings`;
const TARGET_ID = '7b6a5c4d-3e2f-4a1b-9c8d-7e6f5a4b3c2d';

type Dialog = ReturnType<typeof useOperationDialog>;
type Extra<Request> = Partial<OperationDialogOptions<Request, OperationResult>>;

/**
 * A dialog reduced to the composable: the test holds its form and reads what the composable
 * exposes. It sends notes unless told otherwise.
 */
async function mountDialog<Request = unknown>(extra: Extra<Request> = {}, options: { open?: boolean; answer?: FakeAnswer } = {}) {
  const api = fakeApi();
  signIn(api);
  api.on('POST', notesPath, options.answer ?? { status: 201, body: operationResult() });
  const form = reactive({ text: 'Airlock bubbling every few seconds.' });
  let dialog!: Dialog;
  const Harness = defineComponent({
    props: { modelValue: { type: Boolean, required: true } },
    emits: ['update:modelValue', 'done'],
    setup(props, { emit }) {
      dialog = useOperationDialog({
        props,
        emit,
        schema: noteRequestSchema as unknown as ZodType<Request>,
        request: () => ({ text: form.text }),
        send: (cellarId, request) => addNote(cellarId, BATCH_ID, request as { text: string }),
        success: 'Note saved.',
        ...extra,
      } as OperationDialogOptions<Request, OperationResult>);
      return () => h('div');
    },
  });
  const { wrapper } = await mountInApp(Harness, `/c/${CELLAR_ID}/tasks`, { props: { modelValue: options.open ?? true } });
  return { api, form, wrapper, dialog: () => dialog };
}

describe('useOperationDialog: opening', () => {
  it('runs onOpen each time the dialog opens (and not while it is closed), clearing old messages', async () => {
    const onOpen = vi.fn();
    const { wrapper, form, dialog } = await mountDialog({ onOpen }, { open: false });
    expect(onOpen).not.toHaveBeenCalled();

    await wrapper.setProps({ modelValue: true });
    expect(onOpen).toHaveBeenCalledTimes(1);
    form.text = '';
    await dialog().submit();
    expect(dialog().errors.text).toBe('write something');

    await wrapper.setProps({ modelValue: false });
    await wrapper.setProps({ modelValue: true });
    expect(onOpen).toHaveBeenCalledTimes(2);
    expect(dialog().errors).toEqual({});
  });

  it('runs onOpen before the first render when the dialog is mounted open', async () => {
    const onOpen = vi.fn();
    await mountDialog({ onOpen }, { open: true });
    expect(onOpen).toHaveBeenCalledTimes(1);
  });
});

describe('useOperationDialog: checking before sending', () => {
  it('puts the shared schema’s message under the field and sends nothing', async () => {
    const { api, form, dialog } = await mountDialog();
    form.text = '   ';
    await dialog().submit();
    expect(dialog().errors).toEqual({ text: 'write something' });
    expect(api.callsTo('POST', notesPath)).toHaveLength(0);
  });

  it('says "fill this in" where zod would say "Invalid input: expected string"', async () => {
    const { api, dialog } = await mountDialog({ request: () => ({}) });
    await dialog().submit();
    expect(dialog().errors).toEqual({ text: 'fill this in' });
    expect(api.callsTo('POST', notesPath)).toHaveLength(0);
  });

  it('shows the dialog’s own rule’s message when `check` refuses, and sends nothing', async () => {
    const { api, dialog } = await mountDialog<{ text: string }>({
      check: (request) => (request.text.includes('bubbling') ? { text: 'Say more.' } : null),
    });
    await dialog().submit();
    expect(dialog().errors).toEqual({ text: 'Say more.' });
    expect(api.callsTo('POST', notesPath)).toHaveLength(0);
  });

  it('does nothing while the form has nothing to send', async () => {
    const { api, dialog, wrapper } = await mountDialog({ request: () => undefined });
    await dialog().submit();
    expect(api.callsTo('POST', notesPath)).toHaveLength(0);
    expect(dialog().errors).toEqual({});
    expect(wrapper.emitted()).not.toHaveProperty('done');
  });
});

describe('useOperationDialog: sending', () => {
  it('sends the checked request to the open cellar, says so, shows the result’s warnings, emits done and closes', async () => {
    const result = operationResult(['The sample jar was not sanitised.', 'Carboy 3 is nearly full.']);
    const { api, wrapper, dialog } = await mountDialog({}, { answer: { status: 201, body: result } });

    const shown = await notificationsFrom(async () => {
      await dialog().submit();
      await flushPromises();
    });

    // The note schema trims nothing here and adds no `at` for today.
    expect(api.callsTo('POST', notesPath).map((c) => c.body)).toEqual([{ text: 'Airlock bubbling every few seconds.' }]);
    expect(shown).toEqual(['Note saved.', 'The sample jar was not sanitised.', 'Carboy 3 is nearly full.']);
    expect(wrapper.emitted('done')).toEqual([[result]]);
    expect(wrapper.emitted('update:modelValue')).toEqual([[false]]);
    expect(dialog().busy.value).toBe(false);
  });

  it('is busy while the request is in flight', async () => {
    let answer!: (a: FakeAnswer) => void;
    const { api, dialog } = await mountDialog();
    api.on('POST', notesPath, () => new Promise<FakeAnswer>((resolve) => (answer = resolve)));
    const sending = dialog().submit();
    await vi.waitFor(() => expect(answer).toBeTypeOf('function'));
    expect(dialog().busy.value).toBe(true);
    answer({ status: 201, body: operationResult() });
    await sending;
    expect(dialog().busy.value).toBe(false);
  });

  it('builds the success message from the result and the request when given a function', async () => {
    const { dialog } = await mountDialog<{ text: string }>({
      success: (result, request) => `${result.batch.name}: ${request.text.length} characters noted.`,
    });
    const shown = await notificationsFrom(() => dialog().submit());
    expect(shown).toEqual(['Hedgerow melomel: 35 characters noted.']);
  });
});

describe('useOperationDialog: when the server refuses', () => {
  it('puts each field issue of a 400 under its field (list paths as dotted keys) and keeps the failure', async () => {
    const { wrapper, dialog } = await mountDialog(
      {},
      {
        answer: {
          status: 400,
          body: {
            error: 'validation',
            message: 'Check the highlighted fields.',
            issues: [
              { path: 'body.text', message: 'too long' },
              { path: 'body.to[0].volumeL', message: 'must be more than 0' },
            ],
          },
        },
      },
    );
    await dialog().submit();
    expect(dialog().errors).toEqual({ text: 'too long', 'to.0.volumeL': 'must be more than 0' });
    expect(dialog().failure.value).toMatchObject({ status: 400, message: 'Check the highlighted fields.' });
    expect(wrapper.emitted()).not.toHaveProperty('done');
    expect(wrapper.emitted()).not.toHaveProperty('update:modelValue');
  });

  it('reports an answer that does not match the shared schema as not understood', async () => {
    const { wrapper, dialog } = await mountDialog({}, { answer: { status: 201, body: { batch: null } } });
    await dialog().submit();
    expect(dialog().failure.value).toMatchObject({
      status: 0,
      code: 'unexpected',
      message: 'The answer from the server was not understood. Reload and try again.',
    });
    expect(wrapper.emitted()).not.toHaveProperty('done');
  });

  it('hands every outcome to afterSend: the failure, then null once it went through', async () => {
    const outcomes: (ApiError | null)[] = [];
    const { api, dialog } = await mountDialog(
      { afterSend: (failure) => outcomes.push(failure) },
      { answer: { status: 409, body: { error: 'conflict', message: 'Carboy 3 changed meanwhile.' } } },
    );
    await dialog().submit();
    api.on('POST', notesPath, { status: 201, body: operationResult() });
    await dialog().submit();
    expect(outcomes.map((o) => o && { status: o.status, message: o.message })).toEqual([
      { status: 409, message: 'Carboy 3 changed meanwhile.' },
      null,
    ]);
  });
});

describe('useOperationDialog: filling a vessel that is not sanitised', () => {
  const rackForm = () => ({ from: [{ vesselId: VESSEL_ID, expectedVersion: 4 }], to: [{ vesselId: TARGET_ID, volumeL: 19 }] });

  it('asks for a reason after the server’s refusal, then resends with it; a new opening forgets it', async () => {
    const { api, wrapper, dialog } = await mountDialog({
      schema: rackRequestSchema,
      request: rackForm,
      send: (cellarId, request) => rackBatch(cellarId, BATCH_ID, request),
      sanitiseOverride: true,
    });
    api.on('POST', rackingsPath, { status: 409, body: { error: 'conflict', message: 'Demijohn 2 is not sanitised.', overrideAllowed: true } });

    await dialog().submit();
    expect(dialog().overriding.value).toBe(true);
    expect(api.callsTo('POST', rackingsPath)[0].body).toEqual(rackForm());

    api.on('POST', rackingsPath, { status: 201, body: operationResult() });
    dialog().overrideReason.value = 'Sanitised it an hour ago.';
    await dialog().submit();
    expect(api.callsTo('POST', rackingsPath)[1].body).toEqual({ ...rackForm(), override: { reason: 'Sanitised it an hour ago.' } });

    await wrapper.setProps({ modelValue: false });
    await wrapper.setProps({ modelValue: true });
    expect(dialog().overriding.value).toBe(false);
    expect(dialog().overrideReason.value).toBe('');
  });

  it('checks the reason with the shared schema before resending', async () => {
    const { api, dialog } = await mountDialog({
      schema: rackRequestSchema,
      request: rackForm,
      send: (cellarId, request) => rackBatch(cellarId, BATCH_ID, request),
      sanitiseOverride: true,
    });
    api.on('POST', rackingsPath, { status: 409, body: { error: 'conflict', message: 'Demijohn 2 is not sanitised.', overrideAllowed: true } });
    await dialog().submit();
    dialog().overrideReason.value = 'ok';
    await dialog().submit();
    expect(dialog().errors['override.reason']).toBe('say why');
    expect(api.callsTo('POST', rackingsPath)).toHaveLength(1);
  });
});
