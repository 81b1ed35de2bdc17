import { defineStore } from 'pinia';
import { ref, watch } from 'vue';
import type { UNIT_SYSTEMS } from '@shared/schemas/cellars';
import { DATE_STYLES, DEFAULT_DATE_STYLE, type DateStyle } from '@/composables/date-style';

export type UnitSystem = (typeof UNIT_SYSTEMS)[number];
const UNITS_KEY = 'cellarwright.units';
const DATE_STYLE_KEY = 'cellarwright.dateStyle';

/**
 * This device's display choices. Units start from the cellar's setting and, once the user
 * switches them (e.g. on the Calculators page), are remembered on this device.
 */
export const usePreferencesStore = defineStore('preferences', () => {
  const stored = localStorage.getItem(UNITS_KEY);
  const unitOverride = ref<UnitSystem | null>(stored === 'metric' || stored === 'us' ? stored : null);

  watch(unitOverride, (value) => {
    if (value) localStorage.setItem(UNITS_KEY, value);
    else localStorage.removeItem(UNITS_KEY);
  });

  /** The units to show: the user's choice, else the cellar's. */
  function unitsFor(cellarUnits: UnitSystem | undefined): UnitSystem {
    return unitOverride.value ?? cellarUnits ?? 'metric';
  }

  function setUnits(value: UnitSystem): void {
    unitOverride.value = value;
  }

  /** How dates are shown and typed on this device (one style on every screen and field). */
  const storedStyle = localStorage.getItem(DATE_STYLE_KEY);
  const dateStyle = ref<DateStyle>((DATE_STYLES as readonly string[]).includes(storedStyle ?? '') ? (storedStyle as DateStyle) : DEFAULT_DATE_STYLE);

  function setDateStyle(value: DateStyle): void {
    dateStyle.value = value;
    localStorage.setItem(DATE_STYLE_KEY, value);
  }

  return { unitOverride, unitsFor, setUnits, dateStyle, setDateStyle };
});
