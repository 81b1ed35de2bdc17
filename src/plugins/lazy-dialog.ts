import type { App, Plugin } from 'vue';
import type { DialogChainObject, QDialogOptions, QVueGlobals } from 'quasar';

type CreateDialog = (options: QDialogOptions) => DialogChainObject;

/**
 * `$q.dialog(...)` as Quasar's Dialog plugin offers it, with the plugin's code (a dialog, an input,
 * radios, checkboxes: about 10 kB compressed) fetched on the first call instead of with the first
 * page: only a few confirmations use it. Calls on the returned chain (`onOk`, `onCancel`, `hide`…)
 * made before the code arrives are replayed on Quasar's own chain, in order. Install after Quasar.
 */
export const lazyDialog: Plugin = {
  install(app: App) {
    const $q = app.config.globalProperties.$q as QVueGlobals;
    let loading: Promise<CreateDialog> | null = null;
    const load = () => (loading ??= import('./quasar-dialog').then(({ installQuasarDialog }) => installQuasarDialog($q, app)));

    $q.dialog = (options: QDialogOptions): DialogChainObject => {
      let opened: DialogChainObject | null = null;
      const waiting: ((chain: DialogChainObject) => void)[] = [];
      const whenOpened = (step: (chain: DialogChainObject) => void): DialogChainObject => {
        if (opened) step(opened);
        else waiting.push(step);
        return chain;
      };
      const chain: DialogChainObject = {
        onOk: (fn) => whenOpened((c) => c.onOk(fn)),
        onCancel: (fn) => whenOpened((c) => c.onCancel(fn)),
        onDismiss: (fn) => whenOpened((c) => c.onDismiss(fn)),
        hide: () => whenOpened((c) => c.hide()),
        update: (changes) => whenOpened((c) => c.update(changes)),
      };
      load().then(
        (create) => {
          opened = create(options);
          for (const step of waiting.splice(0)) step(opened);
        },
        () => {
          // The code could not be fetched (no signal, and the app not yet kept on the phone): say so.
          loading = null;
          $q.notify({ type: 'negative', message: 'Could not open the confirmation. Check the connection and try again.' });
        },
      );
      return chain;
    };
  },
};
