import { computed, nextTick, onBeforeMount, reactive, ref, watch } from 'vue';
import { useQuasar } from 'quasar';
import type { core, ZodType } from 'zod';
import { ApiError, QueuedOfflineError } from '@/api/http';
import { useFormat } from '@/composables/useFormat';
import { useSessionStore } from '@/stores/session';

/** Field messages keyed by the request's field path (`sg`, `to.0.volumeL`, `override.reason`). */
export type FieldMessages = Record<string, string | undefined>;

/**
 * The events every operation dialog emits: its v-model, and `done` once the server has recorded
 * it. Method syntax, so the dialog's own `emit` (from defineEmits) is accepted as it is.
 */
interface OperationDialogEvents<Result> {
  emit(event: 'update:modelValue', open: boolean): void;
  emit(event: 'done', result: Result): void;
}

export interface OperationDialogOptions<Request, Result> {
  /** The dialog's props: its v-model opens and closes it. */
  props: { readonly modelValue: boolean };
  // Result is inferred from `send` alone; the dialog's emit must accept it.
  emit: OperationDialogEvents<NoInfer<Result>>['emit'];
  /** The shared zod schema the request must pass before anything is sent (a function when it depends on props). */
  schema: ZodType<Request> | (() => ZodType<Request>);
  /** The form as the request the schema checks; undefined while there is nothing to send (the batch is not loaded). */
  request: () => unknown;
  /** Rules the schema cannot know (room left in a vessel…): messages by field, or nothing when the request may go. */
  check?: (request: Request) => FieldMessages | null | undefined;
  /** Sends the checked request. */
  send: (cellarId: string, request: Request) => Promise<Result>;
  /** What the success notification says. */
  success: string | ((result: Result, request: Request) => string);
  /** The warnings shown after it (default: the result's `warnings`, if it has any). */
  warnings?: (result: Result) => string[];
  /** Resets the form and loads what the dialog needs; runs at every opening and on Reload. */
  onOpen?: () => Promise<void> | void;
  /** Runs after every request with its failure (null when it succeeded). */
  afterSend?: (failure: ApiError | null) => void;
  /**
   * The dialog fills vessels: a refusal for want of sanitising turns `overriding` on, and from
   * then on the request carries `override: { reason }` with the reason the user gives.
   */
  sanitiseOverride?: boolean;
}

/** The open cellar's id (the router guard sets it before any cellar page shows). */
export function useCellarId() {
  const session = useSessionStore();
  return computed(() => session.currentCellarId ?? '');
}

const WARNING_TIMEOUT_MS = 9000;
const QUEUED_MESSAGE = 'Saved on this phone — will send when back online.';

/** The result's own warnings, for results that carry them (OperationResult); none otherwise. */
function warningsOf(result: unknown): string[] {
  const warnings = (result as { warnings?: unknown } | null)?.warnings;
  return Array.isArray(warnings) ? warnings.filter((w): w is string => typeof w === 'string') : [];
}

/**
 * What every operation dialog does around its own form: a fresh start at each opening, the
 * shared schema's check before sending, the request in flight, the server's field messages
 * and failure, the success message and each warning, then `done` and closing.
 * A dialog mounted open runs `onOpen` once its setup has finished, before its first render.
 */
export function useOperationDialog<Request, Result>(options: OperationDialogOptions<Request, Result>) {
  const $q = useQuasar();
  const cellarId = useCellarId();
  // The server writes dates as YYYY-MM-DD; they are shown in the user's date style. The schema's
  // limits are metric; they are shown in the units the user types in.
  const { datesInMessage, limitsInUnits } = useFormat();
  const errors = reactive<FieldMessages>({});
  const busy = ref(false);
  const failure = ref<ApiError | null>(null);
  const overriding = ref(false);
  const overrideReason = ref('');

  /** Each marked field's value when its message was given: a change to it clears the message. */
  const valuesWhenShown = new Map<string, string>();

  function reset(): void {
    for (const key of Object.keys(errors)) delete errors[key];
    valuesWhenShown.clear();
    failure.value = null;
  }

  /** Remembers what each marked field held, and brings the first message into view (a phone shows little of a long form). */
  function markShownValues(): void {
    const form = options.request();
    for (const key of Object.keys(errors)) valuesWhenShown.set(key, JSON.stringify(valueAt(form, key)) ?? '');
    void nextTick(() => {
      const marked = document.querySelector('.q-dialog .q-field--error, .q-dialog [role="alert"]');
      marked?.scrollIntoView({ block: 'center', behavior: 'smooth' });
    });
  }

  /** Checks a request with its schema; fills `errors` and answers null when it does not pass. */
  function validate(value: unknown): Request | null {
    reset();
    const schema = typeof options.schema === 'function' ? options.schema() : options.schema;
    const parsed = schema.safeParse(value);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) errors[fieldKey(issue.path.join('.'))] ??= limitsInUnits(friendlyMessage(issue));
    markShownValues();
    return null;
  }

  /** Runs the request; an ApiError becomes field messages plus `failure`. */
  async function send(request: Request): Promise<{ ok: true; result: Result } | { ok: false; queued?: true }> {
    busy.value = true;
    failure.value = null;
    try {
      return { ok: true, result: await options.send(cellarId.value, request) };
    } catch (err) {
      // Kept on the phone to send later (src/offline/): nothing failed, nothing is recorded yet.
      if (err instanceof QueuedOfflineError) return { ok: false, queued: true };
      const apiError =
        err instanceof ApiError ? err : new ApiError(0, 'unexpected', 'The answer from the server was not understood. Reload and try again.');
      for (const issue of apiError.issues) errors[fieldKey(issue.path)] = datesInMessage(plainMessage(issue.message));
      // The banner says it in plain words too, with the field's name rather than its path.
      failure.value = new ApiError(apiError.status, apiError.code, datesInMessage(plainMessage(apiError.message)), apiError.issues, apiError.body);
      markShownValues();
      return { ok: false };
    } finally {
      busy.value = false;
    }
  }

  /** Tells the user it was recorded, and each warning the server added, long enough to read. */
  function notifyDone(message: string, warnings: string[]): void {
    $q.notify({ type: 'positive', message });
    for (const warning of warnings) {
      $q.notify({ type: 'warning', message: warning, timeout: WARNING_TIMEOUT_MS, actions: [{ label: 'OK', color: 'dark' }] });
    }
  }

  async function open(): Promise<void> {
    reset();
    if (options.sanitiseOverride) {
      overriding.value = false;
      overrideReason.value = '';
    }
    await options.onOpen?.();
  }

  async function submit(): Promise<void> {
    const form = options.request();
    if (form === undefined) return;
    const value = options.sanitiseOverride
      ? { ...(form as object), override: overriding.value ? { reason: overrideReason.value } : undefined }
      : form;
    const request = validate(value);
    if (request === null) return;
    const refusal = options.check?.(request);
    if (refusal) {
      Object.assign(errors, refusal);
      markShownValues();
      return;
    }
    const sent = await send(request);
    if (options.sanitiseOverride && isSanitiseRefusal(failure.value)) overriding.value = true;
    options.afterSend?.(failure.value);
    if (!sent.ok && sent.queued) {
      $q.notify({ type: 'info', icon: 'cloud_queue', message: QUEUED_MESSAGE });
      options.emit('update:modelValue', false);
      return;
    }
    if (!sent.ok) return;
    const message = typeof options.success === 'function' ? options.success(sent.result, request) : options.success;
    notifyDone(message, options.warnings ? options.warnings(sent.result) : warningsOf(sent.result));
    options.emit('done', sent.result);
    options.emit('update:modelValue', false);
  }

  // A message goes as soon as its field is changed (the fix is checked again on sending).
  watch(
    () => JSON.stringify(options.request() ?? null),
    () => {
      if (valuesWhenShown.size === 0) return;
      const form = options.request();
      for (const [key, shown] of valuesWhenShown) {
        if ((JSON.stringify(valueAt(form, key)) ?? '') !== shown) {
          delete errors[key];
          valuesWhenShown.delete(key);
        }
      }
    },
  );

  // Every opening starts from a fresh form and freshly loaded data.
  watch(
    () => options.props.modelValue,
    (isOpen) => isOpen && void open(),
  );
  onBeforeMount(() => {
    if (options.props.modelValue) void open();
  });

  return { cellarId, errors, busy, failure, overriding, overrideReason, open, submit };
}

// What a failed check or request means for an operation dialog: which field a message goes
// under, in plain words, and which failures the dialog answers itself.

/** A field path as the client keys its messages: `to.0.volumeL`. */
export function fieldKey(path: string): string {
  return path.replace(/^body\./, '').replace(/\[(\d+)\]/g, '.$1');
}

/**
 * The schema's own words where it has them; plain ones instead of zod's defaults
 * ("Invalid input: expected number, received null") for empty fields and unchosen options.
 */
export function friendlyMessage(issue: core.$ZodIssue): string {
  if (!issue.message.startsWith('Invalid')) return issue.message;
  if (issue.code === 'invalid_type') return issue.expected === 'number' ? 'enter a number' : 'fill this in';
  if (issue.code === 'invalid_format' && issue.format === 'uuid') return 'choose one';
  if (issue.code === 'invalid_value') return 'choose one of the options';
  return issue.message;
}

/** The server refused to fill a vessel that is not (or no longer) sanitised; a Hand may override with a reason. */
export function isSanitiseRefusal(err: ApiError | null): boolean {
  return !!err && err.status === 409 && err.body.overrideAllowed === true;
}

/** Someone else changed the batch or a vessel in the meantime: the message says what; reloading helps. */
export function isStale(err: ApiError | null): boolean {
  return !!err && err.status === 409 && !isSanitiseRefusal(err) && err.code !== 'confirmation_required';
}

/** "plannedVolumeL" → "Planned volume", "vessels.0.volumeL" → "Volume": a field's name in words. */
export function fieldWords(path: string): string {
  const last =
    fieldKey(path)
      .split('.')
      .filter((part) => !/^\d+$/.test(part))
      .pop() ?? '';
  const words = last
    .replace(/(L|C|Ml|Abv|Id)$/, '')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .trim();
  const plain: Record<string, string> = { og: 'original gravity', sg: 'gravity', ph: 'pH', 'started on': 'start date', 'remove on': 'take-out date' };
  const text = plain[words] ?? words;
  return text ? text.charAt(0).toUpperCase() + text.slice(1) : 'A value';
}

/**
 * A message from the server in plain words: zod's stock phrases ("Too small: expected number
 * to be >=0") said as a person would, and the request path in front of it ("body.startedOn: …")
 * replaced by the field's name, or by `label` when the form knows it.
 */
export function plainMessage(message: string, label?: string): string {
  const prefixed = /^(?:body|query|params)\.([\w.[\]]+): (.*)$/s.exec(message);
  const [path, text] = prefixed ? [prefixed[1], prefixed[2]] : ['', message];
  const said = text
    .replace(/^Too small: expected number to be >=?\s*(-?[\d.]+)$/, 'must be at least $1')
    .replace(/^Too small: expected number to be >\s*(-?[\d.]+)$/, 'must be more than $1')
    .replace(/^Too big: expected number to be <=?\s*(-?[\d.]+)$/, 'must be at most $1')
    .replace(/^Too small: expected string to have >=1 characters?$/, 'fill this in')
    .replace(/^Too big: expected string to have <=(\d+) characters?$/, 'at most $1 characters')
    .replace(/^Invalid input: expected number, received \w+$/, 'enter a number')
    .replace(/^Invalid input: expected \w+, received \w+$/, 'fill this in');
  if (!path) return said;
  return `${label ?? fieldWords(path)}: ${said}`;
}

/** The value at a field key (`to.0.volumeL`) of a form or request; undefined when there is none. */
export function valueAt(value: unknown, key: string): unknown {
  return key
    .split('.')
    .reduce<unknown>((at, part) => (at !== null && typeof at === 'object' ? (at as Record<string, unknown>)[part] : undefined), value);
}
