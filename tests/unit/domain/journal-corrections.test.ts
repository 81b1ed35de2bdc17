import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import type { JournalKind } from '../../../shared/schemas/journal';
import {
  CORRECTABLE_FIELDS,
  correctableFieldNames,
  correctionSchema,
  isCorrectable,
  VOLUME_KINDS,
  type CorrectableKind,
} from '../../../shared/domain/journal';

/** The journal's correction rules (shared/domain/journal.ts): which fields each kind of entry may have put right, and how. */

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
