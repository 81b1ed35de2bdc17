import { computed, ref } from 'vue';
import type { Vessel } from '@shared/schemas/vessels';
import { listVessels } from '@/api/vessels';

/** Vessels a hydrometer can float in (not retired), as select options that say what is in each. */
export function useDeviceVessels(cellarId: () => string) {
  const vessels = ref<Vessel[]>([]);
  const loading = ref(false);

  async function load(): Promise<void> {
    loading.value = true;
    try {
      vessels.value = (await listVessels(cellarId(), { pageSize: 200 })).items.filter((v) => v.state !== 'retired');
    } finally {
      loading.value = false;
    }
  }

  const options = computed(() => vessels.value.map((v) => ({ value: v.id, label: v.batch ? `${v.name} — ${v.batch.name}` : `${v.name} (empty)` })));
  return { options, loading, load };
}
