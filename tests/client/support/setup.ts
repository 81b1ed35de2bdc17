import { afterEach, vi } from 'vitest';
import { enableAutoUnmount } from '@vue/test-utils';

// Every test starts afresh: mounted components (and the Quasar dialogs they render into
// document.body) go, and so do the faked fetch and the preferences stored on this "device".
enableAutoUnmount(afterEach);
afterEach(() => {
  vi.unstubAllGlobals();
  localStorage.clear();
});
