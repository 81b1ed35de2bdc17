import { defineStore } from 'pinia';
import { ref, watch } from 'vue';
import type { UNIT_SYSTEMS } from '@shared/schemas/cellars';

export type UnitSystem = (typeof UNIT_SYSTEMS)[number];
const UNITS_KEY = 'cellarwright.units';

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

  return { unitOverride, unitsFor, setUnits };
});
