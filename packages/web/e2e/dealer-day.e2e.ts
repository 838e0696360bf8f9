import { describe, expect, inject, it } from 'vitest';
import { formatLotCode, parseBundle, verifyBundle } from '@beadroll/core';
import { screenshot } from './support/browser';
import {
  addCloseUp,
  apiClient,
  demoAccount,
  expectNoSideScroll,
  onPhone,
  openAction,
  PHONE,
  useHeldLot,
  signIn,
  useHeldLotCamera,
  useJourneys,
} from './support/journey';

const dealer = demoAccount('dealer');

describe('finding a lot in the inventory', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;
  const held = useHeldLot('Melon beads from the attic box', {
    origin: 'bohemia-czech',
    period: { from: 1890, to: 1910, approximate: true },
    technique: 'furnace-wound',
    qualifier: 'attributed-to',
    confidence: 'medium',
    rationale: 'Furnace-wound melons with the usual seam.',
    exhibits: [],
  });

  it('finds it by its code with hyphens and by the attribution on record', async () => {
    const { page } = journeys.start();
    const { lot } = held;
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/lots`);
    const search = page.getByRole('searchbox');
    await search.fill(formatLotCode(lot.code).toLowerCase());
    await page.waitForURL(/q=/);
    const table = page.getByRole('table', { name: 'Lots' });
    await table.getByRole('link', { name: lot.title }).waitFor();
    // The header row and the one lot, once the search's page has replaced the previous one.
    await expect.poll(() => table.getByRole('row').count(), { timeout: 10_000 }).toBe(2);

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
  const camera = useHeldLotCamera('Striped drawn beads for the fair', PHONE);
  const { baseUrl } = camera;

  it('sells the scanned lot in two taps after the scan', async () => {
    const { page, lot } = await camera.scan();
    const quick = page.getByRole('group', { name: 'Quick actions' });
    for (const name of ['Sell', 'Offer to a dealer', 'Print a new tag', 'History'])
      await quick.getByRole(name === 'History' ? 'link' : 'button', { name }).waitFor();
    await screenshot(page, 'scanned-lot-quick-actions-390');

    const call = await apiClient(baseUrl, dealer.email);
    type Figures = { currencies: Array<{ currency: string; salesByYear: Array<{ revenue: number }> }> };
    const soldFor = (f: Figures) =>
      f.currencies.find((c) => c.currency === 'EUR')?.salesByYear.reduce((n, y) => n + y.revenue, 0) ?? 0;
    const before = soldFor(await call<Figures>('/api/stock/summary'));

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

    const detail = await call<{ status: string }>(`/api/lots/${lot.code}`);
    expect(detail.status).toBe('sold');
    expect(soldFor(await call<Figures>('/api/stock/summary')) - before).toBe(4500);
    // Fits the phone: nothing wider than the screen.
    await expectNoSideScroll(page);

    // The sale shows in the dealer's own figures, with a chart drawn on first use of the page.
    await page.goto(`${baseUrl}/stock`);
    const eur = page.getByRole('region', { name: 'In EUR' });
    await eur.getByRole('table', { name: 'Sales by month' }).waitFor();
    await eur
      .getByRole('img', { name: 'Sales and margin by month, EUR' })
      .locator('canvas')
      .first()
      .waitFor();
    await eur.getByRole('table', { name: 'Stock by origin' }).waitFor();
    await expectNoSideScroll(page);
    await screenshot(page, 'stock-figures-390');
    await page.setViewportSize({ width: 1280, height: 900 });
    await screenshot(page, 'stock-figures-1280');
  });
});

const assessor = demoAccount('assessor');

describe('an opinion on request', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;
  // Unlisted: the request on the roll is what lets the assessor's evidence and opinion on it.
  const held = useHeldLot('Chevron beads from a trunk in the attic');

  it('is asked by the holder on an unlisted lot and answered by the assessor from their queue, with evidence; the bundle verifies', async () => {
    const { page } = journeys.start();
    const { lot } = held;
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/lots/${lot.code}`);
    const ask = await openAction(page, 'Ask for an opinion');
    await ask.getByRole('radio', { name: /Halvard Nimmo/ }).check();
    await ask.getByRole('textbox', { name: /What to look at/ }).fill('Are these seven-layer chevrons old?');
    await screenshot(page, 'opinion-request-ask-1280');
    await ask.getByRole('button', { name: 'Ask' }).click();
    await ask.getByText(/^Asked\./).waitFor();
    await ask.getByRole('button', { name: 'Close' }).click();

    // The assessor's start page is their queue.
    await signIn(page, baseUrl, assessor.email);
    await page.goto(`${baseUrl}/`);
    const queue = page.getByRole('list', { name: 'Waiting for your opinion' });
    const request = queue.getByRole('listitem').filter({ hasText: lot.title });
    await request.getByText('“Are these seven-layer chevrons old?”').waitFor();
    await screenshot(page, 'opinion-request-queue-1280');
    await request.getByRole('link', { name: lot.title }).click();
    await page.waitForURL(`${baseUrl}/lots/${lot.code}`);

    // Evidence first: a close-up, added to the roll of the unlisted lot.
    await addCloseUp(page, 'chevron-end.jpg', 'Ground end showing seven layers', { r: 170, g: 40, b: 40 });

    const dialog = await openAction(page, 'Record an opinion');
    await dialog.getByRole('combobox', { name: /^Origin/ }).selectOption('venice-murano');
    await dialog.getByRole('textbox', { name: /^From year/ }).fill('1880');
    await dialog.getByRole('textbox', { name: /^To year/ }).fill('1920');
    await dialog
      .getByRole('textbox', { name: /^Rationale/ })
      .fill('Seven layers, ground ends showing each colour; wear on the edges of every bead.');
    await dialog.getByRole('checkbox', { name: /Ground end showing seven layers/ }).check();
    await dialog.getByRole('button', { name: 'Record opinion' }).click();
    await dialog.waitFor({ state: 'detached' });
    await screenshot(page, 'opinion-request-answered-1280');

    // The queue now shows it answered; the holder's request reads answered too.
    await page.goto(`${baseUrl}/`);
    await page
      .getByRole('list', { name: 'Earlier requests' })
      .getByRole('listitem')
      .filter({ hasText: lot.title })
      .getByText('Answered')
      .waitFor();
    const call = await apiClient(baseUrl, dealer.email);
    const sent = await call<{ items: Array<{ lot: { code: string }; status: string }> }>(
      '/api/opinion-requests?box=sent',
    );
    expect(sent.items.find((r) => r.lot.code === lot.code)?.status).toBe('answered');

    // The holder sees the opinion on the lot page, and the history says it was asked for.
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/lots/${lot.code}`);
    await page
      .getByText(/Seven layers, ground ends showing each colour/)
      .first()
      .waitFor();
    await page
      .getByText(/asked Halvard Nimmo.* for an opinion/)
      .first()
      .waitFor();
    await screenshot(page, 'opinion-request-holder-1280');

    // The lot's bundle verifies with core's verifier: the request, the evidence and the opinion
    // naming it, in format version 3, on a lot that stayed unlisted.
    const bundle = parseBundle(await call<unknown>(`/api/lots/${lot.code}/bundle`));
    const checked = verifyBundle(bundle);
    expect(checked.ok).toBe(true);
    const roll = checked.rolls.find((r) => r.lot === lot.code)!;
    expect(roll.state!.listed).toBe(false);
    expect(roll.state!.openRequests).toEqual([]);
    const kinds = bundle.rolls
      .find((r) => r.lot === lot.code)!
      .entries.map((e) => JSON.parse(e.header) as { kind: string; v: number; facts: { request?: number } });
    const asked = kinds.find((h) => h.kind === 'opinion-requested')!;
    expect(asked.v).toBe(3);
    const answers = kinds.filter((h) => h.kind === 'exhibit-added' || h.kind === 'opinion');
    expect(answers.map((h) => h.facts.request)).toEqual([1, 1]);
  });
});

describe('the chart library stays out of the public page', () => {
  const baseUrl = inject('baseUrl');

  it('loads no uPlot code when a buyer opens a lot page', async () => {
    await onPhone(async (page) => {
      const scripts: string[] = [];
      page.on('response', async (r) => {
        if (r.request().resourceType() === 'script') scripts.push(await r.text());
      });
      // Any code: the public page's scripts are the same whether the lot is found or not.
      await page.goto(`${baseUrl}/l/7K2QM9XAT`);
      await page.waitForLoadState('networkidle');
      expect(scripts.length).toBeGreaterThan(0);
      expect(scripts.some((s) => s.includes('uPlot'))).toBe(false);
    });
  });
});
