import dayjs from 'dayjs';
import { ageInDays as calendarAge } from '@shared/calc';
import { BATCH_KIND_LABELS, type BatchKind } from '@shared/schemas/batches';

/** "Melomel" rather than "Melomel (fruit mead)" where space is short. */
export const shortKind = (kind: string) => (BATCH_KIND_LABELS[kind as BatchKind] ?? kind).replace(/\s*\(.*\)$/, '');

/** Whole days since a local date by the cellar's one age rule (shared/calc ageInDays), never negative. */
export function ageInDays(since: string, now: Date = new Date()): number {
  try {
    return calendarAge(since, dayjs(now).format('YYYY-MM-DD'));
  } catch {
    return 0;
  }
}

/** "1 day", "45 days". */
export const daysWords = (days: number) => `${days} ${days === 1 ? 'day' : 'days'}`;
