import { describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { defineComponent, h } from 'vue';
import { useQuasar, type DialogChainObject } from 'quasar';
import { mountInApp } from './support/mount-in-app';

/** A component that opens one confirmation as the app's pages do, and hands back its chain. */
function confirmer(onChain: (chain: DialogChainObject) => void) {
  return defineComponent({
    setup() {
      const $q = useQuasar();
      return () =>
        h('button', {
          'data-test': 'ask',
          onClick: () => onChain($q.dialog({ title: 'Drop it?', message: 'This cannot be undone.', cancel: true })),
        });
    },
  });
}

const dialogButton = (label: string) =>
  [...document.querySelectorAll<HTMLButtonElement>('.q-dialog button')].find((b) => b.textContent?.trim() === label);

/** Mounts a page that asks once, with onOk and onCancel chained at once (before the dialog's code has arrived). */
async function askWithChain() {
  const ok = vi.fn();
  const cancel = vi.fn();
  const { wrapper } = await mountInApp(
    confirmer((chain) => chain.onOk(ok).onCancel(cancel)),
    '/sign-in',
  );
  await wrapper.get('[data-test=ask]').trigger('click');
  return { ok, cancel, wrapper };
}

describe('$q.dialog loaded on first use', () => {
  it('opens Quasar’s dialog once its code has arrived, and runs onOk chained before that, once', async () => {
    const { ok, cancel, wrapper } = await askWithChain();
    await vi.waitFor(() => expect(document.querySelector('.q-dialog')?.textContent).toContain('This cannot be undone.'));
    dialogButton('OK')!.click();
    await flushPromises();
    expect(ok).toHaveBeenCalledTimes(1);
    expect(cancel).not.toHaveBeenCalled();
    wrapper.unmount();
  });

  it('runs onCancel, not onOk, for Cancel', async () => {
    const { ok, cancel, wrapper } = await askWithChain();
    await vi.waitFor(() => expect(dialogButton('Cancel')).toBeTruthy());
    dialogButton('Cancel')!.click();
    await vi.waitFor(() => expect(cancel).toHaveBeenCalledTimes(1));
    expect(ok).not.toHaveBeenCalled();
    wrapper.unmount();
  });
});
