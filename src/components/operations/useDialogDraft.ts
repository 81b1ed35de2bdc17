import { toRaw, watch } from 'vue';

/** How a dialog's form is copied out and put back. */
export interface DraftHandle<T> {
  take: () => T;
  put: (draft: T) => void;
}

/**
 * Keeps what was typed into a dialog when it is closed without sending (Cancel, the close
 * button, a tap outside), for as long as the page stays: opening it again for the same thing
 * puts the form back as it was. A dialog that sent its request starts fresh next time.
 * @param key - what the dialog is for (a batch, a vessel): a draft is only put back for the same one
 */
export function useDialogDraft<T>(props: { readonly modelValue: boolean }, handle: DraftHandle<T>, key: () => string = () => '') {
  let saved: { key: string; value: T } | null = null;
  let sent = false;

  watch(
    () => props.modelValue,
    (isOpen, wasOpen) => {
      if (isOpen || !wasOpen) return;
      // A plain deep copy: the form holds only numbers, strings, nulls and arrays of them.
      if (!sent) saved = { key: key(), value: JSON.parse(JSON.stringify(toRaw(handle.take()))) as T };
      sent = false;
    },
  );

  return {
    /** Call once the request went through (useOperationDialog's afterSend without a failure). */
    sent(): void {
      sent = true;
      saved = null;
    },
    /** Call at the end of onOpen, after the fresh defaults: puts back the draft kept for this key, if any. */
    restore(): boolean {
      const draft = saved;
      saved = null;
      if (!draft || draft.key !== key()) return false;
      handle.put(draft.value);
      return true;
    },
  };
}
