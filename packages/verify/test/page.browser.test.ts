// The offline verifier page in Debian's Chromium with the network switched off: the one built
// HTML file, opened from disk, checks the example bundle and a tampered copy, and shows what the
// command line says.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildVerifier, PAGE_FILE } from '../build.mjs';
import { reportBundleText } from '../src/report.js';
import {
  EXAMPLE,
  EXAMPLE_V1,
  exampleWithCheckpoint,
  NOT_BUNDLES,
  REPO,
  tamperedExample,
} from './fixtures.js';

const ARTIFACTS = join(REPO, 'test-artifacts');
const tampered = tamperedExample();
const logged = exampleWithCheckpoint();

describe('the offline verifier page', () => {
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  const requests: string[] = [];
  const errors: string[] = [];

  beforeAll(async () => {
    await buildVerifier();
    browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      headless: true,
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
      ],
    });
    context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    // No network at all: the context is offline and every request that is not the page file is aborted.
    await context.setOffline(true);
    await context.route('**/*', (route) =>
      route.request().url().startsWith('file:') ? route.continue() : route.abort(),
    );
    page = await context.newPage();
    page.on('request', (r) => requests.push(r.url()));
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(pathToFileURL(PAGE_FILE).href);
  });
  afterAll(async () => {
    await browser?.close();
  });

  async function choose(name: string, bytes: string | Uint8Array): Promise<void> {
    await page.setInputFiles('#file', {
      name,
      mimeType: 'application/json',
      buffer: Buffer.from(typeof bytes === 'string' ? bytes : Buffer.from(bytes)),
    });
  }
  const verdict = () => page.locator('.v-verdict');
  const resultExit = () => page.locator('#result').getAttribute('data-exit');

  it('checks the example bundle chosen with the file button: every roll intact, as the command line says', async () => {
    await choose('example.beadroll.json', EXAMPLE);
    await expect.poll(resultExit).toBe('0');
    expect(await verdict().textContent()).toContain('Intact');
    const rolls = page.locator('.v-roll');
    expect(await rolls.count()).toBe(6);
    expect(await page.locator('.v-roll[data-ok="true"]').count()).toBe(6);
    const cli = reportBundleText(EXAMPLE);
    expect(await page.locator('#result').textContent()).toContain(cli.headline);
    expect(await page.locator('#result').textContent()).toContain(cli.summary!);
    mkdirSync(ARTIFACTS, { recursive: true });
    await page.screenshot({ path: join(ARTIFACTS, 'verify-page-intact-390.png'), fullPage: true });
  });

  it('names the broken lot, the entry and the reason in a tampered copy', async () => {
    await choose('tampered.beadroll.json', tampered.text);
    await expect.poll(resultExit).toBe('1');
    expect(await verdict().textContent()).toContain('Broken');
    const bad = page.locator(`.v-roll[data-lot="${tampered.lot}"]`);
    expect(await bad.getAttribute('data-ok')).toBe('false');
    expect(await bad.locator('.v-reason').textContent()).toBe('bad-body-digest');
    expect(await bad.textContent()).toContain(`At entry ${tampered.seq}`);
    expect(await page.locator('#result').textContent()).toContain(reportBundleText(tampered.text).headline);
    await page.screenshot({ path: join(ARTIFACTS, 'verify-page-broken-390.png'), fullPage: true });
  });

  it('shows a version-1 roll whose removed body hid a rule fact as intact but not fully checkable', async () => {
    await choose('old.beadroll.json', EXAMPLE_V1);
    await expect.poll(resultExit).toBe('0');
    expect(await verdict().getAttribute('data-noted')).toBe('true');
    expect(await verdict().textContent()).toContain('could not be checked');
    const partial = page.locator('.v-roll[data-partial="true"]');
    expect(await partial.count()).toBe(1);
    expect(await partial.textContent()).toContain('not fully checkable after a removal');
    expect(await page.locator('#result').textContent()).toContain(reportBundleText(EXAMPLE_V1).headline);
    await page.screenshot({ path: join(ARTIFACTS, 'verify-page-v1-390.png'), fullPage: true });
  });

  it('says a file that is not a bundle is not one', async () => {
    for (const f of NOT_BUNDLES) {
      await choose(f.name, f.bytes);
      await expect.poll(() => page.locator('#result .v-detail').textContent()).toContain(`${f.why}:`);
      expect(await resultExit()).toBe('2');
    }
  });

  it('takes a file dropped anywhere on the page', async () => {
    await page.evaluate((text) => {
      const dt = new DataTransfer();
      dt.items.add(new File([text], 'dropped.beadroll.json', { type: 'application/json' }));
      window.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, tampered.text);
    await expect.poll(resultExit).toBe('1');
    expect(await page.locator('#result').textContent()).toContain('dropped.beadroll.json');
  });

  it('checks the file’s checkpoint of the public log with the log key typed in (format §14.5)', async () => {
    await choose('logged.beadroll.json', logged.text);
    await expect.poll(resultExit).toBe('0');
    expect(await page.locator('#result').textContent()).toContain('give the log key above to check it too');
    // The label names the field: clicking its text focuses it.
    await page.getByText('The registry’s log key', { exact: false }).click();
    await page.keyboard.type(logged.logKey);
    await choose('logged.beadroll.json', logged.text);
    await expect.poll(() => page.locator('.v-checkpoint').count()).toBe(1);
    expect(await resultExit()).toBe('0');
    const cp = page.locator('.v-checkpoint');
    expect(await cp.getAttribute('data-ok')).toBe('true');
    expect(await cp.textContent()).toContain('Checkpoint of 18 entries');
    expect(await cp.textContent()).toContain('in the log');
    await page.screenshot({ path: join(ARTIFACTS, 'verify-page-checkpoint-390.png'), fullPage: true });
    // A checkpoint signed by another key is broken.
    await page.locator('#logkey').fill(logged.otherKey);
    await choose('logged.beadroll.json', logged.text);
    await expect.poll(resultExit).toBe('1');
    expect(await page.locator('.v-checkpoint').getAttribute('data-ok')).toBe('false');
    // Text that is not a key is said so, and the file is still checked without it.
    await page.locator('#logkey').fill('not a key');
    await choose('logged.beadroll.json', logged.text);
    await expect.poll(resultExit).toBe('0');
    expect(await page.locator('#result').textContent()).toContain('The log key was not used');
    await page.locator('#logkey').fill('');
  });

  it('offers no download of itself when opened from a file', async () => {
    expect(await page.locator('#save').isHidden()).toBe(true);
  });

  it('made no request but for the page file itself, and its own policy refused nothing it needs', () => {
    expect(requests.filter((u) => !u.startsWith('file:'))).toEqual([]);
    expect(errors).toEqual([]);
  });
});
