import dayjs from 'dayjs';

/** Today as YYYY-MM-DD on this device. */
export const todayIso = (): string => dayjs().format('YYYY-MM-DD');

/**
 * A number typed into an input, or null when the field is empty (so the schema says what is missing).
 * @param value - what `v-model.number` left: a number, '' or null
 */
export function numberOrNull(value: unknown): number | null {
  if (value === null || value === undefined || value === '') return null;
  const n = typeof value === 'number' ? value : Number(String(value).replace(',', '.'));
  return Number.isFinite(n) ? n : null;
}

/**
 * When an operation happened, for the `at` of a request: omitted for today (the server uses
 * the moment it records), midday of the chosen day otherwise, with this device's offset.
 * @param date - YYYY-MM-DD
 */
export function occurredAt(date: string): string | undefined {
  if (!date || date === todayIso()) return undefined;
  return dayjs(`${date}T12:00:00`).format();
}

/** A batch-detail stage as the racking arithmetic names it (what is left behind differs). */
export function rackingStageOf(stage: string): 'primary' | 'secondary' | 'ageing' {
  if (stage === 'primary') return 'primary';
  if (stage === 'secondary') return 'secondary';
  return 'ageing';
}
