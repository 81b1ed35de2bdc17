import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import ReadingDialog from '@/components/operations/ReadingDialog.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { readingContextOfBatch } from '@/components/operations/reading-context';
import { BATCH_ID, CELLAR_ID, batchDetail, readingResult, signIn } from './support/fixtures';
import { fieldMessage, mountInApp, pick } from './support/mount-in-app';

const batchPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}`;
const readingsPath = `${batchPath}/readings`;
const READING_ID = '2b3c4d5e-6f70-4a81-9b2c-3d4e5f607182';

describe('ReadingDialog notes', () => {
  let api: FakeApi;
  beforeEach(() => {
    document.body.innerHTML = '';
    api = fakeApi();
    signIn(api);
  });
  const batch = batchDetail({
    readings: [{ entryId: READING_ID, at: '2026-02-20T10:00:00.000Z', sg: 1.012, correctedSg: 1.012, temperatureC: null, ph: null }],
  });

  async function open() {
    await mountInApp(ReadingDialog, `/c/${CELLAR_ID}/tasks`, {
      props: { modelValue: true, batchId: BATCH_ID, context: readingContextOfBatch(batch) },
    });
    await vi.waitFor(() => pick('[data-test=reading-sg]'));
  }
  const type = (text: string) => new DOMWrapper(pick<HTMLInputElement>('[data-test=reading-sg]')).setValue(text);

  it('takes gravity typed in points, says how it read it and sends the SG', async () => {
    api.on('POST', readingsPath, { status: 201, body: readingResult() });
    await open();
    await type('1010');
    expect(fieldMessage('[data-test=reading-sg]')).toBe('read as 1.010');
    pick('[data-test=reading-submit]').click();
    await flushPromises();
    expect(api.callsTo('POST', readingsPath)[0]!.body).toMatchObject({ sg: 1.01 });
  });

  it('says before saving that a rise over the last reading may be a new ferment or a misread', async () => {
    await open();
    await type('1.016');
    expect(pick('[data-test=reading-rise]').textContent).toContain('Gravity rose from 1.012 to 1.016');
    await type('1.010');
    expect(document.querySelector('[data-test=reading-rise]')).toBeNull();
  });
});

describe('ReadingDialog preview', () => {
  beforeEach(() => {
    document.body.innerHTML = '';
    signIn(fakeApi());
  });
  const batch = batchDetail({ og: 1.1, readings: [] });

  async function typeReading(sg: string, temperatureC?: string) {
    await mountInApp(ReadingDialog, `/c/${CELLAR_ID}/tasks`, {
      props: { modelValue: true, batchId: BATCH_ID, context: readingContextOfBatch(batch) },
    });
    await vi.waitFor(() => pick('[data-test=reading-sg]'));
    await new DOMWrapper(pick<HTMLInputElement>('[data-test=reading-sg]')).setValue(sg);
    if (temperatureC) await new DOMWrapper(pick<HTMLInputElement>('[data-test=reading-temperature]')).setValue(temperatureC);
    return pick('[data-test=reading-preview]').textContent ?? '';
  }

  it('shows the reading as typed when no temperature is given', async () => {
    expect(await typeReading('1.050')).toMatch(/^Corrected gravity 1\.050, /);
  });

  it('corrects a warm sample to the 20 °C calibration and gives the alcohol so far', async () => {
    const text = await typeReading('1.050', '25');
    // CRC Handbook water densities (values from memory): 1.050 × 0.99821 / 0.99705 = 1.05122.
    expect(text).toMatch(/^Corrected gravity 1\.051, /);
    // Common practice, (OG − SG) × 131.25: (1.100 − 1.0512) × 131.25 ≈ 6.4 %; the Balling formula reads a little
    // higher at this strength, so a bracket, not the code's own figure.
    const abv = Number(/about (\d+\.\d) % ABV so far \(Balling\)/.exec(text)?.[1]);
    expect(abv).toBeGreaterThanOrEqual(6.2);
    expect(abv).toBeLessThanOrEqual(7.0);
  });
});
