import { formatMass, type AbvFormula, type Strength, type Sweetness, type UnitSystem } from '@shared/calc';
import { FERMENTATION_WORDS } from '@/components/batches/fermentation-words';
import { formatDateInStyle } from '@/composables/date-style';
import { usePreferencesStore } from '@/stores/preferences';

/**
 * A number to a fixed count of decimals, never "-0".
 * @param value - the number
 * @param decimals - decimals to show
 */
export function fixed(value: number, decimals: number): string {
  const s = value.toFixed(decimals);
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s;
}

/** A specific gravity as a hydrometer shows it (1.010). */
export const sg = (value: number) => fixed(value, 3);

/** % ABV to one decimal: a hydrometer reading supports no more. */
export const abv = (value: number) => `${fixed(value, 1)} % ABV`;

/** Each ABV formula's name as a figure's heading and as the line under it. */
export const ABV_FORMULA_WORDS: Record<AbvFormula, { name: string; by: string }> = {
  balling: { name: 'Balling relations', by: 'By the Balling relations.' },
  simple: { name: 'Linear formula', by: 'By the linear formula.' },
  'high-gravity': { name: 'High-gravity fit', by: 'By the high-gravity fit.' },
};

/**
 * A small dose (stabilisers) in grams, as kitchen and jeweller's scales weigh it; US units add ounces.
 * @param kilograms - the dose in kg
 * @param system - the page's units
 */
export function dose(kilograms: number, system: UnitSystem): string {
  const grams = kilograms * 1000;
  const metric = grams < 1000 ? `${fixed(grams, grams < 10 ? 2 : 1)} g` : formatMass(kilograms, 'metric');
  return system === 'us' && kilograms > 0 ? `${metric} (${formatMass(kilograms, 'us')})` : metric;
}

/** Plain words for the library's sweetness classes. */
export const SWEETNESS_WORDS: Record<Sweetness, string> = { dry: 'Dry', 'semi-sweet': 'Semi-sweet', sweet: 'Sweet' };

/** Plain words for the library's strength classes. */
export const STRENGTH_WORDS: Record<Strength, string> = { hydromel: 'Hydromel', standard: 'Standard', sack: 'Sack' };

/** Plain words and a one-line meaning for each fermentation state. */
/** The states' words, the same on every screen (one vocabulary: components/batches/fermentation-words.ts). */
export const STATE_WORDS = FERMENTATION_WORDS;

/**
 * Today's date as YYYY-MM-DD in this device's time zone, optionally shifted by whole days.
 * @param offsetDays - days to add (negative for the past)
 */
export function isoDate(offsetDays = 0): string {
  const d = new Date();
  d.setDate(d.getDate() + offsetDays);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
}

/**
 * A UTC date (as the library returns them) as a day in the user's date style.
 * @param date - the date
 */
export function readableDate(date: Date): string {
  return formatDateInStyle(date.toISOString().slice(0, 10), usePreferencesStore().dateStyle);
}
