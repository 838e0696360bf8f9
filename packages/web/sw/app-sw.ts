/// <reference lib="webworker" />
// The dealer app's service worker (scope `/`): the whole app precached, so the scanner and the
// quick sale open with no signal. Data stays with the app (TanStack Query) and the queue of
// waiting writes (IndexedDB); this worker keeps no answers of the API.
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { SERVER_PATHS } from './paths';

declare const self: ServiceWorkerGlobalScope & {
  __WB_MANIFEST: Array<{ url: string; revision: string | null } | string>;
};

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();

// Every page of the dealer app is the one index.html; the public lot pages (their own worker),
// the API, the verifier page and the development pages are left to the network.
registerRoute(new NavigationRoute(createHandlerBoundToURL('/index.html'), { denylist: SERVER_PATHS }));

// A new version takes over at the next page load rather than waiting for every tab to close:
// the app's files are hashed, and an open page keeps the files it already has.
self.addEventListener('install', () => void self.skipWaiting());
self.addEventListener('activate', (event) => event.waitUntil(self.clients.claim()));
