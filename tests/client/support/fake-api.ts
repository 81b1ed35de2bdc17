import { vi } from 'vitest';

/** One request the client made, as the fake server saw it. */
export interface ApiCall {
  method: string;
  path: string;
  query: URLSearchParams;
  /** The JSON body parsed back, or what was sent when it was not JSON (a FormData). */
  body: unknown;
  headers: Headers;
}

/** What the fake server answers: a status (200 unless said) and a JSON body. */
export interface FakeAnswer {
  status?: number;
  body?: unknown;
}

type Handler = (call: ApiCall) => FakeAnswer | Promise<FakeAnswer>;

/**
 * A stand-in for the server at the `fetch` boundary: the client's real api modules run, and
 * only the network is replaced. Routes registered later win over earlier ones, so a test can
 * change one answer; an unknown route answers 404 like the real server.
 */
export function fakeApi() {
  const routes: { method: string; path: string | RegExp; handler: Handler }[] = [];
  const calls: ApiCall[] = [];

  const fetchFake = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> => {
    const url = new URL(String(input), 'http://cellar.test');
    const method = (init.method ?? 'GET').toUpperCase();
    const body = typeof init.body === 'string' ? JSON.parse(init.body) : (init.body ?? undefined);
    const call: ApiCall = { method, path: url.pathname, query: url.searchParams, body, headers: new Headers(init.headers) };
    calls.push(call);
    const route = [...routes]
      .reverse()
      .find((r) => r.method === method && (typeof r.path === 'string' ? r.path === url.pathname : r.path.test(url.pathname)));
    const answer = route
      ? await route.handler(call)
      : { status: 404, body: { error: 'not_found', message: `Nothing at ${method} ${url.pathname}.` } };
    const status = answer.status ?? 200;
    return new Response(status === 204 ? null : JSON.stringify(answer.body ?? {}), {
      status,
      headers: { 'content-type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchFake);

  return {
    calls,
    /** Answers `method path` with a fixed answer, or with what `handler` makes of the call. */
    on(method: string, path: string | RegExp, answer: FakeAnswer | Handler): void {
      routes.push({ method, path, handler: typeof answer === 'function' ? answer : () => answer });
    },
    /** The calls made to `method path`, oldest first. */
    callsTo(method: string, path: string | RegExp): ApiCall[] {
      return calls.filter((c) => c.method === method && (typeof path === 'string' ? c.path === path : path.test(c.path)));
    },
  };
}

export type FakeApi = ReturnType<typeof fakeApi>;
