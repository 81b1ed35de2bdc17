import type { Pinia } from 'pinia';
import { computed } from 'vue';
import { setUnitsSource } from '@/api/http';
import { useCellarStore } from '@/stores/cellar';
import { usePreferencesStore, type UnitSystem } from '@/stores/preferences';

/** The unit system to show figures in, and a way to switch it on this device. */
export function useUnits() {
  const cellar = useCellarStore();
  const preferences = usePreferencesStore();
  const system = computed<UnitSystem>(() => preferences.unitsFor(cellar.settings?.unitSystem));
  return { system, setSystem: preferences.setUnits };
}

/**
 * Every request names the units this person reads, the same choice as `useUnits`, so the
 * server's own messages ("Demijohn 4 holds 5.55 US gal …") read in them. Called once at start.
 */
export function sendUnitsWithRequests(pinia: Pinia): void {
  setUnitsSource(() => usePreferencesStore(pinia).unitsFor(useCellarStore(pinia).settings?.unitSystem));
}
