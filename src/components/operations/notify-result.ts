import type { QVueGlobals } from 'quasar';

/**
 * Tells the user an operation was recorded, and each warning the server added (headspace,
 * a lapsed sanitising overridden, the glass caution…), each kept on screen long enough to read.
 */
export function notifyDone($q: QVueGlobals, message: string, warnings: string[] = []): void {
  $q.notify({ type: 'positive', message });
  for (const warning of warnings) {
    $q.notify({ type: 'warning', message: warning, timeout: 9000, actions: [{ label: 'OK', color: 'dark' }] });
  }
}
