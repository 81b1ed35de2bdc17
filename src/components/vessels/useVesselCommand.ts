import { ref } from 'vue';
import { useQuasar } from 'quasar';
import { ApiError, QueuedOfflineError } from '@/api/http';

/**
 * Runs one change to a vessel with a busy flag and a clear message. A 409 (someone changed the
 * vessel meanwhile, or the step is not allowed from its state) shows the server's message and
 * reloads, so what is on screen matches the cellar again.
 * @param reload - fetches the vessel again
 */
export function useVesselCommand(reload: () => Promise<void> | void) {
  const $q = useQuasar();
  const busy = ref<string | null>(null);

  /** @param reloadAfter - false when the vessel is gone afterwards (deleted) */
  async function run(key: string, action: () => Promise<unknown>, success: string, reloadAfter = true): Promise<boolean> {
    busy.value = key;
    try {
      await action();
      $q.notify({ type: 'positive', message: success });
      if (reloadAfter) await reload();
      return true;
    } catch (err) {
      // Kept on the phone without signal: sent later, listed under "Waiting to send" — not a failure.
      if (err instanceof QueuedOfflineError) {
        $q.notify({ type: 'info', message: err.message });
        return true;
      }
      if (!(err instanceof ApiError)) throw err;
      $q.notify({ type: err.status === 409 ? 'warning' : 'negative', message: err.message, timeout: err.status === 409 ? 7000 : 4000 });
      if (err.status === 409) await reload();
      return false;
    } finally {
      busy.value = null;
    }
  }

  return { busy, run };
}
