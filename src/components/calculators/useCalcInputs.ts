import { computed, ref, watch, type Ref } from 'vue';
import {
  CalcInputError,
  celsiusFrom,
  fahrenheitFrom,
  kilogramsFrom,
  kilogramsTo,
  litresFrom,
  litresTo,
  tidyNumber,
  type MassUnit,
  type UnitSystem,
  type VolumeUnit,
} from '@shared/calc';
import { useUnits } from '@/composables/useUnits';
import { EmptyField } from './useCalcResult';

/** Kinds of quantity whose unit follows the page's unit system. */
export type Quantity = 'volume' | 'mass' | 'temperature';

const VOLUME_UNIT: Record<UnitSystem, VolumeUnit> = { metric: 'L', us: 'US gal' };
const MASS_UNIT: Record<UnitSystem, MassUnit> = { metric: 'kg', us: 'lb' };
const TEMPERATURE_UNIT: Record<UnitSystem, 'C' | 'F'> = { metric: 'C', us: 'F' };

/** The unit a quantity is typed in, as shown beside the field. */
export function unitLabel(quantity: Quantity, system: UnitSystem): string {
  if (quantity === 'volume') return VOLUME_UNIT[system];
  if (quantity === 'mass') return MASS_UNIT[system];
  return `°${TEMPERATURE_UNIT[system]}`;
}

const NUMBER_TEXT = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/;

/**
 * Reads a typed number. Empty → null; a number (a decimal comma is accepted) → number;
 * anything else is handed on as typed, so the library rejects it with its own message.
 * @param text - what is in the field
 */
export function readNumber(text: string | null | undefined): number | string | null {
  const t = (text ?? '').trim();
  if (t === '') return null;
  return NUMBER_TEXT.test(t) ? Number(t.replace(',', '.')) : t;
}

/**
 * A required field's value for the library. Empty fields stop the calculation quietly
 * (EmptyField); text that is not a number is passed through for the library to reject.
 * @param text - what is in the field
 */
export function need(text: string | null | undefined): number {
  const v = readNumber(text);
  if (v === null) throw new EmptyField();
  // The library checks its arguments at run time and names a non-number in its message.
  return v as number;
}

/**
 * An optional field's value, or `fallback` when it is empty.
 * @param text - what is in the field
 * @param fallback - value used when the field is empty
 */
export function optional(text: string | null | undefined, fallback: number): number {
  const v = readNumber(text);
  return v === null ? fallback : (v as number);
}

/** Re-labels a conversion's complaint (about its `value` argument) with the form's own argument name. */
function asField<T>(field: string, convert: () => T): T {
  try {
    return convert();
  } catch (err) {
    if (err instanceof CalcInputError) throw new CalcInputError(field, err.message);
    throw err;
  }
}

/**
 * Converts a value typed in the page's units to SI (litres, kilograms, °C) with the library.
 * @param value - the typed value (from need/optional)
 * @param quantity - what it measures
 * @param system - the units it was typed in
 * @param field - library argument name to report if it is rejected
 */
export function toSI(value: number, quantity: Quantity, system: UnitSystem, field: string): number {
  return asField(field, () => {
    if (quantity === 'volume') return litresFrom(value, VOLUME_UNIT[system]);
    if (quantity === 'mass') return kilogramsFrom(value, MASS_UNIT[system]);
    return celsiusFrom(value, TEMPERATURE_UNIT[system]);
  });
}

/**
 * Converts an SI value to the page's units.
 * @param si - litres, kilograms or °C
 * @param quantity - what it measures
 * @param system - the units wanted
 */
export function fromSI(si: number, quantity: Quantity, system: UnitSystem): number {
  if (quantity === 'volume') return litresTo(si, VOLUME_UNIT[system]);
  if (quantity === 'mass') return kilogramsTo(si, MASS_UNIT[system]);
  return system === 'us' ? fahrenheitFrom(si) : si;
}

/** Re-expresses typed text in the other unit system; text that is not a valid amount stays as it is. */
function convertText(text: string, quantity: Quantity, from: UnitSystem, to: UnitSystem): string {
  const v = readNumber(text);
  if (typeof v !== 'number') return text;
  try {
    return tidyNumber(fromSI(toSI(v, quantity, from, 'value'), quantity, to));
  } catch {
    return text;
  }
}

/**
 * A number field in the page's units. When the units are switched, the typed amount is
 * converted (a default becomes the other system's round default: 20 L ↔ 5 US gal).
 * @param quantity - what it measures
 * @param defaults - starting text in each system ('' for none)
 */
export function useQuantityInput(quantity: Quantity, defaults: Record<UnitSystem, string>) {
  const { system } = useUnits();
  const text = ref(defaults[system.value]);
  watch(system, (next, prev) => {
    text.value = text.value.trim() === defaults[prev] ? defaults[next] : convertText(text.value, quantity, prev, next);
  });
  const suffix = computed(() => unitLabel(quantity, system.value));
  /** The value in SI for a required field. */
  const si = (field: string) => toSI(need(text.value), quantity, system.value, field);
  /** The value in SI for an optional field, `fallbackSI` when empty. */
  const siOr = (field: string, fallbackSI: number) =>
    readNumber(text.value) === null ? fallbackSI : toSI(need(text.value), quantity, system.value, field);
  return { text, suffix, si, siOr };
}

const LIST_SEPARATOR = /[\s,;]+/;

/**
 * Splits a typed list ("4.5, 11, 19, 23") into its entries.
 * @param text - what is in the field
 */
export function listItems(text: string): string[] {
  return text
    .trim()
    .split(LIST_SEPARATOR)
    .filter((s) => s !== '');
}

/**
 * A list of amounts in the page's units, separated by commas or spaces, converted on a switch.
 * @param quantity - what each entry measures
 * @param defaults - starting text in each system
 */
export function useQuantityListInput(quantity: Quantity, defaults: Record<UnitSystem, string>) {
  const { system } = useUnits();
  const text: Ref<string> = ref(defaults[system.value]);
  watch(system, (next, prev) => {
    if (text.value.trim() === defaults[prev]) text.value = defaults[next];
    else
      text.value = listItems(text.value)
        .map((item) => convertText(item, quantity, prev, next))
        .join(', ');
  });
  const suffix = computed(() => unitLabel(quantity, system.value));
  /**
   * Every entry in SI; throws EmptyField for an empty list.
   * @param field - names each rejected entry as `field[i]`
   */
  const si = (field: string) => {
    const items = listItems(text.value);
    if (items.length === 0) throw new EmptyField();
    return items.map((item, i) => toSI(need(item), quantity, system.value, `${field}[${i}]`));
  };
  return { text, suffix, si };
}
