import type { BatchDetail } from '@shared/schemas/batch-detail';
import type { DeviceDay, DevicePoint } from '@shared/schemas/devices';
import type { JournalEntry } from '@shared/schemas/journal';

/**
 * The batch as its figures see it: journal readings and device points together, oldest first,
 * so the current gravity and the fermentation state follow the hydrometer.
 */
export function withDeviceReadings<B extends Pick<BatchDetail, 'readings'>>(batch: B, points: DevicePoint[]): B {
  if (points.length === 0) return batch;
  const fromDevice = points.map((p) => ({
    entryId: `device:${p.at}`,
    at: p.at,
    sg: p.sg,
    correctedSg: p.sg,
    temperatureC: p.temperatureC,
    ph: null,
  }));
  const readings = [...batch.readings, ...fromDevice].sort((a, b) => new Date(a.at).getTime() - new Date(b.at).getTime());
  return { ...batch, readings };
}

/** A row of the journal timeline: an entry, or a day of device readings summed up in one line. */
export type TimelineRow = { kind: 'entry'; entry: JournalEntry } | { kind: 'device-day'; day: DeviceDay };

/** The local day (YYYY-MM-DD) of a moment, in this browser's zone. */
const localDay = (iso: string) => {
  const d = new Date(iso);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
};

/**
 * Journal entries (newest first) with each day's device line placed above that day's entries.
 * @param days - device days, newest first
 */
export function timelineRows(entries: JournalEntry[], days: DeviceDay[]): TimelineRow[] {
  const rows: TimelineRow[] = [];
  let next = 0;
  for (const entry of entries) {
    const day = localDay(entry.occurredAt);
    while (next < days.length && days[next]!.day >= day) rows.push({ kind: 'device-day', day: days[next++]! });
    rows.push({ kind: 'entry', entry });
  }
  while (next < days.length) rows.push({ kind: 'device-day', day: days[next++]! });
  return rows;
}

/** The rows up to and including the `entryCount`-th journal entry (all of them when there are fewer). */
export function firstRows(rows: TimelineRow[], entryCount: number): TimelineRow[] {
  let seen = 0;
  const end = rows.findIndex((row) => row.kind === 'entry' && ++seen === entryCount);
  return end === -1 ? rows : rows.slice(0, end + 1);
}
