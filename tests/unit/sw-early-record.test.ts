import { readFileSync } from 'node:fs';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { EARLY_REQUESTS_SCRIPT } from '../../shared/early-requests';

/**
 * public/sw-early-record.js in a stand-in for the service worker's global scope: its `fetch`
 * (the network) is a mock, and fetch events are dispatched by hand as the browser would.
 */
const SOURCE = readFileSync(new URL('../../public/sw-early-record.js', import.meta.url), 'utf8');
const ORIGIN = 'https://cellar.test';
const CELLAR = '0b6c3a52-4f0e-4d8a-9a61-2f3c4d5e6f70';
const VESSEL = '7d2e9f10-1a2b-4c3d-8e4f-5a6b7c8d9e0f';
const BATCH = 'c1d2e3f4-a5b6-4c7d-8e9f-0a1b2c3d4e5f';

interface Worker {
  network: ReturnType<typeof vi.fn>;
  /** The worker's global fetch after the script ran: what its routes call. */
  fetch: (input: RequestInfo | URL, init?: RequestInit) => Promise<Response>;
  navigate: (path: string) => void;
  request: (path: string, mode?: RequestMode) => void;
}

function startWorker(): Worker {
  const listeners: ((event: { request: { url: string; mode: RequestMode } }) => void)[] = [];
  let answered = 0;
  const network = vi.fn(() => Promise.resolve(new Response(`answer ${++answered}`)));
  const scope = {
    location: { href: `${ORIGIN}/sw.js`, origin: ORIGIN },
    fetch: network as unknown as typeof fetch,
    addEventListener: (type: string, listener: (typeof listeners)[number]) => {
      if (type === 'fetch') listeners.push(listener);
    },
  };
  new Function('self', SOURCE)(scope);
  const dispatch = (url: string, mode: RequestMode) => listeners.forEach((listener) => listener({ request: { url, mode } }));
  return {
    network,
    fetch: (input, init) => scope.fetch(input, init),
    navigate: (path) => dispatch(`${ORIGIN}${path}`, 'navigate'),
    request: (path, mode = 'cors') => dispatch(`${ORIGIN}${path}`, mode),
  };
}

const vesselRecord = `${ORIGIN}/api/cellars/${CELLAR}/vessels/${VESSEL}`;

describe('the service worker asks for a record page’s record as it serves the page', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it('asks once, with the early script’s headers, and hands that answer to the first GET of the URL only', async () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}`);
    expect(worker.network).toHaveBeenCalledTimes(1);
    expect(worker.network).toHaveBeenCalledWith(vesselRecord, { credentials: 'same-origin', headers: { accept: 'application/json' } });

    // The worker's route passes Request objects; the page's request for the record gets the early answer.
    expect(await (await worker.fetch(new Request(vesselRecord, { headers: { accept: 'application/json' } }))).text()).toBe('answer 1');
    expect(worker.network).toHaveBeenCalledTimes(1);
    // Taken once: the next request for the same record goes to the network.
    expect(await (await worker.fetch(vesselRecord)).text()).toBe('answer 2');
    expect(worker.network).toHaveBeenCalledTimes(2);
  });

  it('does the same for a Batch page, with or without a closing slash', async () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/batches/${BATCH}/`);
    expect(worker.network).toHaveBeenCalledWith(`${ORIGIN}/api/cellars/${CELLAR}/batches/${BATCH}`, expect.anything());
    expect(await (await worker.fetch(`/api/cellars/${CELLAR}/batches/${BATCH}`)).text()).toBe('answer 1');
    expect(worker.network).toHaveBeenCalledTimes(1);
  });

  it('asks for nothing on other pages, for requests that are not page loads, or for another site', () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/today`);
    worker.navigate(`/c/${CELLAR}/vessels`);
    worker.navigate(`/s/K7M2PQ4X`);
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}/photos`);
    worker.navigate(`/c/not-an-id/vessels/${VESSEL}`);
    worker.request(`/c/${CELLAR}/vessels/${VESSEL}`);
    worker.request(`/c/${CELLAR}/vessels/${VESSEL}`, 'no-cors');
    expect(worker.network).not.toHaveBeenCalled();
  });

  it('never answers a write with it', async () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}`);
    await worker.fetch(vesselRecord, { method: 'POST', body: '{}' });
    await worker.fetch(new Request(vesselRecord, { method: 'DELETE' }));
    expect(worker.network).toHaveBeenCalledTimes(3);
    // Still there for the GET.
    expect(await (await worker.fetch(vesselRecord)).text()).toBe('answer 1');
  });

  it('drops an answer nobody asked for within 10 s', async () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}`);
    vi.advanceTimersByTime(9_999);
    worker.navigate(`/c/${CELLAR}/batches/${BATCH}`);
    vi.advanceTimersByTime(1);
    expect(await (await worker.fetch(vesselRecord)).text()).toBe('answer 3');
    // The batch's early answer is younger and still waits.
    expect(await (await worker.fetch(`${ORIGIN}/api/cellars/${CELLAR}/batches/${BATCH}`)).text()).toBe('answer 2');
  });

  it("keeps the newer answer when the same page is opened again, past the older one's 10 s", async () => {
    const worker = startWorker();
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}`);
    vi.advanceTimersByTime(5_000);
    worker.navigate(`/c/${CELLAR}/vessels/${VESSEL}`);
    vi.advanceTimersByTime(5_000);
    expect(await (await worker.fetch(vesselRecord)).text()).toBe('answer 2');
    expect(await (await worker.fetch(vesselRecord)).text()).toBe('answer 3');
  });
});

/** The record URLs index.html's early script asks for on a page at `path` (run with stand-ins for the page). */
function earlyScriptRecordUrls(path: string): string[] {
  const asked: string[] = [];
  const page = {
    window: {},
    document: { getElementById: () => null, write: () => undefined, body: null, addEventListener: () => undefined },
    location: { pathname: path },
    fetch: (url: string) => {
      asked.push(url);
      return Promise.resolve({ ok: false });
    },
  };
  new Function('window', 'document', 'location', 'fetch', EARLY_REQUESTS_SCRIPT)(page.window, page.document, page.location, page.fetch);
  return asked.filter((url) => /\/(vessels|batches)\//.test(url)).map((url) => `${ORIGIN}${url}`);
}

describe('the worker and the early script agree on which record a page asks for', () => {
  it.each([
    `/c/${CELLAR}/vessels/${VESSEL}`,
    `/c/${CELLAR}/vessels/${VESSEL}/`,
    `/c/${CELLAR}/batches/${BATCH}`,
    `/c/${CELLAR}/vessels`,
    `/c/${CELLAR}/today`,
    `/c/${CELLAR}/vessels/${VESSEL}/photos`,
    `/c/not-an-id/vessels/${VESSEL}`,
  ])('%s', (path) => {
    const worker = startWorker();
    worker.navigate(path);
    // Otherwise the worker's answer would wait unused, and the page would ask the server again.
    expect(worker.network.mock.calls.map(([url]) => url)).toEqual(earlyScriptRecordUrls(path));
  });

  it('asks for a record on the record pages (the check above is not empty on both sides)', () => {
    expect(earlyScriptRecordUrls(`/c/${CELLAR}/vessels/${VESSEL}`)).toEqual([vesselRecord]);
  });
});
