import { formatLotCode } from '@beadroll/core';
import type pg from 'pg';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { screenshot } from './support/browser';
import { apiClient, demoAccount, demoHandle, signIn, superuser, useBrowser } from './support/journey';

// Offline at a fair: the public page opened once opens again with no signal, checked again in
// the browser and marked as the saved copy; the dealer's quick sale, or offer to an e-mail
// address, made with no signal waits on the phone and is sent once when the signal returns.

const dealer = demoAccount('dealer');

/** Registers an invented listed lot for the demo dealer through the API; returns its code. */
async function registerLot(baseUrl: string, title: string): Promise<string> {
  const call = await apiClient(baseUrl, dealer.email);
  const lot = await call<{ code: string }>('/api/lots', {
    description: {
      title,
      form: 'strand',
      count: { value: 40, estimated: false },
      colours: ['amber'],
      baseGlass: ['transparent'],
      decoration: [],
      listed: true,
    },
    observations: { hole: 'clean' },
  });
  return lot.code;
}

/** Waits until the page's Cache Storage holds at least one entry in each named cache. */
async function waitForCaches(page: Page, names: string[]): Promise<void> {
  const deadline = Date.now() + 30_000;
  for (;;) {
    const ready = await page.evaluate(async (wanted) => {
      for (const name of wanted) {
        if (!(await caches.has(name))) return false;
        if ((await (await caches.open(name)).keys()).length === 0) return false;
      }
      return true;
    }, names);
    if (ready) return;
    if (Date.now() > deadline) throw new Error(`the caches ${names.join(', ')} stayed empty`);
    await page.waitForTimeout(250);
  }
}

/** Reads the writes waiting in the phone's outbox (IndexedDB `beadroll-outbox`, store `queue`). */
function readQueue(page: Page): Promise<Array<{ key: string; label: string }>> {
  return page.evaluate(
    () =>
      new Promise((ok, fail) => {
        const open = indexedDB.open('beadroll-outbox');
        open.onerror = () => fail(open.error);
        open.onsuccess = () => {
          const get = open.result.transaction('queue').objectStore('queue').get('writes');
          get.onsuccess = () => ok((get.result as Array<{ key: string; label: string }>) ?? []);
          get.onerror = () => fail(get.error);
        };
      }),
  );
}

describe('offline at a fair', () => {
  const baseUrl = inject('baseUrl');
  let db: pg.Client;

  beforeAll(async () => {
    db = superuser();
    await db.connect();
  });
  afterAll(async () => {
    await db?.end();
  });

  describe('a buyer’s phone (390 px) reopening a lot page with no signal', () => {
    const browser = useBrowser({ width: 390, height: 844 });
    let code: string;
    const title = 'Amber wound beads from the harbour stall';

    beforeAll(async () => {
      code = await registerLot(baseUrl, title);
    });

    it('shows the last verified history, checked again and marked offline with its time', async () => {
      const { page, context } = browser;
      await page.goto(`${baseUrl}/l/${code}`);
      await page.locator('.pl-status-line.pl-ok').waitFor();
      // The page's worker keeps the page and the lot's data of this first visit.
      await waitForCaches(page, ['beadroll-lot-pages', 'beadroll-lot-data']);

      await context.setOffline(true);
      await page.reload();
      const mark = page.locator('.pl-offline-line');
      await mark.waitFor();
      expect(await mark.textContent()).toMatch(/^offline: as verified at .*\d{1,2}:\d{2}/);
      await page.locator('.pl-status-line.pl-ok').waitFor();
      expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe(title);
      const width = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(width).toBeLessThanOrEqual(390);
      await screenshot(page, 'offline-public-page-390');
    });

    it('can be installed: Chromium finds a web app manifest, icons and a service worker', async () => {
      const { page, context } = browser;
      // The installability checks of the browser itself (DevTools protocol), on the page as served.
      await context.setOffline(false);
      try {
        await page.reload();
        await page.locator('.pl-status-line.pl-ok').waitFor();
        const cdp = await context.newCDPSession(page);
        const manifest = (await cdp.send('Page.getAppManifest')) as { url: string; errors: unknown[] };
        expect(manifest.url).toBe(`${baseUrl}/lot.webmanifest?lot=${code}`);
        expect(manifest.errors).toEqual([]);
        const { installabilityErrors } = (await cdp.send('Page.getInstallabilityErrors')) as {
          installabilityErrors: { errorId: string }[];
        };
        expect(installabilityErrors).toEqual([]);
        await cdp.detach();
      } finally {
        await context.setOffline(true);
      }
    });

    it('says so when the saved copy no longer verifies', async () => {
      const { page } = browser;
      // Someone changes the kept copy on the phone: the lot's title inside its first entry.
      const changed = await page.evaluate(
        async ([dataPath, from]) => {
          const cache = await caches.open('beadroll-lot-data');
          const kept = await cache.match(dataPath);
          if (!kept) return false;
          const text = await kept.text();
          const headers = new Headers(kept.headers);
          await cache.put(dataPath, new Response(text.replace(from, 'Amber beads, swapped'), { headers }));
          return text.includes(from);
        },
        [`/api/public/lots/${code}`, title] as const,
      );
      expect(changed).toBe(true);
      await page.reload();
      await page.locator('.pl-offline-line').waitFor();
      expect(await page.locator('.pl-offline-line').textContent()).toMatch(/no longer verifies/);
      expect(await page.locator('.pl-status-line.pl-ok').count()).toBe(0);
      await screenshot(page, 'offline-public-page-broken-390');
    });
  });

  describe('a dealer’s quick sale at the stand (390 px) with no signal', () => {
    const browser = useBrowser({ width: 390, height: 844 });
    let code: string;

    beforeAll(async () => {
      code = await registerLot(baseUrl, 'Striped amber beads for the stand');
    });

    /** Signs in with a signal, then with none types the lot's code into the scanner and opens it. */
    async function scanWithNoSignal(lot: string): Promise<void> {
      const { page, context } = browser;
      await signIn(page, baseUrl, dealer.email, { fresh: true });
      await page.goto(`${baseUrl}/scan`);
      await page.getByRole('heading', { name: 'Scan a tag' }).waitFor();
      // The dealer app's worker has precached the app.
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));

      await context.setOffline(true);
      await page.getByLabel('Lot code from the tag').fill(formatLotCode(lot));
      await page.getByRole('button', { name: 'Open' }).click();
      await page.waitForURL(`${baseUrl}/scan/lots/${lot}`);
      await page
        .getByText('No signal: the lot’s details cannot be looked up now.', { exact: false })
        .waitFor();
    }

    it('keeps the sale waiting, sends it once when the signal returns, and the lot shows sold', async () => {
      const { page, context } = browser;
      await scanWithNoSignal(code);
      await page.getByRole('button', { name: 'Sell' }).click();
      await page.getByLabel('Price: amount').fill('45.00');
      await page.getByRole('button', { name: 'Record the sale' }).click();
      const waiting = page.getByText(`Waiting to send: 1 — sale of ${formatLotCode(code)}`);
      await waiting.waitFor();
      await screenshot(page, 'offline-quick-sale-waiting-390');

      // Kept on the phone, not in the page: a reload with no signal still shows it waiting.
      await page.reload();
      await waiting.waitFor();
      // The header still names the dealer, remembered on this phone, and says there is no signal.
      await page.getByRole('button', { name: `Account menu of ${dealer.displayName}` }).waitFor();
      await page.getByText('No signal', { exact: true }).waitFor();
      // The sale waiting for this lot is remembered too: no second sale is offered.
      await page.getByText('Sale recorded on this device: waiting to send.').waitFor();
      expect(await page.getByRole('button', { name: 'Sell', exact: true }).count()).toBe(0);
      await screenshot(page, 'offline-quick-sale-reloaded-390');
      const kept = await readQueue(page);
      expect(kept).toHaveLength(1);
      const { rows: before } = await db.query(
        `SELECT count(*)::int AS n FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
          WHERE l."code" = $1 AND e."kind" = 'sold'`,
        [code],
      );
      expect(before[0].n).toBe(0);

      await context.setOffline(false);
      await waiting.waitFor({ state: 'detached', timeout: 30_000 });
      await page.getByText(/Status: sold/).waitFor({ timeout: 30_000 });

      // The same write sent again (as after an answer lost on the way back): the server
      // recognises its idempotency key and writes nothing more.
      await page.evaluate(
        (write) =>
          new Promise<void>((ok, fail) => {
            const open = indexedDB.open('beadroll-outbox');
            open.onsuccess = () => {
              const tx = open.result.transaction('queue', 'readwrite');
              tx.objectStore('queue').put([write], 'writes');
              tx.oncomplete = () => ok();
              tx.onerror = () => fail(tx.error);
            };
          }),
        kept[0]!,
      );
      await page.reload();
      await page.getByText(/Status: sold/).waitFor({ timeout: 30_000 });
      const deadline = Date.now() + 30_000;
      while ((await readQueue(page)).length > 0) {
        expect(Date.now()).toBeLessThan(deadline);
        await page.waitForTimeout(250);
      }
      const { rows } = await db.query(
        `SELECT count(*)::int AS n FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
          WHERE l."code" = $1 AND e."kind" = 'sold'`,
        [code],
      );
      expect(rows[0].n).toBe(1);
      await screenshot(page, 'offline-quick-sale-sent-390');
    });

    it('keeps an offer to an e-mail address waiting and sends it when the signal returns: the lot shows offered', async () => {
      const { page, context } = browser;
      const other = demoHandle('teodor-brasko');
      const offered = await registerLot(baseUrl, 'Amber rounds offered at the stand');
      await scanWithNoSignal(offered);
      await page.getByRole('button', { name: 'Offer to a dealer' }).click();
      await page.getByText('No signal: finding a dealer by name needs one.', { exact: false }).waitFor();
      expect(await page.getByRole('radio', { name: 'An e-mail address' }).isChecked()).toBe(true);
      await page.getByLabel('Their e-mail address').fill(other.email);
      await page.getByRole('button', { name: 'Send the offer' }).click();
      const waiting = page.getByText(
        `Waiting to send: 1 — offer of ${formatLotCode(offered)} to ${other.email}`,
      );
      await waiting.waitFor();
      await page.getByText('Offer recorded on this device: waiting to send.').waitFor();
      await screenshot(page, 'offline-offer-waiting-390');

      await context.setOffline(false);
      await waiting.waitFor({ state: 'detached', timeout: 30_000 });
      await page.getByText(/Status: offered/).waitFor({ timeout: 30_000 });
      const { rows } = await db.query(
        `SELECT count(*)::int AS n FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
          WHERE l."code" = $1 AND e."kind" = 'transfer-offered'`,
        [offered],
      );
      expect(rows[0].n).toBe(1);
    });
  });
});
