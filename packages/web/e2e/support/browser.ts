import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

/** Where journeys leave their screenshots (git-ignored). */
export const ARTIFACTS = resolve(__dirname, '..', '..', '..', '..', 'test-artifacts');

export interface Browser {
  context: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

/** Debian's Chromium, headless, with a fresh profile and no background network traffic. */
export async function openBrowser(
  opts: { width?: number; height?: number; args?: string[] } = {},
): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'beadroll-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 900 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      ...(opts.args ?? []),
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Saves a full-page screenshot under test-artifacts/. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(ARTIFACTS, { recursive: true });
  const file = join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}
