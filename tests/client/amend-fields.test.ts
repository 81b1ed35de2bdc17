import { describe, expect, it } from 'vitest';
import { amendableFields, changesSchemaFor } from '@/components/operations/amend-fields';

describe('the correction form’s fields', () => {
  it('shows a reading’s gravity, temperature and pH, labelled, in that order', () => {
    expect(amendableFields('reading')).toEqual([
      { key: 'sg', label: 'Gravity (as read)', type: 'number' },
      { key: 'temperatureC', label: 'Sample temperature', type: 'temperature' },
      { key: 'ph', label: 'pH', type: 'number' },
    ]);
  });

  it('offers nothing to correct on entries that moved liquid (a new operation corrects those)', () => {
    expect(amendableFields('racked')).toEqual([]);
    expect(amendableFields('bottled')).toEqual([]);
  });

  it('holds corrected fields to the rules of the entry’s own request', () => {
    const reading = changesSchemaFor('reading');
    expect(reading.safeParse({ ph: 3.3 }).success).toBe(true);
    expect(reading.safeParse({ ph: 5 }).error?.issues.map((i) => i.message)).toEqual(['pH is at most 4.5']);
    expect(reading.safeParse({ sg: 1.5 }).error?.issues.map((i) => i.message)).toEqual(['a gravity is at most 1.200']);
    // Clearing an optional figure is a correction too.
    expect(reading.safeParse({ temperatureC: null }).success).toBe(true);
    expect(
      changesSchemaFor('note')
        .safeParse({ text: '  ' })
        .error?.issues.map((i) => i.message),
    ).toEqual(['write something']);
  });
});
