import type { App } from 'vue';
import { Dialog, type DialogChainObject, type QDialogOptions, type QVueGlobals } from 'quasar';

/** How Quasar installs a plugin; its typings leave `install` out. */
type InstallablePlugin = { install(options: { $q: QVueGlobals; parentApp: App }): void };

/**
 * Installs Quasar's Dialog plugin on an app already running (afterwards `$q.dialog` is Quasar's
 * own) and hands back its `create`. A module of its own so that it, and the dialog's components,
 * load only when imported (src/plugins/lazy-dialog.ts).
 * @param $q - the app's Quasar object
 * @param app - the app whose context the dialogs inherit (Pinia, router)
 */
export function installQuasarDialog($q: QVueGlobals, app: App): (options: QDialogOptions) => DialogChainObject {
  (Dialog as unknown as InstallablePlugin).install({ $q, parentApp: app });
  return Dialog.create;
}
