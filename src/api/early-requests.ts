import { EARLY_REQUESTS_GLOBAL } from '@shared/early-requests';

/** After this long an early answer is stale for the page asking: it fetches afresh. */
const EARLY_ANSWER_FRESH_MS = 10_000;

type EarlyAnswers = Record<string, Promise<Response> | undefined>;

/**
 * The answer index.html's early script (shared/early-requests.ts) already asked for, taken once:
 * the first load of a page then waits for no round trip its JavaScript could have overlapped.
 * Undefined when there is none, or when it is too old to show.
 * @param url - exactly as `request()` would fetch it
 */
export function takeEarlyAnswer(url: string): Promise<Response> | undefined {
  const early = (window as unknown as Record<string, EarlyAnswers | undefined>)[EARLY_REQUESTS_GLOBAL];
  const answer = early?.[url];
  if (!answer) return undefined;
  delete early[url];
  return performance.now() <= EARLY_ANSWER_FRESH_MS ? answer : undefined;
}
