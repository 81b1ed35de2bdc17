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
 * Every request from a cellar's pages names the units this person reads, the same choice as
 * `useUnits`, so the server's own messages ("Demijohn 4 holds 5.55 US gal …") read in them.
 * Called by the layout of the cellar's pages (not at start, which would put the stores in the
 * first script); the choice is handed to the API layer when it changes (at once: a request made
 * right after the switch already names the new units), not looked up on every request.
 */
export function useUnitsInRequests(): void {
  const preferences = usePreferencesStore();
  const cellar = useCellarStore();
  watch(() => preferences.unitsFor(cellar.settings?.unitSystem), setUnitsShown, { immediate: true, flush: 'sync' });
}
