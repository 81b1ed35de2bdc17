import { computed } from 'vue';
import { useCellarStore } from '@/stores/cellar';
import { usePreferencesStore, type UnitSystem } from '@/stores/preferences';

/** The unit system to show figures in, and a way to switch it on this device. */
export function useUnits() {
  const cellar = useCellarStore();
  const preferences = usePreferencesStore();
  const system = computed<UnitSystem>(() => preferences.unitsFor(cellar.settings?.unitSystem));
  return { system, setSystem: preferences.setUnits };
}
