import type { ZodType } from 'zod';
import { v4 as uuidV4 } from 'uuid';
import type { UnitSystem } from '@shared/calc';
import { UNITS_HEADER } from '@shared/schemas/cellars';
import { apiErrorSchema } from '@shared/schemas/common';
import type { NewQueuedWrite } from '@/offline/outbox';
import type { QueuedWriteKind } from '@/offline/queued-write';
import { takeEarlyAnswer } from './early-requests';

/**
 * Addresses of the API, built in one place: `apiPath('scan', code)` is `/api/scan/<code>`,
 * `cellarPath(cellarId, 'vessels', id)` is `/api/cellars/<cellarId>/vessels/<id>`. Every part
 * is URL-encoded, so an id can never change the path.
 */
export function apiPath(...segments: string[]): string {
  return `/api/${segments.map(encodeURIComponent).join('/')}`;
}

/**
 * A path under one cellar, where the server's access gate checks the caller's role.
 * @param segments - the resource and what follows it, e.g. `'batches', batchId, 'readings'`
 */
export function cellarPath(cellarId: string, ...segments: string[]): string {
  return apiPath('cellars', cellarId, ...segments);
}

/**
 * The path with a query string of the filled-in parameters only (undefined, null and '' are
 * left out, so the server applies its defaults).
 */
export function withQuery(path: string, params: object): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${path}?${text}` : path;
}

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

let unitsShown: UnitSystem | undefined;
/** The units the person reads, kept here whenever they change (`useUnitsInRequests`); undefined: none named. */
export function setUnitsShown(units: UnitSystem | undefined): void {
  unitsShown = units;
}

/** The header that asks the server to word its messages ("… holds 5.55 US gal") in the person's units. */
export function unitsHeader(): Record<string, string> {
  return unitsShown ? { [UNITS_HEADER]: unitsShown } : {};
}

let onUnauthorized: (() => void) | undefined;
/** Called when any request answers 401 (the session ended). */
export function setUnauthorizedHandler(handler: () => void): void {
  onUnauthorized = handler;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

/** How the API layer reaches the offline queue (src/offline/, wired in main.ts). */
export interface OfflineHooks {
  /** Keeps a write on the phone, to be sent when the connection returns. */
  queue(write: Omit<NewQueuedWrite, 'userId'>): Promise<void>;
  /** Every request tells whether it reached the server (for the offline banner). */
  reached(ok: boolean): void;
}
let offlineHooks: OfflineHooks | undefined;
export function setOfflineHooks(hooks: OfflineHooks | undefined): void {
  offlineHooks = hooks;
}

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
export async function request<T>(method: Method, url: string, schema?: ZodType<T>, body?: unknown, headers: Record<string, string> = {}): Promise<T> {
  let res: Response;
  try {
    const early = method === 'GET' && Object.keys(headers).length === 0 ? takeEarlyAnswer(url) : undefined;
    res = await (early ??
      fetch(url, {
        method,
        credentials: 'same-origin',
        headers: {
          accept: 'application/json',
          ...(body === undefined ? {} : { 'content-type': 'application/json' }),
          ...unitsHeader(),
          ...headers,
        },
        body: body === undefined ? undefined : JSON.stringify(body),
      }));
  } catch {
    offlineHooks?.reached(false);
    throw offlineError();
  }
  offlineHooks?.reached(true);
  if (!res.ok) {
    const raw = await res.json().catch(() => ({}));
    if (res.status === 401 && !url.endsWith('/auth/sign-in')) onUnauthorized?.();
    throw errorFromAnswer(res.status, raw);
  }
  if (!schema || res.status === 204) return undefined as T;
  return schema.parse(await res.json());
}

/** Thrown when a write was kept on the phone instead of sent: not a failure, the dialog says so and closes. */
export class QueuedOfflineError extends ApiError {
  constructor() {
    super(0, 'queued', 'Saved on this phone — will send when back online.');
  }
}

/** What a write that may wait for the connection is, for the queue and the person. */
export interface QueueableWrite {
  kind: QueuedWriteKind;
  /** In people's words: "Reading 1.012". */
  label: string;
  cellarId: string;
  /**
   * The field that says when it happened: a queued write fills it with the moment it was made,
   * so it keeps its own time, not the time it is sent.
   */
  stampField?: string;
}

/**
 * A fresh key for one write: a version-4 UUID from the `uuid` package, which also works where
 * `crypto.randomUUID` is missing (a phone reaching the app over plain HTTP on the local network).
 */
const newIdempotencyKey = (): string => uuidV4();

/**
 * A write that survives a missing connection: sent at once with an Idempotency-Key when there
 * is a connection; kept on the phone (QueuedOfflineError) when there is none or the request
 * never reached the server, and sent later with the same key, so it is recorded once.
 */
export async function requestOrQueue<T>(method: 'POST' | 'PUT', url: string, schema: ZodType<T>, body: object, write: QueueableWrite): Promise<T> {
  const key = newIdempotencyKey();
  const madeAt = new Date();
  const keep = async (): Promise<never> => {
    const stamped: Record<string, unknown> = { ...body };
    if (write.stampField && stamped[write.stampField] === undefined) stamped[write.stampField] = madeAt.toISOString();
    await offlineHooks!.queue({
      id: key,
      kind: write.kind,
      label: write.label,
      method,
      url,
      body: stamped,
      madeAt: madeAt.toISOString(),
      cellarId: write.cellarId,
    });
    throw new QueuedOfflineError();
  };
  if (offlineHooks && navigator.onLine === false) return keep();
  try {
    return await request(method, url, schema, body, { 'Idempotency-Key': key });
  } catch (err) {
    if (offlineHooks && err instanceof ApiError && err.code === 'offline') return keep();
    throw err;
  }
}
