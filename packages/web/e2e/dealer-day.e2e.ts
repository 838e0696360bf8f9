import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { formatLotCode, tagPayload, tagReference } from '@beadroll/core';
import { writeTagVideo } from './support/fake-camera';
import { openBrowser, screenshot, type Browser } from './support/browser';
import type { Page } from 'playwright-core';

// The invented demo scenario: its accounts share one password.
const demo = JSON.parse(
  readFileSync(resolve(__dirname, '..', '..', '..', 'seed-demo', 'accounts.json'), 'utf8'),
) as { password: string; accounts: Array<{ role: string; email: string; status?: string }> };
const dealer = demo.accounts.find((a) => a.role === 'dealer' && a.status === 'verified')!;

/** A signed-in HTTP client for a demo account. */
async function client(baseUrl: string, email: string) {
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
    body: JSON.stringify({ email, password: demo.password }),
  });
  expect(signIn.ok).toBe(true);
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  return async <T>(path: string, body?: unknown): Promise<T> => {
    const res = await fetch(`${baseUrl}${path}`, {
      method: body === undefined ? 'GET' : 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1', cookie },
      ...(body === undefined ? {} : { body: JSON.stringify(body) }),
    });
    const json = (await res.json()) as T;
    expect(res.ok, JSON.stringify(json)).toBe(true);
    return json;
  };
}

/** Registers an invented lot for the demo dealer; returns its code, title and tag reference. */
async function registerLot(
  baseUrl: string,
  title: string,
  opinion?: object,
): Promise<{ code: string; title: string; ref: string }> {
  const call = await client(baseUrl, dealer.email);
  let lot = await call<{ code: string; headHash: string }>('/api/lots', {
    description: {
      title,
      form: 'strand',
      count: { value: 24, estimated: false },
      colours: ['green'],
      baseGlass: ['transparent'],
      decoration: [],
      listed: false,
    },
    sealed: { storageLocation: 'Fair case 2', acquisition: { cost: { amount: 1500, currency: 'EUR' } } },
  });
  if (opinion) {
    await call(`/api/lots/${lot.code}/opinions`, opinion);
    lot = await call(`/api/lots/${lot.code}`);
  }
  return { code: lot.code, title, ref: tagReference(lot.headHash) };
}

async function signIn(page: Page, baseUrl: string, email: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('textbox', { name: 'E-mail address' }).fill(email);
  await page.getByLabel('Password').fill(demo.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { level: 1 }).and(page.locator('#account-title')).waitFor();
}

describe('finding a lot in the inventory', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let lot: { code: string; title: string };

  beforeAll(async () => {
    lot = await registerLot(baseUrl, 'Melon beads from the Ostrava box', {
      origin: 'bohemia-czech',
      period: { from: 1890, to: 1910, approximate: true },
      technique: 'furnace-wound',
      qualifier: 'attributed-to',
      confidence: 'medium',
      rationale: 'Furnace-wound melons with the usual seam.',
      exhibits: [],
    });
    browser = await openBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('finds it by its code with hyphens and by the attribution on record', async () => {
    const { page } = browser;
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/lots`);
    const search = page.getByRole('searchbox');
    await search.fill(formatLotCode(lot.code).toLowerCase());
    await page.waitForURL(/q=/);
    const table = page.getByRole('table', { name: 'Lots' });
    await table.getByRole('link', { name: lot.title }).waitFor();
    expect(await table.getByRole('row').count()).toBe(2);

    await search.fill('bohemian furnace');
    await page.waitForURL(/q=bohemian/);
    await table.getByRole('link', { name: lot.title }).waitFor();
    expect(new URL(page.url()).searchParams.get('q')).toBe('bohemian furnace');

    // The address keeps the search: a reload shows the same rows.
    await page.reload();
    await page.getByRole('table', { name: 'Lots' }).getByRole('link', { name: lot.title }).waitFor();
    await page.getByRole('columnheader', { name: 'Period' }).click();
    await page.waitForURL(/sort=period/);
    await screenshot(page, 'inventory-search');
  });
});

describe('a sale at a fair from a scanned tag, on a phone', () => {
  const baseUrl = inject('baseUrl');
  let dir: string;
  let browser: Browser;
  let lot: { code: string; title: string; ref: string };

  beforeAll(async () => {
    lot = await registerLot(baseUrl, 'Striped drawn beads for the fair');
    dir = mkdtempSync(join(tmpdir(), 'beadroll-camera-'));
    const video = join(dir, 'tag.y4m');
    await writeTagVideo(video, tagPayload(new URL(baseUrl).host, lot.code, lot.ref));
    browser = await openBrowser({
      width: 390,
      height: 844,
      args: [
        '--use-fake-device-for-media-stream',
        '--use-fake-ui-for-media-stream',
        `--use-file-for-fake-video-capture=${video}`,
      ],
    });
  });
  afterAll(async () => {
    await browser?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('sells the scanned lot in two taps after the scan', async () => {
    const { page } = browser;
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/scan`);
    await page.getByRole('button', { name: 'Start camera' }).click();
    await page.waitForURL(`${baseUrl}/scan/lots/${lot.code}?ref=${lot.ref}`, { timeout: 30_000 });
    await page.getByRole('heading', { level: 1, name: lot.title }).waitFor();
    const quick = page.getByRole('group', { name: 'Quick actions' });
    for (const name of ['Sell', 'Offer to a dealer', 'Print a new tag', 'History'])
      await quick.getByRole(name === 'History' ? 'link' : 'button', { name }).waitFor();
    await screenshot(page, 'scanned-lot-quick-actions-390');

    // Tap 1: Sell. The price field has the cursor; typing is not a tap.
    await quick.getByRole('button', { name: 'Sell' }).click();
    await page.getByRole('dialog').waitFor();
    await page.keyboard.type('45.00');
    expect(await page.getByRole('textbox', { name: 'Price: amount' }).inputValue()).toBe('45.00');
    await screenshot(page, 'scanned-lot-sell-390');
    // Tap 2: record it.
    await page.getByRole('button', { name: 'Record the sale' }).click();
    await page.getByText(/^Sold for .*45\.00/).waitFor();
    await screenshot(page, 'scanned-lot-sold-390');

    const call = await client(baseUrl, dealer.email);
    const detail = await call<{ status: string }>(`/api/lots/${lot.code}`);
    expect(detail.status).toBe('sold');
    // Fits the phone: nothing wider than the screen.
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(390);
  });
});
