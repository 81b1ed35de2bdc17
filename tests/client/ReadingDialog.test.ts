import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import ReadingDialog from '@/components/operations/ReadingDialog.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { readingContextOfBatch } from '@/components/operations/reading-context';
import { BATCH_ID, CELLAR_ID, ENTRY_ID, VESSEL_ID, batchDetail, readingResult, signIn } from './support/fixtures';
import { fieldMessage, mountInApp, notificationsFrom, pick } from './support/mount-in-app';

const batchPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}`;
const readingsPath = `${batchPath}/readings`;

describe('ReadingDialog', () => {
  let api: FakeApi;

  beforeEach(() => {
    api = fakeApi();
    signIn(api);
    api.on('GET', batchPath, { body: batchDetail() });
  });

  async function openDialog() {
    const mounted = await mountInApp(ReadingDialog, `/c/${CELLAR_ID}/tasks`, {
      props: { modelValue: true, batchId: BATCH_ID, context: readingContextOfBatch(batchDetail()) },
    });
    await vi.waitFor(() => pick('[data-test=reading-sg]'));
    return mounted;
  }
  const type = (selector: string, text: string) => new DOMWrapper(pick<HTMLInputElement>(selector)).setValue(text);
  async function submit(): Promise<void> {
    pick('[data-test=reading-submit]').click();
    await flushPromises();
  }

  it('asks the server for nothing as it opens (the page’s batch is its context) and sends the reading as typed, from the batch’s only vessel', async () => {
    api.on('POST', readingsPath, { status: 201, body: readingResult() });
    await openDialog();
    expect(api.calls.filter((c) => c.path !== '/api/auth/me')).toEqual([]);

    await type('[data-test=reading-sg]', '1.050');
    await type('[data-test=reading-temperature]', '25');
    await type('[data-test=reading-ph]', '3.4');
    await submit();

    const posted = api.callsTo('POST', readingsPath);
    expect(posted).toHaveLength(1);
    // Today's reading has no `at`: the server records the moment it receives it.
    expect(posted[0].body).toEqual({ sg: 1.05, temperatureC: 25, calibrationC: 20, ph: 3.4, vesselId: VESSEL_ID });
  });

  it('after the server records it, says so, shows each warning, hands the result on and closes', async () => {
    api.on('POST', readingsPath, { status: 201, body: readingResult(['Carboy 3 has 2 L of headspace.']) });
    const { wrapper } = await openDialog();
    await type('[data-test=reading-sg]', '1.050');

    expect(await notificationsFrom(submit)).toEqual(['Reading 1.050 saved.', 'Carboy 3 has 2 L of headspace.']);
    const done = wrapper.emitted('done') as [{ entryId: string; stage: string }][];
    expect(done).toHaveLength(1);
    expect(done[0][0]).toMatchObject({ entryId: ENTRY_ID, stage: 'primary' });
    expect(wrapper.emitted('update:modelValue')).toEqual([[false]]);
  });

  it('names a missing gravity under its field and sends nothing', async () => {
    const { wrapper } = await openDialog();
    await submit();

    expect(fieldMessage('[data-test=reading-sg]')).toBe('enter a gravity such as 1.105');
    expect(api.callsTo('POST', readingsPath)).toHaveLength(0);
    expect(wrapper.emitted('done')).toBeUndefined();
  });

  it('gives the temperature limit in °F to someone who types °F, and sends nothing', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    try {
      await openDialog();
      await type('[data-test=reading-sg]', '1.050');
      // 113 °F is 45 °C, past the schema's 40 °C; 40 °C is 104 °F (NIST SP 811, B.9: t/°F = 1.8 · t/°C + 32).
      await type('[data-test=reading-temperature]', '113');
      await submit();
      expect(fieldMessage('[data-test=reading-temperature]')).toBe('at most 104 °F');
      expect(api.callsTo('POST', readingsPath)).toHaveLength(0);
    } finally {
      localStorage.removeItem('cellarwright.units');
    }
  });

  it('shows the field message of a 400 under that field, keeps the dialog open and emits nothing', async () => {
    api.on('POST', readingsPath, {
      status: 400,
      body: { error: 'validation', message: 'Check the highlighted fields.', issues: [{ path: 'body.ph', message: 'pH is at least 2.5' }] },
    });
    const { wrapper } = await openDialog();
    await type('[data-test=reading-sg]', '1.050');
    await type('[data-test=reading-ph]', '3.1');
    await submit();

    expect(api.callsTo('POST', readingsPath)).toHaveLength(1);
    expect(fieldMessage('[data-test=reading-ph]')).toBe('pH is at least 2.5');
    expect(pick('[data-test=reading-error]').textContent).toContain('Check the highlighted fields.');
    expect(pick('[data-test=reading-dialog]')).toBeTruthy();
    expect(wrapper.emitted('done')).toBeUndefined();
    expect(wrapper.emitted('update:modelValue')).toBeUndefined();
  });

  it('in US units takes the temperature in °F and sends it in °C, calibrated at 60 °F', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    api.on('POST', readingsPath, { status: 201, body: readingResult() });
    await openDialog();
    const temperatureField = pick('[data-test=reading-temperature]').closest('.q-field');
    expect(temperatureField?.querySelector('.q-field__label')?.textContent).toBe('Temperature');
    expect(temperatureField?.querySelector('.q-field__suffix')?.textContent).toBe('°F');
    expect(pick('[data-test=reading-calibration]').closest('.q-field')?.textContent).toContain('60 °F');

    await type('[data-test=reading-sg]', '1.020');
    await type('[data-test=reading-temperature]', '68');
    await submit();

    // 68 °F = (68 − 32) × 5/9 = 20 °C, by the definition of the two scales.
    expect(api.callsTo('POST', readingsPath)[0].body).toMatchObject({ sg: 1.02, temperatureC: 20, calibrationC: 15.56 });
  });
});
