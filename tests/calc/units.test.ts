import { describe, it, expect } from 'vitest';
import {
  litresFrom,
  litresTo,
  kilogramsFrom,
  kilogramsTo,
  celsiusFrom,
  fahrenheitFrom,
  LITRES_PER_US_GALLON,
  LITRES_PER_IMPERIAL_GALLON,
  LITRES_PER_US_FLUID_OUNCE,
  KILOGRAMS_PER_POUND,
  KILOGRAMS_PER_OUNCE,
  ABSOLUTE_ZERO_C,
  VOLUME_UNITS,
  MASS_UNITS,
} from '../../shared/calc';
import { expectInputError } from './expect-input-error';

// NIST Handbook 44 (2024 ed.), Appendix C "General Tables of Units of Measurement":
// 1 inch = 2.54 cm exactly; 1 US gallon = 231 cubic inches exactly.
const CUBIC_INCH_L = 2.54 ** 3 / 1000;

describe('volume conversions (NIST Handbook 44, Appendix C)', () => {
  it('a US gallon is 231 cubic inches', () => {
    expect(litresFrom(1, 'US gal')).toBeCloseTo(231 * CUBIC_INCH_L, 12);
    // HB44 App. C also prints the litre value: 3.785 411 784 L.
    expect(litresFrom(1, 'US gal')).toBeCloseTo(3.785411784, 12);
  });

  it('a US fluid ounce is 1/128 gallon = 29.573 529 562 5 mL (HB44 App. C)', () => {
    expect(litresFrom(1, 'US fl oz') * 1000).toBeCloseTo(29.5735295625, 10);
    expect(litresFrom(128, 'US fl oz')).toBeCloseTo(3.785411784, 12);
  });

  it('an imperial gallon is 4.546 09 L exactly (HB44 App. C; UK Weights and Measures Act 1985)', () => {
    expect(litresFrom(1, 'imp gal')).toBeCloseTo(4.54609, 12);
  });

  it.each([
    // [value, unit, litres] — each from the exact definitions above
    [750, 'mL', 0.75],
    [5, 'US gal', 5 * 231 * CUBIC_INCH_L],
    [6, 'US gal', 6 * 231 * CUBIC_INCH_L],
    [1, 'imp gal', 4.54609],
    [25.4, 'US fl oz', (25.4 * 231 * CUBIC_INCH_L) / 128],
    [23, 'L', 23],
  ] as const)('%s %s = %s L', (value, unit, litres) => {
    expect(litresFrom(value, unit)).toBeCloseTo(litres, 10);
    expect(litresTo(litres, unit)).toBeCloseTo(value, 9);
  });

  it('rejects negative volumes and unknown units, naming the argument', () => {
    expectInputError(() => litresFrom(-1, 'L'), 'value', 'Volume cannot be negative (got -1).');
    expectInputError(() => litresTo(-0.5, 'US gal'), 'litres');
    expectInputError(() => litresFrom(Number.NaN, 'L'), 'value');
    expectInputError(() => litresTo(Number.POSITIVE_INFINITY, 'L'), 'litres');
    expectInputError(() => litresFrom(1, 'barrel' as never), 'unit');
  });
});

describe('mass conversions (NIST Handbook 44, Appendix C)', () => {
  it('the avoirdupois pound is 0.453 592 37 kg exactly (International Yard and Pound Agreement, 1959)', () => {
    expect(kilogramsFrom(1, 'lb')).toBeCloseTo(0.45359237, 12);
  });

  it('the avoirdupois ounce is 28.349 523 125 g (1/16 lb, HB44 App. C)', () => {
    expect(kilogramsFrom(1, 'oz') * 1000).toBeCloseTo(28.349523125, 9);
  });

  it.each([
    [1000, 'g', 1],
    [3, 'lb', 3 * 0.45359237],
    [12, 'lb', 12 * 0.45359237],
    [8, 'oz', 0.45359237 / 2],
    [2.5, 'kg', 2.5],
  ] as const)('%s %s = %s kg', (value, unit, kg) => {
    expect(kilogramsFrom(value, unit)).toBeCloseTo(kg, 12);
    expect(kilogramsTo(kg, unit)).toBeCloseTo(value, 9);
  });

  it('rejects negative masses and unknown units', () => {
    expectInputError(() => kilogramsFrom(-2, 'kg'), 'value');
    expectInputError(() => kilogramsTo(-2, 'lb'), 'kilograms');
    expectInputError(() => kilogramsFrom(1, 'stone' as never), 'unit');
    expectInputError(() => kilogramsTo(Number.NaN, 'g'), 'kilograms');
  });
});

describe('temperature conversions (NIST SP 811 (2008), Appendix B: t/°C = (t/°F − 32)/1.8)', () => {
  it.each([
    // [°F, °C] — fixed points of the two scales and the hydrometer standards
    [32, 0],
    [212, 100],
    [-40, -40],
    [60, 15.555555555555555],
    [68, 20],
    [98.6, 37],
    [-459.67, -273.15], // absolute zero on both scales (SP 811)
  ])('%s °F = %s °C', (f, c) => {
    expect(celsiusFrom(f, 'F')).toBeCloseTo(c, 9);
    expect(celsiusFrom(f)).toBeCloseTo(c, 9);
    expect(fahrenheitFrom(c)).toBeCloseTo(f, 9);
  });

  it('treats a Celsius value as already Celsius', () => {
    expect(celsiusFrom(18.5, 'C')).toBe(18.5);
  });

  it('rejects temperatures below absolute zero and non-numbers', () => {
    expectInputError(() => celsiusFrom(-500, 'F'), 'value');
    expectInputError(() => celsiusFrom(-300, 'C'), 'value');
    expectInputError(() => fahrenheitFrom(-274), 'celsius');
    expectInputError(() => celsiusFrom(Number.NaN), 'value');
    expectInputError(() => celsiusFrom(10, 'K' as never), 'unit');
  });

  it('uses the exact definitions, not rounded ones', () => {
    expect(LITRES_PER_US_GALLON).toBe(3.785411784);
    expect(LITRES_PER_IMPERIAL_GALLON).toBe(4.54609);
    expect(LITRES_PER_US_FLUID_OUNCE * 1000).toBeCloseTo(29.5735295625, 12);
    expect(KILOGRAMS_PER_POUND).toBe(0.45359237);
    expect(KILOGRAMS_PER_OUNCE * 1000).toBeCloseTo(28.349523125, 12);
    expect(ABSOLUTE_ZERO_C).toBe(-273.15);
  });

  it('offers every unit the cellar works in', () => {
    expect(VOLUME_UNITS).toEqual(['L', 'mL', 'US gal', 'imp gal', 'US fl oz']);
    expect(MASS_UNITS).toEqual(['kg', 'g', 'lb', 'oz']);
  });

  it('accepts absolute zero itself and says plainly what is below it', () => {
    expect(celsiusFrom(-273.15, 'C')).toBe(-273.15);
    expect(fahrenheitFrom(-273.15)).toBeCloseTo(-459.67, 9);
    expectInputError(() => celsiusFrom(-460, 'F'), 'value', 'Temperature cannot be below absolute zero (got -460 °F).');
    expectInputError(() => fahrenheitFrom(-273.16), 'celsius', 'Temperature cannot be below absolute zero (got -273.16 °C).');
  });
});

describe('unit conversion messages', () => {
  it('name the value, its unit and the units offered', () => {
    expectInputError(() => litresTo(-1, 'L'), 'litres', 'Volume cannot be negative (got -1 L).');
    expectInputError(() => kilogramsTo(-2, 'kg'), 'kilograms', 'Mass cannot be negative (got -2 kg).');
    expectInputError(() => kilogramsFrom(-2, 'kg'), 'value', 'Mass cannot be negative (got -2).');
    expectInputError(
      () => litresTo(1, 'barrel' as never),
      'unit',
      "Volume unit must be one of 'L', 'mL', 'US gal', 'imp gal', 'US fl oz' (got 'barrel').",
    );
    expectInputError(() => litresFrom(1, 'barrel' as never), 'unit', /^Volume unit must be one of/);
    expectInputError(() => kilogramsTo(1, 'stone' as never), 'unit', "Mass unit must be one of 'kg', 'g', 'lb', 'oz' (got 'stone').");
    expectInputError(() => kilogramsFrom(1, 'stone' as never), 'unit', /^Mass unit must be one of/);
    expectInputError(() => litresTo(1e308, 'mL'), 'litres', 'Volume is too large to work with.');
    expectInputError(() => celsiusFrom(10, 'K' as never), 'unit', "Temperature unit must be one of 'C', 'F' (got 'K').");
  });
});
