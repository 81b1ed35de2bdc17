import { watch } from 'vue';

/**
 * Runs `open` every time the dialog's v-model turns true (and at once if it starts open), so
 * each opening starts from a fresh form and freshly loaded data.
 */
export function onDialogOpen(isOpen: () => boolean, open: () => Promise<void> | void): void {
  watch(isOpen, (now) => now && void open(), { immediate: true });
}
