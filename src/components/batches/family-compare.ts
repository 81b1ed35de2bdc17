import dayjs from 'dayjs';
import { ageInDays } from '@shared/calc';
import { effectivePayload } from '@shared/domain/journal';
import type { BatchDetail } from '@shared/schemas/batch-detail';
import type { JournalEntry, JournalPayload } from '@shared/schemas/journal';

/** How a member of a family came to be. */
export type FamilyRole = 'must' | 'split' | 'blend';

/** A must started from ingredients; a split has one parent; a blend several. */
export function familyRole(member: Pick<BatchDetail, 'parents'>): FamilyRole {
  return member.parents.length === 0 ? 'must' : member.parents.length === 1 ? 'split' : 'blend';
}

/** What was done to a batch that the Compare view sets side by side. */
const WORK_KINDS: ReadonlySet<JournalPayload['kind']> = new Set([
  'addition',
  'removed',
  'racked',
  'topped-up',
  'split',
  'blended',
  'degassed',
  'bottled',
  'emptied',
]);

/** The age of an entry: whole days from the must's start to the entry's local day (the cellar's one age rule). */
const ageOf = (member: Pick<BatchDetail, 'startedOn'>, occurredAt: string) => ageInDays(member.startedOn, dayjs(occurredAt).format('YYYY-MM-DD'));

export interface AlignedEntry {
  entry: JournalEntry;
  payload: JournalPayload;
}

/** One day of age, and what each member had done on it. */
export interface AgeRow {
  ageDays: number;
  /** member id → its entries on that day of age */
  byMember: Map<string, AlignedEntry[]>;
}

/** Entries of the chosen kinds of every member, by age (days since the must started), oldest age first. */
function alignByAge(members: readonly BatchDetail[], wanted: (kind: JournalPayload['kind']) => boolean): AgeRow[] {
  const rows = new Map<number, AgeRow>();
  for (const member of members) {
    for (const entry of member.journal) {
      if (!wanted(entry.payload.kind)) continue;
      const ageDays = ageOf(member, entry.occurredAt);
      const row: AgeRow = rows.get(ageDays) ?? { ageDays, byMember: new Map() };
      const list: AlignedEntry[] = row.byMember.get(member.id) ?? [];
      list.push({ entry, payload: effectivePayload(entry, member.journal) });
      row.byMember.set(
        member.id,
        list.sort((a, b) => a.entry.occurredAt.localeCompare(b.entry.occurredAt)),
      );
      rows.set(ageDays, row);
    }
  }
  return [...rows.values()].sort((a, b) => a.ageDays - b.ageDays);
}

/**
 * What was done to each member (additions, removals, rackings, top-ups, splits, blends…),
 * aligned by age so the same day of the must's life sits on one row.
 */
export const workByAge = (members: readonly BatchDetail[]) => alignByAge(members, (kind) => WORK_KINDS.has(kind));

/** Length of an age window for tastings: tastings within the same month of age sit on one row. */
export const TASTING_WINDOW_DAYS = 30;

export interface TastingRow {
  /** First and last day of age of the window. */
  fromDay: number;
  toDay: number;
  byMember: Map<string, AlignedEntry[]>;
}

/** The tastings of each member, in windows of TASTING_WINDOW_DAYS of age, so tastings at the same age share a row. */
export function tastingsByAge(members: readonly BatchDetail[]): TastingRow[] {
  const rows = new Map<number, TastingRow>();
  for (const day of alignByAge(members, (kind) => kind === 'tasted')) {
    const window = Math.floor(day.ageDays / TASTING_WINDOW_DAYS);
    const row: TastingRow = rows.get(window) ?? {
      fromDay: window * TASTING_WINDOW_DAYS,
      toDay: (window + 1) * TASTING_WINDOW_DAYS - 1,
      byMember: new Map(),
    };
    for (const [memberId, entries] of day.byMember) row.byMember.set(memberId, [...(row.byMember.get(memberId) ?? []), ...entries]);
    rows.set(window, row);
  }
  return [...rows.values()].sort((a, b) => a.fromDay - b.fromDay);
}
