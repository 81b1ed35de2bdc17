import { describe, expect, it } from 'vitest';
import { quantitiesInUnits } from '@/composables/message-units';

// The shared schemas give their limits in metric; a person working in US units reads them in theirs.
// Conversions: t/°F = 1.8 · t/°C + 32 (NIST SP 811, B.9); 1 US gal = 231 in³ = 3.785411784 L exactly
// and 1 US fl oz = 1/128 US gal (NIST Handbook 44, Appendix C).
describe('quantitiesInUnits', () => {
  it('leaves a message alone in metric', () => {
    expect(quantitiesInUnits('at most 40 °C', 'metric')).toBe('at most 40 °C');
    expect(quantitiesInUnits('at most 20 000 L', 'metric')).toBe('at most 20 000 L');
  });

  it('writes temperature limits in °F', () => {
    expect(quantitiesInUnits('at least 0 °C', 'us')).toBe('at least 32 °F');
    expect(quantitiesInUnits('at most 40 °C', 'us')).toBe('at most 104 °F');
    expect(quantitiesInUnits('between -10 °C and 0 °C', 'us')).toBe('between 14 °F and 32 °F');
  });

  it('writes volume limits in US gallons, or fluid ounces below a gallon, thousands spaced or not', () => {
    // 20 000 L ÷ 3.785411784 = 5283.44 US gal, shown to whole gallons at that size.
    expect(quantitiesInUnits('at most 20 000 L', 'us')).toBe('at most 5283 US gal');
    expect(quantitiesInUnits('at most 20000 L', 'us')).toBe('at most 5283 US gal');
    // 0.01 L = 10 mL; 10 ÷ 29.5735295625 = 0.338 US fl oz.
    expect(quantitiesInUnits('at least 0.01 L', 'us')).toBe('at least 0.34 US fl oz');
    // 19 L ÷ 3.785411784 = 5.019 US gal.
    expect(quantitiesInUnits('only 19 L left.', 'us')).toBe('only 5.02 US gal left.');
  });

  it('leaves words that only start like a unit, and what cannot be converted', () => {
    expect(quantitiesInUnits('4 Lids and 2 Labels', 'us')).toBe('4 Lids and 2 Labels');
    expect(quantitiesInUnits('at least 50 mL', 'us')).toBe('at least 50 mL');
    expect(quantitiesInUnits('-300 °C is not a temperature', 'us')).toBe('-300 °C is not a temperature');
    expect(quantitiesInUnits('-2 L', 'us')).toBe('-2 L');
  });
});
