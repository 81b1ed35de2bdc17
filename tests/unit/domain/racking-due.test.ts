import { describe, expect, it } from 'vitest';
import { RACK_AGAIN_AFTER_DAYS, RACK_PRIMARY_AFTER_DAYS } from '../../../shared/domain/racking-due';

// Common practice, not a published rule: off the gross lees after about a month in primary,
// then about every three months while the batch clears. Pinned so a change is deliberate.
describe('racking due', () => {
  it('falls due 30 days into primary (common practice)', () => {
    expect(RACK_PRIMARY_AFTER_DAYS).toBe(30);
  });

  it('falls due again 90 days after the last racking (common practice)', () => {
    expect(RACK_AGAIN_AFTER_DAYS).toBe(90);
  });
});
