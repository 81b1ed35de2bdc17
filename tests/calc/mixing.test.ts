import { describe, expect, it } from 'vitest';
import { mixedAbv, mixedGravity } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// The Pearson square (as taught for blending wines and fortifying, e.g. in winemaking
// handbooks): parts of each liquid are in the ratio of the distances of the other's value from
// the target, V₁ · (P₁ − P) = V₂ · (P − P₂). Each expected value is worked by hand below.
describe('mixedGravity', () => {
  it('19 L at 1.000 and 1 L of water at 1.000 stay at 1.000', () => {
    expect(
      mixedGravity([
        { volumeL: 19, sg: 1.0 },
        { volumeL: 1, sg: 1.0 },
      ]),
    ).toBeCloseTo(1.0, 9);
  });

  it('19 L at 1.100 topped up with 1 L of water: 19 × 100 points / 20 L = 95 points → 1.095', () => {
    const mix = mixedGravity([
      { volumeL: 19, sg: 1.1 },
      { volumeL: 1, sg: 1.0 },
    ]);
    expect(mix).toBeCloseTo(1.095, 9);
    // The square's check: 19 × (100 − 95) = 1 × (95 − 0).
    expect(19 * (100 - (mix - 1) * 1000)).toBeCloseTo(1 * ((mix - 1) * 1000 - 0), 6);
  });

  it('4 L at 0.996 with 0.5 L of honey-water at 1.120: (4 × −4 + 0.5 × 120) / 4.5 = 9.78 points → 1.00978', () => {
    expect(
      mixedGravity([
        { volumeL: 4, sg: 0.996 },
        { volumeL: 0.5, sg: 1.12 },
      ]),
    ).toBeCloseTo(1 + (4 * -4 + 0.5 * 120) / 4.5 / 1000, 9);
  });

  it('refuses an empty mix and impossible parts', () => {
    expectInputError(() => mixedGravity([]), 'parts');
    expectInputError(() => mixedGravity([{ volumeL: 0, sg: 1.05 }]), 'parts[0].volumeL');
    expectInputError(
      () =>
        mixedGravity([
          { volumeL: 1, sg: 1.05 },
          { volumeL: 1, sg: 3 },
        ]),
      'parts[1].sg',
    );
  });
});

describe('mixedAbv', () => {
  it('20 L at 12 % with 2 L of water: 2.4 L of alcohol in 22 L = 10.91 %', () => {
    expect(
      mixedAbv([
        { volumeL: 20, abv: 12 },
        { volumeL: 2, abv: 0 },
      ]),
    ).toBeCloseTo((20 * 0.12 * 100) / 22, 9);
  });

  it('equal parts of 10 % and 14 % make 12 %', () => {
    expect(
      mixedAbv([
        { volumeL: 5, abv: 10 },
        { volumeL: 5, abv: 14 },
      ]),
    ).toBeCloseTo(12, 9);
  });

  it('refuses a strength out of range and impossible volumes, naming the liquid', () => {
    expectInputError(() => mixedAbv([{ volumeL: 1, abv: 120 }]), 'parts[0].abv', /^Strength of liquid 1 /);
    expectInputError(
      () =>
        mixedAbv([
          { volumeL: 1, abv: 10 },
          { volumeL: -2, abv: 10 },
        ]),
      'parts[1].volumeL',
      /^Volume of liquid 2 .* L\b/,
    );
    expectInputError(() => mixedAbv([null as never]), 'parts[0].volumeL');
    expectInputError(() => mixedAbv([]), 'parts');
  });
});

describe('mixing refusals name the liquid', () => {
  it('names the volume, gravity or strength of the liquid at fault', () => {
    expectInputError(() => mixedGravity([{ volumeL: 0, sg: 1.05 }]), 'parts[0].volumeL', /^Volume of liquid 1 .* L\b/);
    expectInputError(
      () =>
        mixedGravity([
          { volumeL: 1, sg: 1.05 },
          { volumeL: 1, sg: 3 },
        ]),
      'parts[1].sg',
      /^Gravity of liquid 2 /,
    );
    expectInputError(() => mixedGravity([null as never]), 'parts[0].volumeL');
    expectInputError(() => mixedGravity([{ volumeL: 1, sg: null as never }]), 'parts[0].sg');
    expectInputError(
      () =>
        mixedAbv([
          { volumeL: 1, abv: 10 },
          { volumeL: -2, abv: 10 },
        ]),
      'parts[1].volumeL',
      /^Volume of liquid 2 .* L\b/,
    );
    expectInputError(() => mixedAbv([{ volumeL: 1, abv: 120 }]), 'parts[0].abv', /^Strength of liquid 1 /);
    expectInputError(() => mixedAbv([{ volumeL: 1, abv: null as never }]), 'parts[0].abv');
  });
});
