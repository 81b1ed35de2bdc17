import { describe, expect, it } from 'vitest';
import { headspaceIsRisk } from '../../../shared/domain/headspace-rule';

// Common practice: a primary ferment needs room for its foam and is blanketed by its own CO2;
// after racking, air over the liquid oxidises it.
describe('headspaceIsRisk', () => {
  it('is no risk in primary', () => {
    expect(headspaceIsRisk('primary')).toBe(false);
  });
  it.each(['secondary', 'bulk-ageing', null, undefined])('is a risk in %s', (stage) => {
    expect(headspaceIsRisk(stage)).toBe(true);
  });
});
