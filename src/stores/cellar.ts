import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Cellar } from '@shared/schemas/cellars';
import { fetchCellar } from '@/api/cellars';

/** Settings of the open cellar (units, time zone, thresholds). */
export const useCellarStore = defineStore('cellar', () => {
  const settings = ref<Cellar | null>(null);
  const loading = ref(false);

  async function load(cellarId: string): Promise<void> {
    if (settings.value?.id === cellarId) return;
    loading.value = true;
    try {
      settings.value = await fetchCellar(cellarId);
    } finally {
      loading.value = false;
    }
  }

  function replace(next: Cellar): void {
    settings.value = next;
  }

  function clear(): void {
    settings.value = null;
  }

  return { settings, loading, load, replace, clear };
});
