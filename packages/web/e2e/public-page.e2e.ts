import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, resolve } from 'node:path';
import { formatLotCode, parseBundle, tagReference, type Bundle } from '@beadroll/core';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot, type Browser } from './support/browser';
import { pageErrors, superuser } from './support/journey';

const require = createRequire(import.meta.url);
const AXE = require.resolve('axe-core/axe.min.js');
const REPO = resolve(__dirname, '..', '..', '..');

/** The listed lot with the longest roll on the ledger, if any. */
async function longestListedLot(db: pg.Client): Promise<string | null> {
  const { rows } = await db.query<{ code: string }>(
    `SELECT l."code" FROM "lots" l
       JOIN "lot_views" v ON v."code" = l."code" AND v."listed"
       JOIN "entries" e ON e."lot_id" = l."id"
     GROUP BY l."code" ORDER BY count(*) DESC, l."code" LIMIT 1`,
  );
  return rows[0]?.code ?? null;
}

/**
 * When the demo scenario brings no listed lot, one of its verified dealers registers one through
 * the API (the same path the dealer screens use), with a few observations after it.
 */
async function registerLot(baseUrl: string): Promise<string> {
  const scenario = JSON.parse(readFileSync(join(REPO, 'seed-demo/accounts.json'), 'utf8')) as {
    password: string;
    accounts: { role: string; status: string; email: string }[];
  };
  const dealer = scenario.accounts.find((a) => a.role === 'dealer' && a.status === 'verified')!;
  const headers: Record<string, string> = { 'content-type': 'application/json', 'x-beadroll-request': '1' };
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email: dealer.email, password: scenario.password }),
  });
  expect(signIn.status).toBe(200);
  headers.cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const post = async (path: string, body: unknown) => {
    const r = await fetch(`${baseUrl}${path}`, { method: 'POST', headers, body: JSON.stringify(body) });
    expect(r.ok, `${path}: ${r.status}`).toBe(true);
    return (await r.json()) as { code: string };
  };
  const { code } = await post('/api/lots', {
    description: {
      title: 'Strand of bottle-green furnace-wound beads',
      form: 'strand',
      count: { value: 30, estimated: false },
      strandLengthMm: 508,
      colours: ['bottle green'],
      baseGlass: ['transparent'],
      decoration: [],
      listed: true,
    },
    observations: { hole: 'clean', windingMarks: 'seen' },
  });
  for (const note of [
    'Seen again at the spring fair.',
    'Restrung on new silk.',
    'Photographed for the roll.',
  ])
    await post(`/api/lots/${code}/observations`, { observations: { surface: 'worn', note } });
  return code;
}

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[];
}

describe('the public lot page at a fair, on a phone (390 px)', () => {
  const baseUrl = inject('baseUrl');
  let browser: Browser;
  let db: pg.Client;
  let code: string;
  let bundle: Bundle;

  beforeAll(async () => {
    db = superuser();
    await db.connect();
    code = (await longestListedLot(db)) ?? (await registerLot(baseUrl));
    const res = await fetch(`${baseUrl}/api/public/lots/${code}`);
    expect(res.status).toBe(200);
    bundle = parseBundle(((await res.json()) as { bundle: unknown }).bundle);
    browser = await openBrowser({ width: 390, height: 844 });
  });
  afterAll(async () => {
    await browser?.close();
    await db?.end();
  });

  const entries = () => bundle.rolls[0]!.entries;
  const status = () => browser.page.getByRole('status');

  async function axeProblems(): Promise<string[]> {
    // Evaluated through the browser's debugging protocol: the page's CSP refuses injected tags.
    await browser.page.evaluate(readFileSync(AXE, 'utf8'));
    const result = (await browser.page.evaluate(() =>
      (window as unknown as { axe: { run(): Promise<unknown> } }).axe.run(),
    )) as AxeResult;
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  }

  it('opens the tag’s address and says the history is unbroken and the tag matches', async () => {
    const { page } = browser;
    const errors = pageErrors(page);
    const seq = Math.max(0, entries().length - 2);
    const h = tagReference(entries()[seq]!.hash);
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(`${baseUrl}/L/${code}/${h}`);
    await status().getByText(`Unbroken history as served: ${entries().length} entries`).waitFor();
    // The tick comes from the first script; the tag's line from the rest of the page's script,
    // which takes over a moment later.
    const tagLine = `This tag matches entry ${seq}; ${entries().length - 1 - seq === 1 ? '1 entry' : `${entries().length - 1 - seq} entries`} added since.`;
    await status().getByText(tagLine).waitFor();
    await expect(status().textContent()).resolves.toContain(tagLine);
    await page.getByText(`Lot ${formatLotCode(code)}`, { exact: true }).waitFor();
    // Only the page itself carries H (it is the tag's address); no request the page makes does.
    const api = requests.filter((u) => u.includes('/api/'));
    expect(api.length).toBeGreaterThan(0);
    for (const u of api) expect(u).not.toContain(h);
    // The first script, written into the page, ran (the page's CSP allows it by its hash): its
    // own file was never asked for.
    expect(requests.filter((u) => u.includes('/first-check-'))).toEqual([]);
    await screenshot(page, 'public-page-390');
    expect(await axeProblems()).toEqual([]);
    expect(errors).toEqual([]);
  });

  it('runs the page’s own copy of its first script on later visits too, never its file as well', async () => {
    const { page } = browser;
    const files: string[] = [];
    const record = (r: { url(): string }) => r.url().includes('/first-check-') && files.push(r.url());
    page.on('request', record);
    try {
      // Warm visits: the page's module script comes from the cache and may be ready before the
      // copy written into the page has run; it waits for that copy rather than fetching its file.
      for (let i = 0; i < 10; i++) {
        await page.goto(`${baseUrl}/l/${code}`);
        await status().getByText(`Unbroken history as served: ${entries().length} entries`).waitFor();
        await page.getByText(`Lot ${formatLotCode(code)}`, { exact: true }).waitFor();
      }
    } finally {
      page.off('request', record);
    }
    expect(files).toEqual([]);
  });

  it('warns when the tag’s entry is not in the history', async () => {
    const { page } = browser;
    // The worked example's reference (ledger format §12) belongs to an entry of no demo lot.
    await page.goto(`${baseUrl}/L/${code}/AVV5EN5TQ3`);
    await status()
      .getByText('Warning: this history no longer contains the entry this tag was printed from.')
      .waitFor();
    await status()
      .getByText(/Unbroken history as served/)
      .waitFor();
    expect(await axeProblems()).toEqual([]);
  });

  it('shows the same not-found page for a code that is not listed', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl}/l/7K2QM9XAT`);
    await page.getByRole('heading', { name: 'No public history at this address' }).waitFor();
    expect(await axeProblems()).toEqual([]);
  });

  it('shows where the history breaks after a stored entry is changed', async () => {
    const { page } = browser;
    const target = entries().findIndex((e, i) => i > 0 && e.body !== null);
    expect(target).toBeGreaterThan(0);
    const original = entries()[target]!.body!;
    // One nonce digit changed: the body no longer matches the digest its header committed to.
    const changed = original.replace(/"nonce":"(.)/, (_m, c: string) => `"nonce":"${c === '0' ? '1' : '0'}`);
    const where = `"entry_id" = (SELECT e."id" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
                    WHERE l."code" = $2 AND e."seq" = $3)`;
    // The tables refuse changes through triggers; a superuser session can switch them off.
    const tamper = async (body: string) => {
      await db.query('BEGIN');
      await db.query("SET LOCAL session_replication_role = 'replica'");
      const r = await db.query(`UPDATE "entry_bodies" SET "body" = $1 WHERE ${where}`, [body, code, target]);
      await db.query('COMMIT');
      expect(r.rowCount).toBe(1);
    };
    await tamper(changed);
    try {
      await page.goto(`${baseUrl}/l/${code}`);
      await page.reload();
      await status()
        .getByText(new RegExp(`History broken at entry ${target} of ${entries().length}`))
        .waitFor();
      await expect(status().textContent()).resolves.toContain('bad-body-digest');
      await expect(status().textContent()).resolves.not.toContain('Unbroken');
      await screenshot(page, 'public-page-broken-390');
      expect(await axeProblems()).toEqual([]);
    } finally {
      await tamper(original);
    }
  });
  it('links to the history file and to the checking page, which checks that file with the network off', async () => {
    const { page, context } = browser;
    await page.goto(`${baseUrl}/l/${code}`);
    await status()
      .getByText(/Unbroken history as served/)
      .waitFor();
    expect(await page.locator('body').textContent()).not.toMatch(/\bnpm\b|\bnpx\b/);
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: `Download the history of lot ${formatLotCode(code)}` }).click(),
    ]);
    const file = await download.path();
    await page.getByRole('link', { name: 'Beadroll’s checking page' }).click();
    await page.getByRole('heading', { name: 'Check a lot history file' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/verify');
    const save = page.getByRole('link', { name: 'Save this page' });
    expect(await save.getAttribute('href')).toBe('/verify/download');
    await context.setOffline(true);
    try {
      await page.setInputFiles('#file', file);
      await page.locator('#result[data-exit="0"]').waitFor();
      const rolls = page.locator('.v-roll');
      expect(await rolls.count()).toBe(bundle.rolls.length);
      expect(await page.locator('.v-roll[data-ok="false"]').count()).toBe(0);
      await expect(page.locator(`.v-roll[data-lot="${code}"]`).textContent()).resolves.toContain(
        `${entries().length} entries`,
      );
      await screenshot(page, 'verify-page-served-390');
      expect(await axeProblems()).toEqual([]);
    } finally {
      await context.setOffline(false);
    }
  });

  it('checks the history also when the page’s own copy of its first script does not run', async () => {
    const other = await openBrowser({ width: 390, height: 844 });
    try {
      const { page } = other;
      const errors = pageErrors(page);
      // The page as a copy served elsewhere would give it: without the script written into it.
      await page.route(`${baseUrl}/l/${code}`, async (route) => {
        const res = await route.fetch();
        const html = (await res.text()).replace(
          /<script type="module" async data-first-check>[\s\S]*?<\/script>/,
          '',
        );
        expect(html).toContain('id="lot-data"');
        expect(html).not.toContain('data-first-check');
        const headers = Object.fromEntries(
          Object.entries(res.headers()).filter(([k]) => !/^content-(encoding|length)$/i.test(k)),
        );
        await route.fulfill({ response: res, headers, body: html });
      });
      const files: string[] = [];
      page.on('request', (r) => files.push(new URL(r.url()).pathname));
      await page.goto(`${baseUrl}/l/${code}`);
      await page
        .getByRole('status')
        .getByText(`Unbroken history as served: ${entries().length} entries`)
        .waitFor();
      expect(files.filter((f) => /^\/assets\/lot\/first-check-\w+\.js$/.test(f))).toHaveLength(1);
      await page.getByText(`Lot ${formatLotCode(code)}`, { exact: true }).waitFor();
      expect(errors).toEqual([]);
    } finally {
      await other.close();
    }
  });
});
