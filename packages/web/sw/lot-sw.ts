/// <reference lib="webworker" />
// The public lot page's service worker (registered for `/l/` and `/L/`): the page's own files
// precached, and the last copy of each lot page and its data kept, so a lot opened once opens
// again with no signal. The page checks the saved data again and says it is a saved copy.
import { ExpirationPlugin } from 'workbox-expiration';
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching';
import { registerRoute, setCatchHandler } from 'workbox-routing';
import { CacheFirst, NetworkFirst } from 'workbox-strategies';
import type { WorkboxPlugin } from 'workbox-core/types.js';
import { LOT_DATA, LOT_EXHIBIT, SAVED_COPY_HEADER } from './paths';

declare const self: ServiceWorkerGlobalScope & {
  __WB_MANIFEST: Array<{ url: string; revision: string | null } | string>;
};

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();

/** How long a slow fair connection is given before the saved copy is shown instead. */
const NETWORK_TIMEOUT_S = 6;
const MAX_LOTS = 60;

/** Marks an answer taken from the saved copy, so the page can say so. */
const markSavedCopy: WorkboxPlugin = {
  cachedResponseWillBeUsed: async ({ cachedResponse }) => {
    if (!cachedResponse) return cachedResponse;
    const headers = new Headers(cachedResponse.headers);
    headers.set(SAVED_COPY_HEADER, 'true');
    return new Response(await cachedResponse.blob(), {
      status: cachedResponse.status,
      statusText: cachedResponse.statusText,
      headers,
    });
  },
};

// The page itself: fresh from the server when it answers (it carries the log's current key).
registerRoute(
  ({ request }) => request.mode === 'navigate',
  new NetworkFirst({
    cacheName: 'beadroll-lot-pages',
    networkTimeoutSeconds: NETWORK_TIMEOUT_S,
    plugins: [new ExpirationPlugin({ maxEntries: MAX_LOTS })],
  }),
);

// The lot's data and bundle: only answers that were given in full (200) are kept.
registerRoute(
  ({ url, sameOrigin }) => sameOrigin && LOT_DATA.test(url.pathname),
  new NetworkFirst({
    cacheName: 'beadroll-lot-data',
    networkTimeoutSeconds: NETWORK_TIMEOUT_S,
    plugins: [
      new ExpirationPlugin({ maxEntries: MAX_LOTS * 2 }),
      { cacheWillUpdate: async ({ response }) => (response.status === 200 ? response : null) },
      markSavedCopy,
    ],
  }),
);

// Photos and their thumbnails: the bytes of an entry's exhibit never change.
registerRoute(
  ({ url, sameOrigin }) => sameOrigin && LOT_EXHIBIT.test(url.pathname),
  new CacheFirst({
    cacheName: 'beadroll-lot-exhibits',
    plugins: [
      new ExpirationPlugin({ maxEntries: 200, maxAgeSeconds: 30 * 24 * 3600 }),
      { cacheWillUpdate: async ({ response }) => (response.status === 200 ? response : null) },
    ],
  }),
);

// A lot page never opened before, with no signal: the page itself, which then says that the
// history could not be loaded.
setCatchHandler(async ({ request }) => {
  if (request.mode === 'navigate') return (await matchPrecache('/public.html')) ?? Response.error();
  return Response.error();
});

self.addEventListener('install', () => void self.skipWaiting());
self.addEventListener('activate', (event) => event.waitUntil(self.clients.claim()));
