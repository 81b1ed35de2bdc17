import { ref } from 'vue';
import type { BatchDetail } from '@shared/schemas/batch-detail';
import { fetchBatch } from '@/api/batches';
import { useCellarId } from './useOperationDialog';

/** The batch an operation dialog works on, loaded fresh each time the dialog opens. */
export function useDialogBatch(batchId: () => string) {
  const cellarId = useCellarId();
  const batch = ref<BatchDetail | null>(null);
  const loading = ref(false);
  const loadError = ref<string | null>(null);

  async function load(): Promise<BatchDetail | null> {
    loading.value = true;
    loadError.value = null;
    try {
      batch.value = await fetchBatch(cellarId.value, batchId());
      return batch.value;
    } catch (err) {
      loadError.value = err instanceof Error ? err.message : 'Could not load the batch.';
      return null;
    } finally {
      loading.value = false;
    }
  }

  return { cellarId, batch, loading, loadError, load };
}

/**
 * Choices of "which vessel" for an operation on a batch: the whole batch first, then each
 * vessel holding it with its volume in the user's units.
 */
export function batchVesselOptions(batch: BatchDetail | null, volume: (litres: number) => string, wholeLabel: string) {
  return [
    { value: null as string | null, label: wholeLabel },
    ...(batch?.vessels ?? []).map((v) => ({ value: v.id as string | null, label: `${v.name}\u00a0· ${volume(v.volumeL)}` })),
  ];
}
