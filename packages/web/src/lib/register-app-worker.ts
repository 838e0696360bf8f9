import { Workbox } from 'workbox-window';

/**
 * Registers the dealer app's service worker (app-sw.js, scope `/`), which precaches the app so
 * the scanner and the quick sale open with no signal. Only in a built app: the development
 * server has no worker, so what it serves is never a cached copy.
 */
export function registerAppWorker(): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const wb = new Workbox('/app-sw.js', { scope: '/' });
  wb.register().catch(() => {
    // no worker (a private window, storage refused): the app works online as before
  });
}
