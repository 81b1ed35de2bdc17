import { DOMWrapper, flushPromises } from '@vue/test-utils';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { Device, DeviceDay } from '@shared/schemas/devices';
import type { JournalEntry } from '@shared/schemas/journal';
import DeviceDayItem from '@/components/devices/DeviceDayItem.vue';
import DevicesCard from '@/components/devices/DevicesCard.vue';
import { firstRows, timelineRows, withDeviceReadings } from '@/components/devices/device-series';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, ENTRY_ID, VESSEL_ID, signIn, vessel } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

const entry = (id: string, occurredAt: string): JournalEntry => ({
  id,
  batchId: BATCH_ID,
  occurredAt,
  recordedAt: occurredAt,
  author: { id: VESSEL_ID, name: 'Hal Hand' },
  amendsEntryId: null,
  amendedBy: [],
  payload: { kind: 'note', text: 'A note' },
});
const day = (date: string): DeviceDay => ({
  day: date,
  count: 96,
  firstSg: 1.02,
  lastSg: 1.012,
  minTemperatureC: 18,
  maxTemperatureC: 19,
  line: 'Hydrometer: 96 readings, 1.020 → 1.012, 18–19 °C',
});

describe('device readings beside the journal', () => {
  it('puts each day line above that day’s entries, newest first, and keeps days without entries', () => {
    const entries = [entry('a', '2026-11-05T12:00:00'), entry('b', '2026-11-03T12:00:00')];
    const rows = timelineRows(entries, [day('2026-11-06'), day('2026-11-05'), day('2026-11-04'), day('2026-11-01')]);
    expect(rows.map((r) => (r.kind === 'entry' ? r.entry.id : r.day.day))).toEqual([
      '2026-11-06',
      '2026-11-05',
      'a',
      '2026-11-04',
      'b',
      '2026-11-01',
    ]);
  });

  it('shows rows up to the n-th entry, and all when there are fewer', () => {
    const rows = timelineRows([entry('a', '2026-11-05T12:00:00'), entry('b', '2026-11-03T12:00:00')], [day('2026-11-04'), day('2026-11-01')]);
    expect(firstRows(rows, 1).map((r) => r.kind)).toEqual(['entry']);
    expect(firstRows(rows, 2)).toHaveLength(3);
    expect(firstRows(rows, 5)).toHaveLength(4);
  });

  it('lets the figures see device points as readings, in time order', () => {
    const batch = { readings: [{ entryId: ENTRY_ID, at: '2026-11-02T08:00:00.000Z', sg: 1.05, correctedSg: 1.051, temperatureC: null, ph: null }] };
    const merged = withDeviceReadings(batch, [
      { at: '2026-11-03T08:00:00.000Z', sg: 1.04, temperatureC: 19, count: 4, resolution: 'hour' },
      { at: '2026-11-01T08:00:00.000Z', sg: 1.06, temperatureC: 19, count: 48, resolution: 'day' },
    ]);
    expect(merged.readings.map((r) => [r.at.slice(0, 10), r.correctedSg])).toEqual([
      ['2026-11-01', 1.06],
      ['2026-11-02', 1.051],
      ['2026-11-03', 1.04],
    ]);
    expect(withDeviceReadings(batch, [])).toBe(batch);
  });
});

describe('a day of device readings in the journal', () => {
  beforeEach(() => {
    localStorage.clear();
    signIn(fakeApi());
  });

  it('is worded in the units this person chose, not the cellar’s the answer came in', async () => {
    localStorage.setItem('cellarwright.units', 'us');
    await mountInApp(DeviceDayItem, `/c/${CELLAR_ID}/batches/${BATCH_ID}`, { props: { day: day('2026-11-05') } });
    // 18 °C = 64.4 °F, 19 °C = 66.2 °F (NIST SP 811, B.9: t/°F = 1.8 · t/°C + 32).
    expect(pick('[data-test=journal-device-day]').textContent).toContain('Hydrometer: 96 readings, 1.020 → 1.012, 64–66 °F');
  });

  it('stays in °C where nobody chose otherwise and the cellar is metric', async () => {
    await mountInApp(DeviceDayItem, `/c/${CELLAR_ID}/batches/${BATCH_ID}`, { props: { day: day('2026-11-05') } });
    expect(pick('[data-test=journal-device-day]').textContent).toContain('Hydrometer: 96 readings, 1.020 → 1.012, 18–19 °C');
  });
});

describe('Settings → Hydrometers', () => {
  let api: FakeApi;
  const devicesPath = `/api/cellars/${CELLAR_ID}/devices`;
  const device: Device = {
    id: '0f1e2d3c-4b5a-4968-8776-655443322110',
    name: 'Fermenter float',
    vessel: { id: VESSEL_ID, name: 'Fermenter 1' },
    batch: { id: BATCH_ID, name: 'Test melomel' },
    tokenEnd: 'Ab12',
    createdAt: '2026-11-01T12:00:00.000Z',
    revokedAt: null,
    lastReadingAt: null,
  };

  beforeEach(() => {
    api = fakeApi();
    signIn(api, 'keeper');
    api.on('GET', devicesPath, { body: [] });
    api.on('GET', `/api/cellars/${CELLAR_ID}/vessels`, {
      body: {
        items: [vessel()],
        total: 1,
        page: 1,
        pageSize: 200,
      },
    });
  });

  it('adds a device to a vessel and shows its token once, with a curl line that uses it', async () => {
    const token = 'cwd_0123456789abcdefghijklmnopqrstuvwxyzABCDEFG';
    api.on('POST', devicesPath, { status: 201, body: { device, token } });
    await mountInApp(DevicesCard, `/c/${CELLAR_ID}/settings`, { props: { cellarId: CELLAR_ID } });
    expect(pick('[data-test=devices-empty]').textContent).toContain('No hydrometers yet');
    pick('[data-test=device-add]').click();
    await vi.waitFor(() => pick('[data-test=device-name]'));
    await new DOMWrapper(pick<HTMLInputElement>('[data-test=device-name]')).setValue('Fermenter float');
    pick('[data-test=device-vessel]').click();
    await vi.waitFor(() => pick('.q-menu .q-item'));
    pick('.q-menu .q-item').click();
    await flushPromises();
    pick('[data-test=device-submit]').click();
    await vi.waitFor(() => pick('[data-test=device-token]'));
    expect(api.callsTo('POST', devicesPath)[0].body).toEqual({ name: 'Fermenter float', vesselId: VESSEL_ID });
    expect(pick('[data-test=device-token]').textContent).toBe(token);
    expect(pick('[data-test=device-curl]').textContent).toContain(`Authorization: Bearer ${token}`);
    expect(pick('[data-test=device-curl]').textContent).toContain('/api/ingest/readings');
  });
});
