import { ref } from 'vue';
import type { BatchDetail } from '@shared/schemas/batch-detail';
import { fetchBatch } from '@/api/batches';
import { ApiError } from '@/api/http';

/** The batch the Batch page shows, loaded once and replaced by each operation's answer. */
export function useBatchRecord(cellarId: () => string, batchId: () => string) {
  const batch = ref<BatchDetail | null>(null);
  const error = ref<string | null>(null);
  const notFound = ref(false);
  const loading = ref(false);

  async function load(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      batch.value = await fetchBatch(cellarId(), batchId());
      notFound.value = false;
    } catch (err) {
      notFound.value = err instanceof ApiError && err.status === 404;
      error.value = err instanceof Error ? err.message : 'Could not load the batch.';
    } finally {
      loading.value = false;
    }
  }

  /** Takes the batch as an operation left it. */
  function replace(next: BatchDetail): void {
    batch.value = next;
  }

  return { batch, error, notFound, loading, load, replace };
}
