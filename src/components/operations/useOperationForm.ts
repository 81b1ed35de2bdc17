import { reactive, ref } from 'vue';
import type { core, ZodType } from 'zod';
import { ApiError } from '@/api/http';

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

/**
 * Form state every operation dialog shares: field messages (from the shared zod schema first,
 * then from the server's issues), the request in flight, and the last failure to show.
 */
export function useOperationForm() {
  const errors = reactive<Record<string, string | undefined>>({});
  const busy = ref(false);
  const failure = ref<ApiError | null>(null);

  function reset(): void {
    for (const key of Object.keys(errors)) delete errors[key];
    failure.value = null;
  }

  /** Checks a request with its shared schema; fills `errors` and answers null when it does not pass. */
  function validate<T>(schema: ZodType<T>, value: unknown): T | null {
    reset();
    const parsed = schema.safeParse(value);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) errors[fieldKey(issue.path.join('.'))] ??= friendlyMessage(issue);
    return null;
  }

  /** Runs the request; an ApiError becomes field messages plus `failure`, and null is answered. */
  async function send<T>(action: () => Promise<T>): Promise<T | null> {
    busy.value = true;
    failure.value = null;
    try {
      return await action();
    } catch (err) {
      const apiError =
        err instanceof ApiError ? err : new ApiError(0, 'unexpected', 'The answer from the server was not understood. Reload and try again.');
      for (const issue of apiError.issues) errors[fieldKey(issue.path)] = issue.message;
      failure.value = apiError;
      return null;
    } finally {
      busy.value = false;
    }
  }

  return { errors, busy, failure, reset, validate, send };
}
