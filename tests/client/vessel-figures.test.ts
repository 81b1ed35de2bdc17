import { describe, expect, it } from 'vitest';
import { headspaceOf, headspaceWords } from '@/components/vessels/vessel-figures';

/** Headspace is the vessel's empty part: (capacity − contents) / capacity. Expected values worked by hand. */
describe('headspaceOf, used by every list that shows a vessel’s headspace', () => {
  it('is the empty part of the vessel, in litres and per cent', () => {
    // 4.5 L jug holding 4.3 L: 0.2 L empty, 0.2 / 4.5 = 4.44 %.
    const space = headspaceOf({ capacityL: 4.5, volumeL: 4.3 })!;
    expect(space.litres).toBeCloseTo(0.2, 9);
    expect(space.percent).toBeCloseTo(4.444, 3);
    expect(headspaceWords(space.percent)).toBe('4.4\u00a0%\u00a0headspace');
  });

  it('is nothing for an empty vessel, and zero for a full one', () => {
    expect(headspaceOf({ capacityL: 23, volumeL: null })).toBeNull();
    expect(headspaceOf({ capacityL: 23, volumeL: 23 })).toEqual({ litres: 0, percent: 0 });
  });

  it('counts a record showing more than the vessel holds as full, instead of breaking the list', () => {
    // The database refuses such contents; a record kept on the phone from an older answer is the only way here.
    expect(headspaceOf({ capacityL: 4.5, volumeL: 4.6 })).toEqual({ litres: 0, percent: 0 });
  });
});
