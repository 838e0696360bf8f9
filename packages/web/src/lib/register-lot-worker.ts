import { parsePublicPath, publicLotPath } from '../features/public-lot/route';

/**
 * Registers the public lot page's service worker (lot-sw.js) for the address family the page
 * was opened under: `/l/` (typed, linked) or `/L/` (read from a tag's QR symbol). It is a few
 * lines on purpose: the public page's script stays small, and the worker does the rest.
 * On the first visit the page loaded before the worker ran, so it names its address and its
 * lot's data to the worker, which keeps them. Only in a built app (a development server has
 * no worker to register).
 */
export function registerLotWorker(pathname: string): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const scope = pathname.startsWith('/L/') ? '/L/' : '/l/';
  const route = parsePublicPath(pathname);
  const register = () => {
    const firstVisit = !navigator.serviceWorker.controller;
    navigator.serviceWorker
      .register('/lot-sw.js', { scope })
      .then(async () => {
        if (!firstVisit || !route) return;
        const reg = await navigator.serviceWorker.ready;
        reg.active?.postMessage({
          type: 'keep-lot',
          page: window.location.href,
          lotData: publicLotPath(route.code),
        });
      })
      .catch(() => {
        // no worker (a private window, storage refused): the page works online as before
      });
  };
  if (document.readyState === 'complete') register();
  else window.addEventListener('load', register, { once: true });
}
