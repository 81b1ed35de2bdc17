import { describe, it, expect } from 'vitest';
import { formatVolume, formatTemperature, formatMass, tidyNumber, UNIT_SYSTEMS } from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// Expected strings follow from the exact unit definitions of NIST Handbook 44,
// Appendix C (US gal = 3.785 411 784 L, US fl oz = 29.573 529 562 5 mL,
// lb = 0.453 592 37 kg, oz = 28.349 523 125 g) and °F = 1.8 °C + 32.
describe('tidyNumber — two decimals below 10, one below 100, none above, no trailing zeros', () => {
  it.each([
    [0, '0'],
    [4.5, '4.5'],
    [4.567, '4.57'],
    [9.999, '10'],
    [10, '10'],
    [12.34, '12.3'],
    [99.96, '100'],
    [100.4, '100'],
    [1234.5, '1235'],
    [-12.34, '-12.3'],
    [-0.001, '0'], // never "-0"
    [2.5e-7, '0'],
  ])('%s is "%s"', (value, text) => {
    expect(tidyNumber(value)).toBe(text);
  });

  it('refuses NaN and Infinity instead of printing them', () => {
    expectInputError(() => tidyNumber(Number.NaN), 'value', 'Number must be a number (got NaN).');
    expectInputError(() => tidyNumber(Number.POSITIVE_INFINITY), 'value');
  });

  it('offers metric and US units', () => {
    expect(UNIT_SYSTEMS).toEqual(['metric', 'us']);
  });
});

describe('formatVolume', () => {
  it.each([
    [23, 'metric', '23 L'],
    [4.5, 'metric', '4.5 L'],
    [0.75, 'metric', '750 mL'],
    [0.375, 'metric', '375 mL'],
    [0, 'metric', '0 L'],
    [5 * 3.785411784, 'us', '5 US gal'], // a 5-gallon carboy
    [3.785411784, 'us', '1 US gal'],
    [23, 'us', '6.08 US gal'], // 23 / 3.785411784 = 6.0759…
    [0.75, 'us', '25.4 US fl oz'], // 750 / 29.5735295625 = 25.36…
    [0.355, 'us', '12 US fl oz'], // 355 / 29.5735… = 12.004
  ] as const)('%s L in %s units is "%s"', (litres, system, text) => {
    expect(formatVolume(litres, system)).toBe(text);
  });

  it('rejects a negative volume and an unknown system', () => {
    expectInputError(() => formatVolume(-1, 'metric'), 'litres');
    expectInputError(() => formatVolume(1, 'imperial' as never), 'system');
    expectInputError(() => formatVolume(Number.NaN, 'us'), 'litres');
  });
});

describe('formatTemperature', () => {
  it.each([
    [20, 'metric', '20 °C'],
    [18.46, 'metric', '18.5 °C'],
    [20, 'us', '68 °F'],
    [15.555555555555555, 'us', '60 °F'],
    [0, 'us', '32 °F'],
    [-5, 'metric', '-5 °C'],
    [35, 'us', '95 °F'],
  ] as const)('%s °C in %s units is "%s"', (c, system, text) => {
    expect(formatTemperature(c, system)).toBe(text);
  });

  it('rejects non-numbers and temperatures below absolute zero', () => {
    expectInputError(() => formatTemperature(Number.POSITIVE_INFINITY, 'metric'), 'celsius');
    expectInputError(() => formatTemperature(-300, 'us'), 'celsius');
    expectInputError(() => formatTemperature(10, 'kelvin' as never), 'system');
  });
});

describe('formatMass', () => {
  it.each([
    [1.5, 'metric', '1.5 kg'],
    [0.45, 'metric', '450 g'],
    [0.00128, 'metric', '1.28 g'], // a sulfite dose
    [0.45359237, 'us', '1 lb'],
    [12 * 0.45359237, 'us', '12 lb'],
    [0.028349523125, 'us', '1 oz'],
    [0.25, 'us', '8.82 oz'], // 250 / 28.349523125 = 8.818…
  ] as const)('%s kg in %s units is "%s"', (kg, system, text) => {
    expect(formatMass(kg, system)).toBe(text);
  });

  it('rejects a negative mass', () => {
    expectInputError(() => formatMass(-0.1, 'metric'), 'kilograms');
    expectInputError(() => formatMass(1, 'si' as never), 'system');
  });
});

describe('where the units change', () => {
  it.each([
    [1, 'metric', '1 L'],
    [0.999, 'metric', '999 mL'],
    [0, 'us', '0 US gal'],
    [3.785411784, 'us', '1 US gal'],
  ] as const)('%s L in %s units is "%s"', (litres, system, text) => {
    expect(formatVolume(litres, system)).toBe(text);
  });

  it.each([
    [1, 'metric', '1 kg'],
    [0, 'metric', '0 kg'],
    [0.999, 'metric', '999 g'],
    [0, 'us', '0 lb'],
  ] as const)('%s kg in %s units is "%s"', (kg, system, text) => {
    expect(formatMass(kg, system)).toBe(text);
  });

  it('names the unit in a message', () => {
    expectInputError(() => formatVolume(-1, 'metric'), 'litres', 'Volume cannot be negative (got -1 L).');
    expectInputError(() => formatMass(-0.1, 'metric'), 'kilograms', 'Mass cannot be negative (got -0.1 kg).');
    expectInputError(() => formatTemperature(-300, 'metric'), 'celsius', 'Temperature cannot be below absolute zero (got -300 °C).');
    expectInputError(() => formatVolume(1, 'imperial' as never), 'system', "Unit system must be one of 'metric', 'us' (got 'imperial').");
  });
});
