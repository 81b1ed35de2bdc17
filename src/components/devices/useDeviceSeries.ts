import { ref } from 'vue';
import type { DeviceSeries } from '@shared/schemas/devices';
import { fetchDeviceSeries } from '@/api/devices';

/**
 * A batch's device readings for its page. A failure leaves the series empty: the page works
 * without it, the chart simply has no device line.
 */
export function useDeviceSeries(cellarId: () => string, batchId: () => string) {
  const series = ref<DeviceSeries>({ points: [], days: [] });

  async function load(): Promise<void> {
    try {
      series.value = await fetchDeviceSeries(cellarId(), batchId());
    } catch {
      series.value = { points: [], days: [] };
    }
  }

  return { series, load };
}
