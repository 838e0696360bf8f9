import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { tagPayload, tagReference } from '@beadroll/core';
import pg from 'pg';
import sharp from 'sharp';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject } from 'vitest';
import { openBrowser, type Browser } from './browser';
import { writeTagVideo } from './fake-camera';

/** An account of the invented demo scenario (seed-demo/accounts.json). */
export interface DemoAccount {
  role: string;
  status: string;
  handle: string;
  email: string;
  displayName: string;
}

/** The invented demo scenario's accounts: they share one password. */
export const demo = JSON.parse(
  readFileSync(resolve(__dirname, '..', '..', '..', '..', 'seed-demo', 'accounts.json'), 'utf8'),
) as { password: string; accounts: DemoAccount[] };

/** The first demo account that is `role` (verified, where accounts of the role can be). */
export function demoAccount(role: 'dealer' | 'assessor' | 'registrar'): DemoAccount {
  return demo.accounts.find((a) => a.role === role && (role === 'registrar' || a.status === 'verified'))!;
}

/** The demo account with this handle. */
export function demoHandle(handle: string): DemoAccount {
  return demo.accounts.find((a) => a.handle === handle)!;
}

/**
 * Signs in on the sign-in page and waits to land on the account's own start page (each role has
 * its own, away from the sign-in form). `fresh` drops an earlier session first.
 */
export async function signIn(
  page: Page,
  baseUrl: string,
  email: string,
  opts: { password?: string; fresh?: boolean } = {},
): Promise<void> {
  if (opts.fresh) await page.context().clearCookies();
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByRole('textbox', { name: 'E-mail address' }).fill(email);
  await page.getByLabel('Password').fill(opts.password ?? demo.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
}

/** Signs out from the account menu and waits for the signed-out header. */
export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: /account menu of/i }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.getByRole('link', { name: 'Sign in' }).waitFor();
}

/** A phone's screen: 390 × 844 CSS pixels. */
export const PHONE = { width: 390, height: 844 };

/**
 * The journeys of the enclosing `describe` in one browser (see {@link useBrowser}): `baseUrl` is
 * the service under test, and `start()`, called first in each journey, gives the page, the
 * service's address and the page's uncaught errors from then on (a journey expects none).
 */
export function useJourneys(opts: Parameters<typeof openBrowser>[0] = {}) {
  const browser = useBrowser(opts);
  const baseUrl = inject('baseUrl');
  return {
    baseUrl,
    browser,
    start: () => ({ page: browser.page, baseUrl, errors: pageErrors(browser.page) }),
  };
}

/** Runs `journey` in a browser of its own at phone width ({@link PHONE}), closed after it however it ends. */
export async function onPhone(journey: (page: Page) => Promise<void>): Promise<void> {
  const phone = await openBrowser(PHONE);
  try {
    await journey(phone.page);
  } finally {
    await phone.close();
  }
}

/** Expects the page to fit its window's width: nothing to scroll sideways. */
export async function expectNoSideScroll(page: Page): Promise<void> {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow).toBeLessThanOrEqual(0);
}

/**
 * A browser for the journeys of the enclosing `describe`: opened before them, closed after. The
 * returned object reads through to it (`const { page } = browser` inside a test).
 */
export function useBrowser(opts: Parameters<typeof openBrowser>[0] = {}): Browser {
  let open: Browser | undefined;
  beforeAll(async () => {
    open = await openBrowser(opts);
  });
  afterAll(async () => {
    await open?.close();
  });
  return proxy(() => open!);
}

/** A browser that reads through to the one `current` returns when used. */
function proxy(current: () => Browser): Browser {
  return {
    get context() {
      return current().context;
    },
    get page() {
      return current().page;
    },
    close: () => current().close(),
  };
}

/**
 * A browser for the enclosing `describe` whose camera shows a tag: `payload` (run before the
 * journeys, after any setup it does) gives the tag's QR text, played as a fake camera's video.
 */
export function useCameraBrowser(
  payload: () => Promise<string>,
  size: { width: number; height: number },
): Browser {
  let open: Browser | undefined;
  let dir: string | undefined;
  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'beadroll-camera-'));
    const video = join(dir, 'tag.y4m');
    await writeTagVideo(video, await payload());
    open = await openBrowser({
      ...size,
      args: [
        '--use-fake-device-for-media-stream',
        '--use-fake-ui-for-media-stream',
        `--use-file-for-fake-video-capture=${video}`,
      ],
    });
  });
  afterAll(async () => {
    await open?.close();
    if (dir) rmSync(dir, { recursive: true, force: true });
  });
  return proxy(() => open!);
}

/** A lot the demo dealer holds, with the reference its tag prints. */
export interface HeldLot {
  code: string;
  title: string;
  ref: string;
}

/**
 * Registers an invented unlisted strand for the demo dealer over HTTP, with a storage place and a
 * cost sealed, and records `opinion` on it when given.
 */
export async function registerHeldLot(title: string, opinion?: object): Promise<HeldLot> {
  const call = await apiClient(inject('baseUrl'), demoAccount('dealer').email);
  let lot = await call<{ code: string; headHash: string }>('/api/lots', {
    description: strand(title, { listed: false }),
    sealed: { storageLocation: 'Fair case 2', acquisition: { cost: { amount: 1500, currency: 'EUR' } } },
  });
  if (opinion) {
    await call(`/api/lots/${lot.code}/opinions`, opinion);
    lot = await call(`/api/lots/${lot.code}`);
  }
  return { code: lot.code, title, ref: tagReference(lot.headHash) };
}

/**
 * For the enclosing `describe`: a lot the demo dealer holds, registered before its journeys as
 * {@link registerHeldLot} does; `.lot` inside them.
 */
export function useHeldLot(title: string, opinion?: object): { readonly lot: HeldLot } {
  let lot: HeldLot | undefined;
  beforeAll(async () => {
    lot = await registerHeldLot(title, opinion);
  });
  return {
    get lot() {
      return lot!;
    },
  };
}

/**
 * For the enclosing `describe`: a browser whose camera shows the tag of a lot the demo dealer
 * holds (registered as `title` before the journeys). `scan()` signs the dealer in, starts the
 * scanner and waits for the lot's own page under it with the tag's reference.
 */
export function useHeldLotCamera(title: string, size: { width: number; height: number }) {
  const baseUrl = inject('baseUrl');
  let lot: HeldLot;
  const browser = useCameraBrowser(async () => {
    lot = await registerHeldLot(title);
    return tagPayload(new URL(baseUrl).host, lot.code, lot.ref);
  }, size);
  return {
    baseUrl,
    async scan(): Promise<{ page: Page; lot: HeldLot }> {
      const { page } = browser;
      await signIn(page, baseUrl, demoAccount('dealer').email);
      await scanHeldLot(page, baseUrl, lot);
      return { page, lot };
    },
  };
}

async function scanHeldLot(page: Page, baseUrl: string, lot: HeldLot): Promise<void> {
  await page.goto(`${baseUrl}/scan`);
  await page.getByRole('button', { name: 'Start camera' }).click();
  await page.waitForURL(`${baseUrl}/scan/lots/${lot.code}?ref=${lot.ref}`, { timeout: 30_000 });
  await page.getByRole('heading', { level: 1, name: lot.title }).waitFor();
}

/**
 * Adds an invented close-up photo (a plain JPEG of `background`) as one exhibit through the
 * open lot page's uploader, with `caption`, and waits until it is on the roll.
 */
export async function addCloseUp(
  page: Page,
  file: string,
  caption: string,
  background: { r: number; g: number; b: number },
): Promise<void> {
  const closeUp = await sharp({ create: { width: 640, height: 480, channels: 3, background } })
    .jpeg()
    .toBuffer();
  const uploader = page.getByRole('region', { name: 'Add exhibits' });
  await uploader
    .getByTestId('exhibit-files')
    .setInputFiles([{ name: file, mimeType: 'image/jpeg', buffer: closeUp }]);
  const item = uploader.getByRole('listitem', { name: file });
  await item.getByLabel('Caption').fill(caption);
  await uploader.getByRole('button', { name: /^Add 1 exhibit/ }).click();
  await item.getByText('Added to the roll.').waitFor({ timeout: 30_000 });
}

/** Opens the open lot page's action `name` (a button of its Actions group) and gives its dialog. */
export async function openAction(page: Page, name: string): Promise<Locator> {
  await page.getByRole('group', { name: 'Actions' }).getByRole('button', { name }).click();
  return page.getByRole('dialog');
}

/** An invented listed strand's description, as the API takes it; `changes` replace its parts. */
export function strand(title: string, changes: Record<string, unknown> = {}) {
  return {
    title,
    form: 'strand',
    count: { value: 24, estimated: false },
    colours: ['green'],
    baseGlass: ['transparent'],
    decoration: [],
    listed: true,
    ...changes,
  };
}

/**
 * Sends `data` to the API's `path` as the account signed in on `page` (its cookies), as a client
 * would; expects `201 Created` and gives the answer.
 */
export async function postAsSignedIn<T>(page: Page, path: string, data: unknown): Promise<T> {
  const res = await page.request.post(`${inject('baseUrl')}${path}`, {
    headers: { 'X-Beadroll-Request': '1' },
    data,
  });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as T;
}

/** A superuser connection to the journeys' database, for changing what the service stored. */
export function superuser(): pg.Client {
  return new pg.Client({
    host: process.env.PGHOST,
    port: Number(process.env.PGPORT),
    user: process.env.BEADROLL_TEST_PG_SUPERUSER,
    password: process.env.BEADROLL_TEST_PG_SUPERPASSWORD,
    database: inject('database'),
  });
}

/** A signed-in HTTP client for a demo account: GET without a body, POST with one. */
export async function apiClient(baseUrl: string, email: string) {
  const signedIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
    body: JSON.stringify({ email, password: demo.password }),
  });
  expect(signedIn.ok).toBe(true);
  const cookie = signedIn.headers
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

/** Collects the uncaught errors of `page` from now on (a journey expects none). */
export function pageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  return errors;
}
