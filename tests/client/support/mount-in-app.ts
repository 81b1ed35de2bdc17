import { flushPromises, mount, type ComponentMountingOptions } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { Notify, Quasar } from 'quasar';
import { createMemoryHistory } from 'vue-router';
import type { Component } from 'vue';
import { lazyDialog } from '@/plugins/lazy-dialog';
import { createAppRouter } from '@/router';

// As src/main.ts sets it up, except that notifications are neither grouped nor stacked newest
// first: tests in a file share Quasar's notification list (Quasar installs it once), so each
// test reads the ones its own action added, in the order they were made.
const QUASAR_OPTIONS = { plugins: { Notify }, config: { notify: { position: 'bottom', timeout: 3500, group: false } } } as const;

/**
 * Mounts a component the way the app runs it: a fresh Pinia, the app's real router (with its
 * sign-in guard) on memory history, already at `path`, and Quasar with the Notify plugin and
 * `$q.dialog` loaded on first use (src/plugins/lazy-dialog.ts).
 * Quasar's dialogs and notifications render outside the component, into document.body.
 */
export async function mountInApp<C extends Component>(component: C, path: string, options: ComponentMountingOptions<C> = {}) {
  const pinia = createPinia();
  setActivePinia(pinia);
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(component, {
    ...options,
    attachTo: document.body,
    global: { ...options.global, plugins: [pinia, router, [Quasar, QUASAR_OPTIONS], lazyDialog] },
  } as ComponentMountingOptions<C>);
  await flushPromises();
  return { wrapper, router, pinia };
}

/** The messages of the notifications that `action` put on screen, in order. */
export async function notificationsFrom(action: () => Promise<unknown>): Promise<string[]> {
  const before = new Set(document.querySelectorAll('.q-notification'));
  await action();
  return [...document.querySelectorAll('.q-notification')]
    .filter((n) => !before.has(n))
    .map((n) => n.querySelector('.q-notification__message')?.textContent?.trim() ?? '');
}

/** One element of the page (Quasar dialogs render outside the mounted component), or a failure naming the selector. */
export function pick<E extends Element = HTMLElement>(selector: string): E {
  const found = document.querySelector<E>(selector);
  if (!found) throw new Error(`Nothing on the page matches ${selector}`);
  return found;
}

/**
 * Chooses an option of a Quasar select as a keyboard user does: focus it, open its menu with
 * the down arrow, then click the option with this label.
 * @param selector - where the select's data-test lands (its focus target)
 */
export async function chooseOption(selector: string, label: string): Promise<void> {
  const target = pick(selector);
  target.focus();
  target.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowDown', keyCode: 40, bubbles: true } as KeyboardEventInit));
  await flushPromises();
  const options = [...document.querySelectorAll<HTMLElement>('[role=option]')];
  const option = options.find((o) => o.textContent?.trim() === label);
  if (!option) throw new Error(`No option "${label}" in ${selector}; there are: ${options.map((o) => o.textContent?.trim()).join(', ')}`);
  option.click();
  await flushPromises();
}

/** The message Quasar shows under the field that holds this element (its error or hint). */
export function fieldMessage(selector: string): string {
  return pick(selector).closest('.q-field')?.querySelector('.q-field__messages')?.textContent?.trim() ?? '';
}
