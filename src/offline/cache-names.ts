/** The service worker's cache of API answers (pwa/runtime-caching.ts); cleared at sign-out. */
export const RECORDS_CACHE = 'cw-records';
