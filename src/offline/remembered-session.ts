import { sessionUserSchema, type SessionUser } from '@shared/schemas/auth';
import { RECORDS_CACHE } from './cache-names';
import { indexedDbAvailable, offlineDb } from './offline-db';

const REMEMBERED_USER_KEY = 'cellarwright.offlineUser';

/**
 * The signed-in person as the server last said, so the app opens in a cellar without signal
 * (the service worker never keeps session answers). Used only when the session cannot be
 * asked for; the server still checks every request once the connection returns.
 */
export function rememberSession(user: SessionUser): void {
  localStorage.setItem(REMEMBERED_USER_KEY, JSON.stringify(user));
}

export function rememberedSession(): SessionUser | null {
  const parsed = sessionUserSchema.safeParse(JSON.parse(localStorage.getItem(REMEMBERED_USER_KEY) ?? 'null'));
  return parsed.success ? parsed.data : null;
}

/** At sign-out: nothing of this person's cellars stays readable on the phone. */
export function forgetRememberedSession(): void {
  localStorage.removeItem(REMEMBERED_USER_KEY);
  if (typeof caches !== 'undefined') void caches.delete(RECORDS_CACHE);
  if (indexedDbAvailable()) void offlineDb().then((db) => db.clear('labels'));
}
