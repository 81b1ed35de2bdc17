/**
 * Unit conversions. Every factor is an exact definition from NIST Handbook 44
 * (Appendix C, "General Tables of Units of Measurement") and NIST SP 811
 * (Guide for the Use of the SI, Appendix B): the inch is 2.54 cm exactly, the
 * US gallon is 231 cubic inches, the imperial gallon 4.54609 L, the
 * avoirdupois pound 0.45359237 kg.
 */
import { CalcInputError, requireFinite, requireFiniteResult, requireNonNegative, requireOneOf } from './guards';

/** Volume units the cellar works in. */
export type VolumeUnit = 'L' | 'mL' | 'US gal' | 'imp gal' | 'US fl oz';
/** Mass units the cellar works in. */
export type MassUnit = 'kg' | 'g' | 'lb' | 'oz';
/** Temperature scales. */
export type TemperatureUnit = 'C' | 'F';

/** Litres in one US gallon (231 in³ × (2.54 cm)³, exact). */
export const LITRES_PER_US_GALLON = 3.785411784;
/** Litres in one imperial gallon (exact by definition). */
export const LITRES_PER_IMPERIAL_GALLON = 4.54609;
/** Litres in one US fluid ounce (1/128 US gallon, exact). */
export const LITRES_PER_US_FLUID_OUNCE = LITRES_PER_US_GALLON / 128;
/** Kilograms in one avoirdupois pound (exact by definition). */
export const KILOGRAMS_PER_POUND = 0.45359237;
/** Kilograms in one avoirdupois ounce (1/16 pound, exact). */
export const KILOGRAMS_PER_OUNCE = KILOGRAMS_PER_POUND / 16;
/** Absolute zero in degrees Celsius; no temperature can be below it. */
export const ABSOLUTE_ZERO_C = -273.15;

/** Every accepted volume unit, for pickers. */
export const VOLUME_UNITS: readonly VolumeUnit[] = ['L', 'mL', 'US gal', 'imp gal', 'US fl oz'];
/** Every accepted mass unit, for pickers. */
export const MASS_UNITS: readonly MassUnit[] = ['kg', 'g', 'lb', 'oz'];

const LITRES_PER: Record<VolumeUnit, number> = {
  L: 1,
  mL: 0.001,
  'US gal': LITRES_PER_US_GALLON,
  'imp gal': LITRES_PER_IMPERIAL_GALLON,
  'US fl oz': LITRES_PER_US_FLUID_OUNCE,
};

const KILOGRAMS_PER: Record<MassUnit, number> = {
  kg: 1,
  g: 0.001,
  lb: KILOGRAMS_PER_POUND,
  oz: KILOGRAMS_PER_OUNCE,
};

/**
 * Converts a volume to litres.
 * @param value - the volume in `unit` (zero or more)
 * @param unit - the unit `value` is in
 */
export function litresFrom(value: number, unit: VolumeUnit): number {
  const u = requireOneOf(unit, VOLUME_UNITS, 'unit', 'Volume unit');
  return requireFiniteResult(requireNonNegative(value, 'value', 'Volume') * LITRES_PER[u], 'value', 'Volume');
}

/**
 * Converts litres to another volume unit.
 * @param litres - the volume in litres (zero or more)
 * @param unit - the unit wanted
 */
export function litresTo(litres: number, unit: VolumeUnit): number {
  const u = requireOneOf(unit, VOLUME_UNITS, 'unit', 'Volume unit');
  return requireFiniteResult(requireNonNegative(litres, 'litres', 'Volume', ' L') / LITRES_PER[u], 'litres', 'Volume');
}

/**
 * Converts a mass to kilograms.
 * @param value - the mass in `unit` (zero or more)
 * @param unit - the unit `value` is in
 */
export function kilogramsFrom(value: number, unit: MassUnit): number {
  const u = requireOneOf(unit, MASS_UNITS, 'unit', 'Mass unit');
  // Every mass unit is a kilogram or less, so this cannot overflow.
  return requireNonNegative(value, 'value', 'Mass') * KILOGRAMS_PER[u];
}

/**
 * Converts kilograms to another mass unit.
 * @param kilograms - the mass in kilograms (zero or more)
 * @param unit - the unit wanted
 */
export function kilogramsTo(kilograms: number, unit: MassUnit): number {
  const u = requireOneOf(unit, MASS_UNITS, 'unit', 'Mass unit');
  return requireFiniteResult(requireNonNegative(kilograms, 'kilograms', 'Mass', ' kg') / KILOGRAMS_PER[u], 'kilograms', 'Mass');
}

/**
 * Converts a temperature to degrees Celsius (t/°C = (t/°F − 32)/1.8, NIST SP 811 Appendix B).
 * @param value - the temperature in `unit`
 * @param unit - 'F' (default) or 'C'
 */
export function celsiusFrom(value: number, unit: TemperatureUnit = 'F'): number {
  const u = requireOneOf(unit, ['C', 'F'] as const, 'unit', 'Temperature unit');
  const t = requireFinite(value, 'value', 'Temperature');
  const c = u === 'C' ? t : (t - 32) / 1.8;
  if (c < ABSOLUTE_ZERO_C) {
    throw new CalcInputError('value', `Temperature cannot be below absolute zero (got ${t} °${u}).`);
  }
  return c;
}

/**
 * Converts degrees Celsius to degrees Fahrenheit (t/°F = 1.8 · t/°C + 32).
 * @param celsius - the temperature in °C
 */
export function fahrenheitFrom(celsius: number): number {
  const c = requireFinite(celsius, 'celsius', 'Temperature');
  if (c < ABSOLUTE_ZERO_C) {
    throw new CalcInputError('celsius', `Temperature cannot be below absolute zero (got ${c} °C).`);
  }
  return requireFiniteResult(c * 1.8 + 32, 'celsius', 'Temperature');
}
