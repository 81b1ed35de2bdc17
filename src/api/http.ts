import type { ZodType } from 'zod';
import { apiErrorSchema } from '@shared/schemas/common';

/** An error answer from the API, with the message the server chose for people. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: { path: string; message: string }[] = [],
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }

  /** The server's message for one field (e.g. `body.name`), for showing under that field. */
  fieldMessage(field: string): string | undefined {
    return this.issues.find((i) => i.path === field || i.path === `body.${field}`)?.message;
  }
}

let onUnauthorized: (() => void) | undefined;
/** Called when any request answers 401 (the session ended). */
export function setUnauthorizedHandler(handler: () => void): void {
  onUnauthorized = handler;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

/** The error thrown when the request never reached the server. */
export const offlineError = (): ApiError => new ApiError(0, 'offline', 'Cannot reach Cellarwright. Check the connection and try again.');

/**
 * The ApiError for an answer that is not ok: the server's code, message and field issues when
 * its body is the shared error shape, else a plain "answered 500".
 * @param raw - the answer's JSON body ({} when it had none)
 */
export function errorFromAnswer(status: number, raw: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(raw);
  const body = (typeof raw === 'object' && raw !== null ? raw : {}) as Record<string, unknown>;
  if (!parsed.success) return new ApiError(status, 'http_error', `The server answered ${status}.`, [], body);
  return new ApiError(status, parsed.data.error, parsed.data.message, parsed.data.issues ?? [], body);
}

/**
 * Calls the API and checks the answer against the shared zod schema.
 * @param schema - the response schema; omit for answers without a body (204)
 */
export async function request<T>(method: Method, url: string, schema?: ZodType<T>, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      credentials: 'same-origin',
      headers: body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw offlineError();
  }
  if (!res.ok) {
    const raw = await res.json().catch(() => ({}));
    if (res.status === 401 && !url.endsWith('/auth/sign-in')) onUnauthorized?.();
    throw errorFromAnswer(res.status, raw);
  }
  if (!schema || res.status === 204) return undefined as T;
  return schema.parse(await res.json());
}
