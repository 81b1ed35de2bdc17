import { describe, expect, it } from 'vitest';
import { GRAVITY_RISE_TOLERANCE, gravityRiseNote } from '../../../shared/domain/gravity-rise';

// A hydrometer reads to one line of its scale, 0.001 (common practice): a rise beyond it is noted.
describe('gravityRiseNote', () => {
  it('notes 1.012 → 1.016', () => {
    expect(gravityRiseNote(1.012, 1.016)).toBe(
      'Gravity rose from 1.012 to 1.016: a new ferment (sugar, honey or fruit added?) or a misread — check the hydrometer and the temperature.',
    );
  });

  it('says nothing of a fall, a steady reading or a rise within one line of the scale', () => {
    expect(GRAVITY_RISE_TOLERANCE).toBe(0.001);
    expect(gravityRiseNote(1.016, 1.012)).toBeNull();
    expect(gravityRiseNote(1.012, 1.012)).toBeNull();
    expect(gravityRiseNote(1.012, 1.013)).toBeNull();
    expect(gravityRiseNote(1.012, 1.014)).not.toBeNull();
    expect(gravityRiseNote(null, 1.05)).toBeNull();
    expect(gravityRiseNote(undefined, 1.05)).toBeNull();
  });

  it('writes gravities the caller’s way', () => {
    expect(gravityRiseNote(1.012, 1.016, (sg) => `SG ${sg}`)).toContain('from SG 1.012 to SG 1.016');
  });
});
