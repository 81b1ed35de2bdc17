import { describe, expect, it } from 'vitest';
import { readTypedGravity } from '../../shared/calc';

// Specific gravity is written with three decimals (1.110); "points" are its thousandths
// (1110 = 1.110), as hydrometer scales are commonly read (common practice).
describe('readTypedGravity', () => {
  it.each([
    ['1.110', 1.11],
    ['1,050', 1.05],
    [' 0.996 ', 0.996],
  ])('takes %s as SG %s, with no note', (text, sg) => {
    expect(readTypedGravity(text)).toEqual({ sg, note: null });
  });

  it('takes points and says how it read them', () => {
    expect(readTypedGravity('1110')).toEqual({ sg: 1.11, note: 'read as 1.110' });
    expect(readTypedGravity(1110)).toEqual({ sg: 1.11, note: 'read as 1.110' });
    const half = readTypedGravity('1110.5')!;
    expect(half.sg).toBeCloseTo(1.1105, 10);
    expect(half.note).toBe('read as 1.1105');
    expect(readTypedGravity('996')).toEqual({ sg: 0.996, note: 'read as 0.996' });
    expect(readTypedGravity(' 1110 ')).toEqual({ sg: 1.11, note: 'read as 1.110' });
    const quarter = readTypedGravity('1110.25')!;
    expect(quarter.sg).toBeCloseTo(1.11025, 10);
    expect(quarter.note).toBe('read as 1.11025');
  });

  it('takes points from the lowest to the highest gravity a reading may have (0.980 to 1.200)', () => {
    expect(readTypedGravity('980')).toEqual({ sg: 0.98, note: 'read as 0.980' });
    expect(readTypedGravity('1200')).toEqual({ sg: 1.2, note: 'read as 1.200' });
    expect(readTypedGravity('979')).toEqual({ sg: 979, note: null });
    expect(readTypedGravity('1201')).toEqual({ sg: 1201, note: null });
  });

  it('passes on what is neither, for the form to refuse', () => {
    expect(readTypedGravity('5')).toEqual({ sg: 5, note: null });
    expect(readTypedGravity('1300')).toEqual({ sg: 1300, note: null });
  });

  it('reads nothing from nothing', () => {
    expect(readTypedGravity('')).toBeNull();
    expect(readTypedGravity('  ')).toBeNull();
    expect(readTypedGravity(null)).toBeNull();
    expect(readTypedGravity(undefined)).toBeNull();
    expect(readTypedGravity('abc')).toBeNull();
  });
});
