/**
 * The service worker of the built app (vite-plugin-pwa, injectManifest; not used by `npx vite`).
 *
 * - The app shell — every built file (code, styles, fonts, icons) and index.html — is precached,
 *   and every navigation outside /api gets index.html, so a reload without network opens the app
 *   at the client route it was on instead of the browser's error page.
 * - The API GETs a running session needs (lib/offline-cache.ts) go network first: online the
 *   fresh answer wins and a copy is kept; without network the last copy is served, marked with a
 *   header so the page knows it is a copy. Only 200 answers are kept. Nothing else of the API
 *   is touched, and a POST never reaches a cache (routes here match GET only).
 * - The page empties the API cache on sign-in and sign-out.
 */
import {
  cleanupOutdatedCaches,
  createHandlerBoundToURL,
  precacheAndRoute,
  type PrecacheEntry,
} from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { NetworkFirst } from 'workbox-strategies';
import { takeOverMessage } from './lib/sw-messages';
import { apiCacheName, offlineApiPaths, offlineCopyHeader } from './lib/offline-cache';

/* The DOM typings are the project's; only the few service-worker members used here are named. */
interface WorkerScope {
  __WB_MANIFEST: (string | PrecacheEntry)[];
  location: Location;
  skipWaiting(): Promise<void>;
  clients: { claim(): Promise<void> };
  addEventListener(
    type: 'activate',
    listener: (event: Event & { waitUntil(promise: Promise<unknown>): void }) => void,
  ): void;
  addEventListener(type: 'message', listener: (event: { data: unknown }) => void): void;
}
const worker = self as unknown as WorkerScope;

// Written out as `self.__WB_MANIFEST`: the build replaces exactly that text with the list of built files.
precacheAndRoute((self as unknown as WorkerScope).__WB_MANIFEST);
cleanupOutdatedCaches();
registerRoute(
  new NavigationRoute(createHandlerBoundToURL('/index.html'), { denylist: [/^\/api\//] }),
);

registerRoute(
  ({ url, request }) =>
    url.origin === worker.location.origin &&
    request.method === 'GET' &&
    offlineApiPaths.some((pattern) => pattern.test(url.pathname)),
  new NetworkFirst({
    cacheName: apiCacheName,
    // A network that answers nothing (not refused, just silent) falls back to the copy after this long.
    networkTimeoutSeconds: 6,
    plugins: [
      { cacheWillUpdate: async ({ response }) => (response.status === 200 ? response : null) },
      {
        cachedResponseWillBeUsed: async ({ cachedResponse }) => {
          if (!cachedResponse) return null;
          const headers = new Headers(cachedResponse.headers);
          headers.set(offlineCopyHeader, headers.get('Date') ?? 'unknown');
          return new Response(cachedResponse.body, {
            status: cachedResponse.status,
            statusText: cachedResponse.statusText,
            headers,
          });
        },
      },
    ],
  }),
  'GET',
);

// A new version waits: taking over at once would drop the running version's files from the
// precache under a page still using them (a step clock mid-session, offline perhaps). The page
// asks it to take over when it is idle (lib/app-update.ts), then reloads into it. The first
// version has nothing to wait for and takes the open pages at once.
worker.addEventListener('message', (event) => {
  const data = event.data as { type?: unknown } | null;
  if (data?.type === takeOverMessage.type) void worker.skipWaiting();
});
worker.addEventListener('activate', (event) => event.waitUntil(worker.clients.claim()));
