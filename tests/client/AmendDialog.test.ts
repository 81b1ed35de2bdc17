import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises } from '@vue/test-utils';
import type { JournalEntry } from '@shared/schemas/journal';
import AmendDialog from '@/components/operations/AmendDialog.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, ENTRY_ID, VESSEL_ID, operationResult, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

const amendPath = `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/journal/${ENTRY_ID}/amendments`;

/** A started entry of 18.927 L: 5 US gallons, at 3.785411784 L to the gallon (NIST Handbook 44, Appendix C). */
const started: JournalEntry = {
  id: ENTRY_ID,
  batchId: BATCH_ID,
  occurredAt: '2026-11-01T12:00:00.000Z',
  recordedAt: '2026-11-01T12:00:00.000Z',
  author: { id: VESSEL_ID, name: 'Hal Hand' },
  amendsEntryId: null,
  amendedBy: [],
  payload: { kind: 'started', volumeL: 18.927, og: 1.1, vessels: [], parents: [], override: null },
};
const current = { og: 1.1, startedOn: '2026-11-01', volumeL: 18.927, yeastName: 'Test wine yeast', yeastToleranceAbv: 14 };

describe('AmendDialog, the start’s volume', () => {
  let api: FakeApi;

  beforeEach(() => {
    api = fakeApi();
    signIn(api);
    api.on('POST', amendPath, { status: 201, body: operationResult() });
  });

  async function openDialog() {
    await mountInApp(AmendDialog, `/c/${CELLAR_ID}/tasks`, {
      props: { modelValue: true, batchId: BATCH_ID, entry: started, currentValues: current },
    });
    await vi.waitFor(() => pick('[data-test=amend-volumeL]'));
  }
  const type = (selector: string, text: string) => new DOMWrapper(pick<HTMLInputElement>(selector)).setValue(text);
  async function save(): Promise<void> {
    await type('[data-test=amend-reason]', 'measured the carboy again');
    pick('[data-test=amend-submit]').click();
    await flushPromises();
  }
  /** What the first correction sent changed (its reason is always the one `save` typed). */
  const sentChanges = () => {
    const body = api.callsTo('POST', amendPath)[0].body as { reason: string; changes: unknown };
    expect(body.reason).toBe('measured the carboy again');
    return body.changes;
  };

  it('in US units shows the volume in US gallons and sends the correction in litres', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    await openDialog();
    expect(pick<HTMLInputElement>('[data-test=amend-volumeL]').value).toBe('5');
    expect(pick('[data-test=amend-volumeL]').closest('.q-field')?.textContent).toContain('US gal');

    await type('[data-test=amend-volumeL]', '4');
    await save();
    // 4 US gal × 3.785411784 L = 15.141647… L, kept to the 3 decimals the record holds.
    expect(sentChanges()).toEqual({ volumeL: 15.142 });
  });

  it('sends no volume when only another field changed (the gallons shown round, the litres stored do not)', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    await openDialog();
    await type('[data-test=amend-og]', '1.105');
    await save();
    expect(sentChanges()).toEqual({ og: 1.105 });
  });

  it('shows and takes the start date in the user’s date style, and sends it as a calendar date', async () => {
    localStorage.setItem('cellarwright.dateStyle', 'd-mmm-yyyy');
    await openDialog();
    expect(pick<HTMLInputElement>('[data-test=amend-startedOn]').value).toBe('1 Nov 2026');
    await type('[data-test=amend-startedOn]', '3 Nov 2026');
    await save();
    expect(sentChanges()).toEqual({ startedOn: '2026-11-03' });
  });

  it('in metric units shows and sends litres', async () => {
    localStorage.setItem('cellarwright.units', 'metric');
    await openDialog();
    expect(pick<HTMLInputElement>('[data-test=amend-volumeL]').value).toBe('18.93');
    await type('[data-test=amend-volumeL]', '18.5');
    await save();
    expect(sentChanges()).toEqual({ volumeL: 18.5 });
  });
});

describe('AmendDialog, a reading’s sample temperature', () => {
  let api: FakeApi;
  /** A reading taken at 20 °C, which is 68 °F (NIST SP 811, B.9: t/°F = 1.8 · t/°C + 32). */
  const reading: JournalEntry = {
    ...started,
    payload: { kind: 'reading', sg: 1.05, correctedSg: 1.05, temperatureC: 20, calibrationC: 20, ph: null, vesselId: null },
  };

  beforeEach(() => {
    api = fakeApi();
    signIn(api);
    api.on('POST', amendPath, { status: 201, body: operationResult() });
  });

  it('in US units shows it in °F, with the unit beside the figure, and sends the correction in °C', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    await mountInApp(AmendDialog, `/c/${CELLAR_ID}/tasks`, { props: { modelValue: true, batchId: BATCH_ID, entry: reading } });
    await vi.waitFor(() => pick('[data-test=amend-temperatureC]'));
    const field = pick('[data-test=amend-temperatureC]').closest('.q-field')!;
    expect(pick<HTMLInputElement>('[data-test=amend-temperatureC]').value).toBe('68');
    expect(field.querySelector('.q-field__label')?.textContent).toBe('Sample temperature');
    expect(field.querySelector('.q-field__suffix')?.textContent).toBe('°F');

    await new DOMWrapper(pick<HTMLInputElement>('[data-test=amend-temperatureC]')).setValue('77');
    await new DOMWrapper(pick<HTMLInputElement>('[data-test=amend-reason]')).setValue('the thermometer was in the sun');
    pick('[data-test=amend-submit]').click();
    await flushPromises();
    // 77 °F = (77 − 32) × 5/9 = 25 °C.
    expect(api.callsTo('POST', amendPath)[0].body).toMatchObject({ changes: { temperatureC: 25 } });
  });
});
