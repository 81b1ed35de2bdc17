/**
 * Presentation of quantities in the cellar's chosen unit system. Values are
 * always stored metric; these helpers only turn them into short labelled
 * strings for the screen.
 */
import { requireFinite, requireNonNegative, requireOneOf } from './guards';
import { fahrenheitFrom, kilogramsTo, litresTo, LITRES_PER_US_GALLON, KILOGRAMS_PER_POUND } from './units';

/** The cellar's display units: metric (L, kg, °C) or US customary (gal, lb, °F). */
export type UnitSystem = 'metric' | 'us';

/** Both unit systems, for pickers. */
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'us'];

/**
 * Rounds to a sensible number of decimals for the size of the value and drops
 * trailing zeros, always with a '.' decimal point.
 * @param value - the number to show (finite)
 */
export function tidyNumber(value: number): string {
  const n = requireFinite(value, 'value', 'Number');
  const abs = Math.abs(n);
  const decimals = abs < 10 ? 2 : abs < 100 ? 1 : 0;
  const fixed = n.toFixed(decimals);
  const trimmed = fixed.includes('.') ? fixed.replace(/\.?0+$/, '') : fixed;
  return trimmed === '-0' ? '0' : trimmed;
}

/**
 * Formats a volume: mL or L in metric; US fl oz below one gallon, US gal above, in US units.
 * @param litres - the volume in litres (zero or more)
 * @param system - the unit system to show it in
 */
export function formatVolume(litres: number, system: UnitSystem): string {
  const s = requireOneOf(system, UNIT_SYSTEMS, 'system', 'Unit system');
  const l = requireNonNegative(litres, 'litres', 'Volume', ' L');
  if (s === 'metric') {
    return l > 0 && l < 1 ? `${tidyNumber(l * 1000)} mL` : `${tidyNumber(l)} L`;
  }
  return l > 0 && l < LITRES_PER_US_GALLON ? `${tidyNumber(litresTo(l, 'US fl oz'))} US fl oz` : `${tidyNumber(litresTo(l, 'US gal'))} US gal`;
}

/**
 * Formats a temperature in °C (metric) or °F (US), to one decimal at most.
 * @param celsius - the temperature in °C
 * @param system - the unit system to show it in
 */
export function formatTemperature(celsius: number, system: UnitSystem): string {
  const s = requireOneOf(system, UNIT_SYSTEMS, 'system', 'Unit system');
  // Converting checks the temperature is real on both scales (finite, not below absolute zero).
  const f = fahrenheitFrom(celsius);
  const value = s === 'metric' ? celsius : f;
  // toFixed, unlike value × 10, cannot overflow; Number() drops a trailing ".0" and String(-0) is "0".
  return `${String(Number(value.toFixed(1)))} °${s === 'metric' ? 'C' : 'F'}`;
}

/**
 * Formats a mass: g or kg in metric; oz below one pound, lb above, in US units.
 * @param kilograms - the mass in kilograms (zero or more)
 * @param system - the unit system to show it in
 */
export function formatMass(kilograms: number, system: UnitSystem): string {
  const s = requireOneOf(system, UNIT_SYSTEMS, 'system', 'Unit system');
  const kg = requireNonNegative(kilograms, 'kilograms', 'Mass', ' kg');
  if (s === 'metric') {
    return kg > 0 && kg < 1 ? `${tidyNumber(kg * 1000)} g` : `${tidyNumber(kg)} kg`;
  }
  return kg > 0 && kg < KILOGRAMS_PER_POUND ? `${tidyNumber(kilogramsTo(kg, 'oz'))} oz` : `${tidyNumber(kilogramsTo(kg, 'lb'))} lb`;
}
