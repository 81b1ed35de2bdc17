import type { Pinia } from 'pinia';
import { computed, watch } from 'vue';
import { setUnitsShown } from '@/api/http';
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
 * server's own messages ("Demijohn 4 holds 5.55 US gal …") read in them. Called once at start;
 * the choice is handed to the API layer when it changes (at once: a request made right after
 * the switch already names the new units), not looked up on every request.
 */
export function sendUnitsWithRequests(pinia: Pinia): void {
  const preferences = usePreferencesStore(pinia);
  const cellar = useCellarStore(pinia);
  watch(() => preferences.unitsFor(cellar.settings?.unitSystem), setUnitsShown, { immediate: true, flush: 'sync' });
}
