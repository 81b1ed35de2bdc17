import { ref } from 'vue';

/** A new version of the app is installed and waits for the person to reload into it. */
export const updateWaiting = ref(false);

let applyUpdate: (() => Promise<void>) | null = null;

/**
 * Registers the service worker (built by vite-plugin-pwa; absent in development and tests)
 * and notes when a new version waits. Called once from main.ts.
 */
export async function registerAppWorker(): Promise<void> {
  if (!('serviceWorker' in navigator) || import.meta.env.DEV) return;
  const { registerSW } = await import('virtual:pwa-register');
  const update = registerSW({
    onNeedRefresh: () => {
      updateWaiting.value = true;
    },
  });
  applyUpdate = () => update(true);
}

/** Switches to the waiting version and reloads the page into it. */
export async function reloadIntoUpdate(): Promise<void> {
  updateWaiting.value = false;
  if (applyUpdate) await applyUpdate();
  else window.location.reload();
}
