import { describe, expect, it } from 'vitest';
import type { JournalPayload } from '../../../shared/schemas/journal';
import { amendedPayloads, compareEntries, effectivePayload, mergedChanges, readingsView, type JournalRecord } from '../../../shared/domain/journal';

// ---- Invented journal entries ----------------------------------------------------------------

/** Ids that sort in the order of their number ('…01' < '…02'). */
const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const at = (hhmm: string) => `2026-03-14T${hhmm}:00.000Z`;

function entry(
  n: number,
  payload: JournalPayload,
  times: { occurred?: string | Date; recorded?: string | Date } = {},
  amends: number | null = null,
): JournalRecord {
  return {
    id: id(n),
    occurredAt: times.occurred ?? at('10:00'),
    recordedAt: times.recorded ?? at('10:00'),
    amendsEntryId: amends === null ? null : id(amends),
    payload,
  };
}

const readingPayload = (sg: number, extra: Partial<Extract<JournalPayload, { kind: 'reading' }>> = {}): JournalPayload => ({
  kind: 'reading',
  sg,
  temperatureC: null,
  calibrationC: 20,
  correctedSg: sg,
  ph: null,
  vesselId: null,
  ...extra,
});
const notePayload = (text: string): JournalPayload => ({ kind: 'note', text });
const amendmentPayload = (changes: Record<string, unknown>): JournalPayload => ({ kind: 'amendment', reason: 'misread it', changes });

/** An amendment `n` of entry `target`, recorded at `recorded`. */
const amendment = (n: number, target: number, changes: Record<string, unknown>, recorded: string, occurred = at('09:00')) =>
  entry(n, amendmentPayload(changes), { occurred, recorded }, target);

/** Every order of `items` (n! of them; keep n small). */
function permutations<T>(items: readonly T[]): T[][] {
  if (items.length <= 1) return [[...items]];
  return items.flatMap((item, i) => permutations([...items.slice(0, i), ...items.slice(i + 1)]).map((rest) => [item, ...rest]));
}

// ---- The order of entries --------------------------------------------------------------------

describe('compareEntries', () => {
  const sign = (a: JournalRecord, b: JournalRecord) => Math.sign(compareEntries(a, b));

  it('orders by when it happened first, even against the recording time', () => {
    const early = entry(2, notePayload('early'), { occurred: at('09:00'), recorded: at('12:00') });
    const late = entry(1, notePayload('late'), { occurred: at('09:01'), recorded: at('09:01') });
    expect(sign(early, late)).toBe(-1);
    expect(sign(late, early)).toBe(1);
  });

  it('tells apart moments a millisecond apart, given as Dates', () => {
    const a = entry(2, notePayload('a'), { occurred: new Date('2026-03-14T10:00:00.001Z') });
    const b = entry(1, notePayload('b'), { occurred: new Date('2026-03-14T10:00:00.002Z') });
    expect(sign(a, b)).toBe(-1);
    expect(sign(b, a)).toBe(1);
  });

  it('orders entries that happened at the same moment by when they were recorded', () => {
    const first = entry(2, notePayload('first'), { occurred: at('10:00'), recorded: at('10:05') });
    const second = entry(1, notePayload('second'), { occurred: at('10:00'), recorded: at('10:06') });
    expect(sign(first, second)).toBe(-1);
    expect(sign(second, first)).toBe(1);
  });

  it('orders entries with equal timestamps by id', () => {
    const a = entry(1, notePayload('a'));
    const b = entry(2, notePayload('b'));
    expect(sign(a, b)).toBe(-1);
    expect(sign(b, a)).toBe(1);
    expect(compareEntries(a, { ...a })).toBe(0);
  });

  it('treats a Date and an ISO string of the same moment as equal', () => {
    const asDate = entry(2, notePayload('a'), { occurred: new Date(at('10:00')), recorded: new Date(at('10:00')) });
    const asText = entry(1, notePayload('b'), { occurred: at('10:00'), recorded: at('10:00') });
    expect(sign(asDate, asText)).toBe(1); // tie on both times, so the id decides
  });

  it('gives one order for any order of input', () => {
    const entries = [
      entry(3, notePayload('c'), { occurred: at('10:00'), recorded: at('10:00') }),
      entry(1, notePayload('a'), { occurred: at('10:00'), recorded: at('10:00') }),
      entry(2, notePayload('b'), { occurred: at('09:00'), recorded: at('11:00') }),
      entry(4, notePayload('d'), { occurred: at('10:00'), recorded: at('09:59') }),
    ];
    for (const order of permutations(entries)) {
      expect(order.sort(compareEntries).map((e) => e.payload.kind === 'note' && e.payload.text)).toEqual(['b', 'd', 'a', 'c']);
    }
  });
});

// ---- Merging amendments ----------------------------------------------------------------------

describe('mergedChanges', () => {
  it('applies amendments in the order they were recorded: the later one wins field by field', () => {
    const journal = [
      entry(1, readingPayload(1.05)),
      amendment(2, 1, { sg: 1.01, temperatureC: 18 }, at('11:00')),
      amendment(3, 1, { sg: 1.02, ph: 3.4 }, at('12:00')),
    ];
    expect(mergedChanges(journal)).toEqual(new Map([[id(1), { sg: 1.02, temperatureC: 18, ph: 3.4 }]]));
  });

  it('goes by recording time, not by the time the amendment says it happened', () => {
    const journal = [
      entry(1, readingPayload(1.05)),
      amendment(2, 1, { sg: 1.01 }, at('12:00'), at('08:00')),
      amendment(3, 1, { sg: 1.02 }, at('11:00'), at('13:00')),
    ];
    expect(mergedChanges(journal).get(id(1))).toEqual({ sg: 1.01 });
  });

  it('breaks a tie in recording time by id (the larger id applies last)', () => {
    const journal = [entry(1, readingPayload(1.05)), amendment(7, 1, { sg: 1.07 }, at('11:00')), amendment(4, 1, { sg: 1.04 }, at('11:00'))];
    expect(mergedChanges(journal).get(id(1))).toEqual({ sg: 1.07 });
  });

  it('gives the same result for every order of input', () => {
    const journal = [
      entry(1, readingPayload(1.05)),
      amendment(5, 1, { sg: 1.03 }, at('11:00')),
      amendment(4, 1, { sg: 1.04, ph: 3.3 }, at('11:00')),
      amendment(2, 1, { temperatureC: 21 }, at('12:00')),
      amendment(3, 1, { ph: 3.5 }, at('10:30')),
    ];
    for (const order of permutations(journal)) {
      expect(mergedChanges(order)).toEqual(new Map([[id(1), { sg: 1.03, ph: 3.3, temperatureC: 21 }]]));
    }
  });

  it('keeps the changes of different entries apart', () => {
    const journal = [
      entry(1, readingPayload(1.05)),
      entry(2, notePayload('Rakc tomorrow')),
      amendment(3, 1, { sg: 1.049 }, at('11:00')),
      amendment(4, 2, { text: 'Rack tomorrow' }, at('11:01')),
    ];
    expect(mergedChanges(journal)).toEqual(
      new Map<string, Record<string, unknown>>([
        [id(1), { sg: 1.049 }],
        [id(2), { text: 'Rack tomorrow' }],
      ]),
    );
  });

  it('ignores an amendment that points nowhere and an entry of another kind that points somewhere', () => {
    const journal = [
      entry(1, readingPayload(1.05)),
      entry(2, amendmentPayload({ sg: 1.0 }), { recorded: at('11:00') }, null),
      entry(3, notePayload('not an amendment'), { recorded: at('11:00') }, 1),
    ];
    expect(mergedChanges(journal)).toEqual(new Map());
  });
});

describe('amendedPayloads', () => {
  it('gives every entry its payload as corrected, and unamended entries their own payload', () => {
    const note = entry(2, notePayload('Smells of pear'));
    const journal = [entry(1, readingPayload(1.05, { temperatureC: 24 })), note, amendment(3, 1, { sg: 1.04, correctedSg: 1.041 }, at('11:00'))];
    const amended = amendedPayloads(journal);
    expect(amended.get(id(1))).toEqual(readingPayload(1.04, { temperatureC: 24, correctedSg: 1.041 }));
    expect(amended.get(id(2))).toBe(note.payload);
    expect(amended.get(id(3))).toBe(journal[2]!.payload);
    expect([...amended.keys()]).toEqual([id(1), id(2), id(3)]);
  });
});

describe('effectivePayload', () => {
  const reading = entry(1, readingPayload(1.05));
  const other = entry(2, readingPayload(1.06));

  it('applies only the amendments of the given entry, the later recorded last', () => {
    const journal = [
      reading,
      other,
      amendment(3, 1, { sg: 1.03 }, at('12:00')),
      amendment(4, 1, { sg: 1.02, ph: 3.6 }, at('11:00')),
      amendment(5, 2, { sg: 1.0 }, at('13:00')),
    ];
    expect(effectivePayload(reading, journal)).toEqual(readingPayload(1.05, { sg: 1.03, ph: 3.6 }));
    expect(effectivePayload(other, journal)).toEqual(readingPayload(1.06, { sg: 1.0 }));
  });

  it('does not depend on the order of the journal', () => {
    const journal = [
      reading,
      amendment(3, 1, { sg: 1.03 }, at('11:00')),
      amendment(4, 1, { sg: 1.02 }, at('11:00')),
      amendment(5, 1, { ph: 3.2 }, at('10:00')),
    ];
    for (const order of permutations(journal)) expect(effectivePayload(reading, order)).toEqual(readingPayload(1.05, { sg: 1.02, ph: 3.2 }));
  });

  it("returns the entry's own payload when nothing amends it", () => {
    expect(effectivePayload(reading, [reading, other, amendment(3, 2, { sg: 1.0 }, at('11:00'))])).toBe(reading.payload);
    expect(effectivePayload(reading, [])).toBe(reading.payload);
  });
});

// ---- The readings view -----------------------------------------------------------------------

describe('readingsView', () => {
  it('lists only readings, oldest first, with corrections applied', () => {
    const journal = [
      entry(1, readingPayload(1.1, { temperatureC: 20 }), { occurred: at('12:00') }),
      entry(2, notePayload('Bubbling'), { occurred: at('08:00') }),
      entry(3, readingPayload(1.08, { ph: 3.4, vesselId: id(99) }), { occurred: at('09:00') }),
      amendment(4, 1, { sg: 1.09, correctedSg: 1.092, temperatureC: 26 }, at('13:00')),
    ];
    expect(readingsView(journal)).toEqual([
      { entryId: id(3), at: at('09:00'), sg: 1.08, correctedSg: 1.08, temperatureC: null, ph: 3.4 },
      { entryId: id(1), at: at('12:00'), sg: 1.09, correctedSg: 1.092, temperatureC: 26, ph: null },
    ]);
  });

  it('orders readings taken at the same moment by recording time, then by id, for any input order', () => {
    const journal = [
      entry(4, readingPayload(1.04), { occurred: at('10:00'), recorded: at('10:00') }),
      entry(3, readingPayload(1.03), { occurred: at('10:00'), recorded: at('10:00') }),
      entry(1, readingPayload(1.01), { occurred: at('10:00'), recorded: at('10:02') }),
      entry(2, readingPayload(1.02), { occurred: at('10:00'), recorded: at('10:01') }),
    ];
    for (const order of permutations(journal)) {
      expect(readingsView(order).map((r) => r.entryId)).toEqual([id(3), id(4), id(2), id(1)]);
    }
  });

  it('gives the time as an ISO string: a Date converted, a string as stored', () => {
    const journal = [
      entry(1, readingPayload(1.05), { occurred: new Date('2026-03-14T08:30:00.000Z') }),
      entry(2, readingPayload(1.04), { occurred: '2026-03-14T10:30:00+01:00' }),
    ];
    expect(readingsView(journal).map((r) => r.at)).toEqual(['2026-03-14T08:30:00.000Z', '2026-03-14T10:30:00+01:00']);
  });

  it('is empty for a journal without readings', () => {
    expect(readingsView([entry(1, notePayload('Nothing measured'))])).toEqual([]);
  });
});
