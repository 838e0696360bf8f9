// One page load in Chromium as a buyer's phone sees it: 390 px wide, network throttled through
// the DevTools protocol, timed from navigation start to the verified tick, with every byte the
// page transferred counted from the protocol's own figures (encodedDataLength: headers and body
// as they came over the wire, after any Content-Encoding).
import type { Browser, BrowserContext, CDPSession, Page } from 'playwright-core';

/** The verified tick on the public page (and on its static copy). */
export const TICK = '.pl-status-line.pl-ok';

/** A slow mobile connection: 1.6 Mbit/s down, 750 kbit/s up, 150 ms round trip. */
export const SLOW_MOBILE = {
  offline: false,
  latency: 150,
  downloadThroughput: (1.6 * 1_000_000) / 8,
  uploadThroughput: (750 * 1000) / 8,
};

export interface LoadResult {
  /** ms from navigation start until the tick was in the document. */
  tickMs: number;
  /** bytes over the wire for everything but exhibit files (photos). */
  bytes: number;
  /** bytes over the wire for exhibit files. */
  photoBytes: number;
  requests: { url: string; bytes: number; encoding: string; fromCache: boolean }[];
}

/** A phone-sized context: 390 × 844 CSS px, device scale 3, touch. */
export function phoneContext(browser: Browser): Promise<BrowserContext> {
  return browser.newContext({
    viewport: { width: 390, height: 844 },
    deviceScaleFactor: 3,
    isMobile: true,
    hasTouch: true,
  });
}

// Records when the tick is first painted, in the page's own clock (ms since navigation start):
// the first animation frame after it is in the document, which waits for render-blocking
// style sheets as the buyer's eye does.
const WATCH_TICK = `(() => {
  let seen = false;
  const found = () => {
    if (seen || !document.querySelector(${JSON.stringify(TICK)})) return;
    seen = true;
    requestAnimationFrame(() => { window.__tickAt = performance.now(); });
  };
  new MutationObserver(found).observe(document, { subtree: true, childList: true });
  document.addEventListener('DOMContentLoaded', found);
})();`;

const isPhoto = (url: string) => /\/exhibits\//.test(url);

/** Loads `url` in a new tab of `context`, throttled, and waits for the tick and a quiet network. */
export async function loadOnce(
  context: BrowserContext,
  url: string,
  throttle: typeof SLOW_MOBILE | null = SLOW_MOBILE,
): Promise<LoadResult> {
  const page: Page = await context.newPage();
  await page.addInitScript(WATCH_TICK);
  const cdp: CDPSession = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  if (throttle) await cdp.send('Network.emulateNetworkConditions', throttle);
  const seen = new Map<string, { url: string; encoding: string; fromCache: boolean }>();
  const requests: LoadResult['requests'] = [];
  cdp.on('Network.responseReceived', (e) => {
    const h = e.response.headers as Record<string, string>;
    const enc = Object.entries(h).find(([k]) => k.toLowerCase() === 'content-encoding')?.[1] ?? '';
    seen.set(e.requestId, {
      url: e.response.url,
      encoding: enc,
      fromCache: Boolean(e.response.fromDiskCache || e.response.fromPrefetchCache),
    });
  });
  cdp.on('Network.loadingFinished', (e) => {
    const r = seen.get(e.requestId);
    if (r) requests.push({ ...r, bytes: e.encodedDataLength });
  });
  await page.goto(url, { waitUntil: 'load', timeout: 120_000 });
  await page.waitForSelector(TICK, { timeout: 120_000 });
  await page.waitForFunction('window.__tickAt !== undefined', undefined, { timeout: 120_000 });
  await page.waitForLoadState('networkidle', { timeout: 120_000 });
  const tickMs = (await page.evaluate('window.__tickAt')) as number;
  await page.close();
  const bytes = requests.filter((r) => !isPhoto(r.url)).reduce((n, r) => n + r.bytes, 0);
  const photoBytes = requests.filter((r) => isPhoto(r.url)).reduce((n, r) => n + r.bytes, 0);
  return { tickMs, bytes, photoBytes, requests };
}

export const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
