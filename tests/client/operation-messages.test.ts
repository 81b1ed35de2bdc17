import { describe, expect, it } from 'vitest';
import { defineComponent, h, reactive } from 'vue';
import type { ZodType } from 'zod';
import type { OperationResult } from '@shared/schemas/batch-detail';
import { noteRequestSchema } from '@shared/schemas/journal';
import { addNote } from '@/api/batches';
import { fieldWords, plainMessage } from '@/components/operations/useOperationDialog';
import { useOperationDialog, type OperationDialogOptions } from '@/components/operations/useOperationDialog';
import { fakeApi, type FakeAnswer } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, operationResult, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const notesPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/notes`;

describe('server messages in plain words', () => {
  it('names the field instead of the request path', () => {
    expect(plainMessage('body.startedOn: 2027-03-01 is in the future; start the batch on the day it is made.')).toBe(
      'Start date: 2027-03-01 is in the future; start the batch on the day it is made.',
    );
    expect(plainMessage('body.vessels.0.volumeL: at least 0.001 L')).toBe('Volume: at least 0.001 L');
    expect(plainMessage('body.og: a gravity is at least 0.980', 'Original gravity (OG)')).toBe('Original gravity (OG): a gravity is at least 0.980');
  });

  it('says zod’s stock phrases as a person would', () => {
    expect(plainMessage('Too small: expected number to be >=0')).toBe('must be at least 0');
    expect(plainMessage('Too big: expected number to be <=48')).toBe('must be at most 48');
    expect(plainMessage('Invalid input: expected number, received string')).toBe('enter a number');
    expect(plainMessage('This cellar already has a vessel called "Jug 1". Choose another name.')).toBe(
      'This cellar already has a vessel called "Jug 1". Choose another name.',
    );
  });

  it('turns field names into words', () => {
    expect(fieldWords('plannedVolumeL')).toBe('Planned volume');
    expect(fieldWords('body.to.0.volumeL')).toBe('Volume');
    expect(fieldWords('yeast.toleranceAbv')).toBe('Tolerance');
    expect(fieldWords('removeOn')).toBe('Take-out date');
  });
});

describe('a field’s message', () => {
  async function mountNoteDialog(answer: FakeAnswer) {
    const api = fakeApi();
    signIn(api);
    api.on('POST', notesPath, answer);
    const form = reactive({ text: '' });
    let dialog!: ReturnType<typeof useOperationDialog>;
    const Harness = defineComponent({
      props: { modelValue: { type: Boolean, required: true } },
      emits: ['update:modelValue', 'done'],
      setup(props, { emit }) {
        dialog = useOperationDialog({
          props,
          emit,
          schema: noteRequestSchema as unknown as ZodType<{ text: string }>,
          request: () => ({ text: form.text }),
          send: (cellarId, request) => addNote(cellarId, BATCH_ID, request),
          success: 'Note saved.',
        } as OperationDialogOptions<{ text: string }, OperationResult>);
        return () => h('div');
      },
    });
    const { wrapper } = await mountInApp(Harness, `/c/${CELLAR_ID}/tasks`, { props: { modelValue: true } });
    return { form, wrapper, dialog: () => dialog };
  }

  it('goes as soon as the field is changed', async () => {
    const { form, wrapper, dialog } = await mountNoteDialog({ status: 201, body: operationResult() });
    await dialog().submit();
    expect(dialog().errors.text).toBe('write something');
    form.text = 'Fixed it.';
    await wrapper.vm.$nextTick();
    expect(dialog().errors.text).toBeUndefined();
  });

  it('shows the server’s refusal in plain words under the field and in the banner', async () => {
    const { form, wrapper, dialog } = await mountNoteDialog({
      status: 400,
      body: {
        error: 'invalid_input',
        message: 'body.text: Too big: expected string to have <=4000 characters',
        issues: [{ path: 'body.text', message: 'Too big: expected string to have <=4000 characters' }],
      },
    });
    form.text = 'A note the server refuses.';
    await dialog().submit();
    expect(dialog().errors.text).toBe('at most 4000 characters');
    expect(dialog().failure.value?.message).toBe('Text: at most 4000 characters');
    form.text = 'A shorter note.';
    await wrapper.vm.$nextTick();
    expect(dialog().errors.text).toBeUndefined();
  });
});
