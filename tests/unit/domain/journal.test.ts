import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import type { JournalKind, JournalPayload } from '../../../shared/schemas/journal';
import {
  amendedPayloads,
  compareEntries,
  CORRECTABLE_FIELDS,
  correctableFieldNames,
  correctionSchema,
  effectivePayload,
  isCorrectable,
  mergedChanges,
  readingsView,
  VOLUME_KINDS,
  type CorrectableKind,
  type JournalRecord,
} from '../../../shared/domain/journal';

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

// ---- What a correction may change ------------------------------------------------------------

describe('which fields may be corrected', () => {
  it('names the fields per kind', () => {
    expect(correctableFieldNames('reading')).toEqual(['sg', 'temperatureC', 'ph']);
    expect(correctableFieldNames('tasted')).toEqual(['appearance', 'aroma', 'flavour', 'score']);
    expect(correctableFieldNames('note')).toEqual(['text']);
    expect(correctableFieldNames('addition')).toEqual(['name', 'amount', 'unit', 'removeOn']);
    expect(correctableFieldNames('started')).toEqual(['og', 'startedOn', 'volumeL', 'yeastName', 'yeastToleranceAbv']);
    expect(correctableFieldNames('emptied')).toEqual(['reason', 'note']);
    expect(Object.keys(CORRECTABLE_FIELDS)).toEqual(['reading', 'tasted', 'note', 'addition', 'started', 'emptied']);
  });

  it('lets no entry that moves liquid, nor an amendment, be corrected — except the start, whose figures can be put right', () => {
    expect(VOLUME_KINDS).toEqual(['started', 'racked', 'topped-up', 'bottled', 'split', 'blended']);
    const never: JournalKind[] = [...VOLUME_KINDS.filter((k) => k !== 'started'), 'amendment', 'removed', 'degassed', 'photo'];
    for (const kind of never) {
      expect(isCorrectable(kind), kind).toBe(false);
      expect(correctableFieldNames(kind), kind).toEqual([]);
    }
    for (const kind of ['reading', 'tasted', 'note', 'addition', 'started'] as const) expect(isCorrectable(kind), kind).toBe(true);
  });
});

describe('correctionSchema', () => {
  /** The messages of a refused correction, or [] when accepted. */
  function refusal(kind: CorrectableKind, changes: Record<string, unknown>): string[] {
    const parsed = correctionSchema(kind).safeParse(changes);
    return parsed.success ? [] : parsed.error.issues.map((i) => i.message);
  }
  const parse = (kind: CorrectableKind, changes: Record<string, unknown>) =>
    correctionSchema(kind).parse(changes) as z.infer<ReturnType<typeof correctionSchema>>;

  // The first message is the one the API answers with (`message`), so it must name the field.
  it('refuses a field the kind does not have, naming it and the ones it has, first', () => {
    expect(refusal('reading', { colour: 'gold' })[0]).toBe('a reading has no field colour that can be corrected (only sg, temperatureC, ph)');
    expect(refusal('tasted', { colour: 'gold' })[0]).toBe(
      'a tasting has no field colour that can be corrected (only appearance, aroma, flavour, score)',
    );
    expect(refusal('note', { author: 'someone' })[0]).toBe('a note has no field author that can be corrected (only text)');
  });

  it('refuses a field of the payload that is not correctable by hand', () => {
    expect(refusal('reading', { correctedSg: 1.0 })[0]).toBe('a reading has no field correctedSg that can be corrected (only sg, temperatureC, ph)');
    expect(refusal('reading', { calibrationC: 15.56 })[0]).toMatch(/^a reading has no field calibrationC /);
    expect(refusal('addition', { category: 'oak' })[0]).toMatch(/no field category that can be corrected \(only name, amount, unit, removeOn\)$/);
  });

  it('names every unknown field', () => {
    expect(refusal('reading', { colour: 'gold', smell: 'pear' })[0]).toBe(
      'a reading has no field colour, smell that can be corrected (only sg, temperatureC, ph)',
    );
  });

  it('refuses changes that are not an object without claiming an unknown field', () => {
    for (const notAnObject of [null, 'sg=1.01', 1.01]) {
      const messages = refusal('reading', notAnObject as unknown as Record<string, unknown>);
      expect(messages).toHaveLength(1);
      expect(messages[0]).not.toMatch(/has no field/);
    }
  });

  it('refuses an unknown field even beside a good one', () => {
    expect(refusal('reading', { sg: 1.01, colour: 'gold' })).toEqual([
      'a reading has no field colour that can be corrected (only sg, temperatureC, ph)',
    ]);
  });

  it('refuses empty changes, saying which fields could be corrected', () => {
    expect(refusal('reading', {})).toEqual(['say which of sg, temperatureC, ph to correct']);
    expect(refusal('note', {})).toEqual(['say which of text to correct']);
    expect(refusal('addition', {})).toEqual(['say which of name, amount, unit, removeOn to correct']);
  });

  it('accepts any one field alone, and several together', () => {
    expect(parse('reading', { sg: 1.011 })).toEqual({ sg: 1.011 });
    expect(parse('reading', { ph: 3.4 })).toEqual({ ph: 3.4 });
    expect(parse('reading', { sg: 1.023, temperatureC: 26 })).toEqual({ sg: 1.023, temperatureC: 26 });
    expect(parse('tasted', { score: 6, aroma: 'Pear' })).toEqual({ score: 6, aroma: 'Pear' });
    expect(parse('addition', { name: 'French oak spiral', removeOn: '2026-10-15' })).toEqual({ name: 'French oak spiral', removeOn: '2026-10-15' });
  });

  it('applies the reading rules: gravity 0.980 to 1.200, 0 to 40 °C, pH 2.5 to 4.5, unknown allowed', () => {
    expect(refusal('reading', { sg: 0.98 })).toEqual([]);
    expect(refusal('reading', { sg: 1.2 })).toEqual([]);
    expect(refusal('reading', { sg: 0.979 })).toEqual(['a gravity is at least 0.980']);
    expect(refusal('reading', { sg: 1.201 })).toEqual(['a gravity is at most 1.200']);
    expect(refusal('reading', { sg: 'high' })).toEqual(['enter a gravity such as 1.105']);
    expect(refusal('reading', { sg: null })).toHaveLength(1);
    expect(refusal('reading', { temperatureC: 0 })).toEqual([]);
    expect(refusal('reading', { temperatureC: 40 })).toEqual([]);
    expect(refusal('reading', { temperatureC: -0.1 })).toEqual(['at least 0 °C']);
    expect(refusal('reading', { temperatureC: 40.1 })).toEqual(['at most 40 °C']);
    expect(refusal('reading', { temperatureC: null })).toEqual([]);
    expect(refusal('reading', { ph: 2.5 })).toEqual([]);
    expect(refusal('reading', { ph: 4.5 })).toEqual([]);
    expect(refusal('reading', { ph: 2.49 })).toEqual(['pH is at least 2.5']);
    expect(refusal('reading', { ph: 4.51 })).toEqual(['pH is at most 4.5']);
    expect(refusal('reading', { ph: null })).toEqual([]);
  });

  it('applies the tasting rules: a whole point of 1 to 8 (our own scale) or none, notes of bounded length', () => {
    expect(refusal('tasted', { score: 1 })).toEqual([]);
    expect(refusal('tasted', { score: 8 })).toEqual([]);
    expect(refusal('tasted', { score: null })).toEqual([]);
    expect(refusal('tasted', { score: 9 })).toEqual(['at most 8']);
    expect(refusal('tasted', { score: 0 })).toEqual(['at least 1']);
    expect(refusal('tasted', { score: 6.5 })).toEqual(['a whole point of the scale']);
    expect(refusal('tasted', { score: -1 })).toHaveLength(1);
    expect(refusal('tasted', { appearance: 'a'.repeat(500), aroma: 'a'.repeat(500), flavour: 'a'.repeat(1000) })).toEqual([]);
    expect(refusal('tasted', { appearance: 'a'.repeat(501) })).toHaveLength(1);
    expect(refusal('tasted', { aroma: 'a'.repeat(501) })).toHaveLength(1);
    expect(refusal('tasted', { flavour: 'a'.repeat(1001) })).toHaveLength(1);
    expect(refusal('tasted', { aroma: '' })).toEqual([]);
  });

  it('applies the note rules: trimmed, not blank, at most 4000 characters', () => {
    expect(parse('note', { text: '  Rack tomorrow  ' })).toEqual({ text: 'Rack tomorrow' });
    expect(refusal('note', { text: '   ' })).toEqual(['write something']);
    expect(refusal('note', { text: 'a'.repeat(4000) })).toEqual([]);
    expect(refusal('note', { text: 'a'.repeat(4001) })).toHaveLength(1);
  });

  it('applies the addition rules: a name, an amount above 0, a short unit, a removal date or none', () => {
    expect(refusal('addition', { name: ' ' })).toEqual(['what was added?']);
    expect(refusal('addition', { amount: 0 })).toEqual(['must be more than 0']);
    expect(refusal('addition', { amount: 0.001 })).toEqual([]);
    expect(refusal('addition', { amount: 100000 })).toEqual([]);
    expect(refusal('addition', { amount: 100001 })).toHaveLength(1);
    expect(refusal('addition', { unit: 'a'.repeat(12) })).toEqual([]);
    expect(refusal('addition', { unit: 'a'.repeat(13) })).toHaveLength(1);
    expect(refusal('addition', { unit: '' })).toEqual(['unit']);
    expect(refusal('addition', { removeOn: '2026-10-15' })).toEqual([]);
    expect(refusal('addition', { removeOn: null })).toEqual([]);
    expect(refusal('addition', { removeOn: 'next week' })).toEqual(['a date like 2026-03-14']);
  });
});
