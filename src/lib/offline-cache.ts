/**
 * What the service worker (src/sw.ts) keeps of API answers, shared with the page so both name
 * the same things. Only the GETs a running session needs are kept, network first; the page
 * empties the cache when anyone signs in or out, so one person's copies never reach the next.
 */

/** The Cache Storage cache holding copies of API answers. */
export const apiCacheName = 'luxtempo-api-v1';

/** Set by the service worker on an answer it served from its copy because the network failed. */
export const offlineCopyHeader = 'X-Luxtempo-Offline-Copy';

/** The API GETs the step clock needs to open without network (path only; the query string is not used). */
export const offlineApiPaths: readonly RegExp[] = [
  /^\/api\/auth\/me$/,
  /^\/api\/unit$/,
  /^\/api\/orders\/\d+$/,
  /^\/api\/orders\/\d+\/session$/,
  /^\/api\/protocols\/[^/]+\/versions\/\d+$/,
];

/** Drops every kept API answer; the app shell (code, fonts, the page) stays. */
export async function clearOfflineCopies(): Promise<void> {
  try {
    if (typeof caches !== 'undefined') await caches.delete(apiCacheName);
  } catch {
    // No Cache Storage (an old browser, a locked-down profile): then nothing was kept either.
  }
}
