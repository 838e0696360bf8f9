/// <reference lib="webworker" />
// The public lot page's service worker (registered for `/l/` and `/L/`): the page's own files
// precached, and the last copy of each lot page and its data kept, so a lot opened once opens
// again with no signal. The page checks the saved data again and says it is a saved copy.
import { CacheExpiration, ExpirationPlugin } from 'workbox-expiration';
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching';
import { registerRoute, setCatchHandler } from 'workbox-routing';
import { CacheFirst, NetworkFirst } from 'workbox-strategies';
import type { WorkboxPlugin } from 'workbox-core/types.js';
import { LOT_DATA, LOT_DATA_BLOCK, LOT_EXHIBIT, SAVED_COPY_HEADER } from './paths';

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

const onlyWhole: WorkboxPlugin = {
  cacheWillUpdate: async ({ response }) => (response.status === 200 ? response : null),
};

const DATA_CACHE = 'beadroll-lot-data';
const dataExpiration = new CacheExpiration(DATA_CACHE, { maxEntries: MAX_LOTS * 2 });

/**
 * A listed lot's page comes with the lot's data in it. The data is kept where the page looks
 * for it with no signal (as if it had been fetched, dated as the page was), and the page is kept
 * without it: a saved page then always asks for its data, and is told it is the saved copy.
 */
const keepDataApart: WorkboxPlugin = {
  cacheWillUpdate: async ({ response }) => {
    const html = await response.clone().text();
    const block = LOT_DATA_BLOCK.exec(html);
    if (!block) return response;
    let code: unknown;
    try {
      code = (JSON.parse(block[1]!) as { code?: unknown } | null)?.code;
    } catch {
      code = undefined; // not data the page could use either: the page is kept without it
    }
    if (typeof code === 'string') {
      const url = new URL(`/api/public/lots/${encodeURIComponent(code)}`, self.location.href).href;
      const headers = new Headers({ 'Content-Type': 'application/json; charset=utf-8' });
      const date = response.headers.get('Date');
      if (date) headers.set('Date', date);
      await (await caches.open(DATA_CACHE)).put(url, new Response(block[1], { status: 200, headers }));
      await dataExpiration.updateTimestamp(url);
      await dataExpiration.expireEntries();
    }
    // The text kept is decoded and shorter: the sizes and encoding sent with it no longer apply.
    const headers = new Headers(response.headers);
    headers.delete('Content-Length');
    headers.delete('Content-Encoding');
    return new Response(html.replace(block[0], ''), {
      status: response.status,
      statusText: response.statusText,
      headers,
    });
  },
};

// The page itself: fresh from the server when it answers (it carries the log's current key).
const pages = new NetworkFirst({
  cacheName: 'beadroll-lot-pages',
  networkTimeoutSeconds: NETWORK_TIMEOUT_S,
  plugins: [new ExpirationPlugin({ maxEntries: MAX_LOTS }), onlyWhole, keepDataApart],
});
registerRoute(({ request }) => request.mode === 'navigate', pages);

// The lot's data and bundle: only answers that were given in full (200) are kept.
const lotData = new NetworkFirst({
  cacheName: DATA_CACHE,
  networkTimeoutSeconds: NETWORK_TIMEOUT_S,
  plugins: [new ExpirationPlugin({ maxEntries: MAX_LOTS * 2 }), onlyWhole, markSavedCopy],
});
registerRoute(({ url, sameOrigin }) => sameOrigin && LOT_DATA.test(url.pathname), lotData);

// The first visit loads before this worker runs: the page then names its own address and its
// lot's data, and they are fetched once more through the routes above, so that visit is kept too.
self.addEventListener('message', (event) => {
  const msg = event.data as { type?: unknown; page?: unknown; lotData?: unknown } | null;
  if (msg?.type !== 'keep-lot') return;
  const scope = self.registration.scope;
  const jobs: Promise<unknown>[] = [];
  if (typeof msg.page === 'string' && msg.page.startsWith(scope))
    jobs.push(pages.handleAll({ event, request: new Request(msg.page) })[1]);
  if (typeof msg.lotData === 'string') {
    const url = new URL(msg.lotData, self.location.href);
    if (url.origin === self.location.origin && LOT_DATA.test(url.pathname))
      jobs.push(lotData.handleAll({ event, request: new Request(url, { credentials: 'same-origin' }) })[1]);
  }
  event.waitUntil(Promise.all(jobs).catch(() => undefined));
});

// Photos and their thumbnails: the bytes of an entry's exhibit never change.
registerRoute(
  ({ url, sameOrigin }) => sameOrigin && LOT_EXHIBIT.test(url.pathname),
  new CacheFirst({
    cacheName: 'beadroll-lot-exhibits',
    plugins: [new ExpirationPlugin({ maxEntries: 200, maxAgeSeconds: 30 * 24 * 3600 }), onlyWhole],
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
