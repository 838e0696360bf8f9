import { describe, expect, inject, it } from 'vitest';
import { tagPayload, tagReference } from '@beadroll/core';
import { screenshot } from './support/browser';
import { demo, demoAccount, signIn, useCameraBrowser } from './support/journey';

// An invented lot on an invented host: nobody signed in holds it, so the scanner must send the
// reader to its public page with the tag reference, where the tag is checked.
const CODE = '7K2QM9XAT';
const REF = 'ABCDEFGHJK';

describe('the fair scanner with a fake camera in Chromium', () => {
  const baseUrl = inject('baseUrl');
  const browser = useCameraBrowser(async () => tagPayload('fair.beads.example', CODE, REF), {
    width: 420,
    height: 860,
  });

  it('reads a tag of a lot the reader does not hold and opens its public page with the tag reference', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl}/scan`);
    await page.getByRole('heading', { name: 'Scan a tag' }).waitFor();
    await page.getByRole('button', { name: 'Start camera' }).click();
    await page.waitForURL(`${baseUrl}/L/${CODE}/${REF}`, { timeout: 30_000 });
    expect(new URL(page.url()).pathname).toBe(`/L/${CODE}/${REF}`);
    await screenshot(page, 'scanner-public-page');
  });

  it('opens the public page for a typed code too', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl}/scan`);
    await page.getByLabel('Lot code from the tag').fill('7k2q-m9xa-t');
    await page.getByRole('button', { name: 'Open' }).click();
    await page.waitForURL(`${baseUrl}/l/${CODE}`);
  });

  it('says what is wrong with a mistyped code', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl}/scan`);
    await page.getByLabel('Lot code from the tag').fill('7K2Q-M9XA-V');
    await page.getByRole('button', { name: 'Open' }).click();
    await page.getByText(/Not a lot code/).waitFor();
  });
});

const dealer = demoAccount('dealer');

/** Signs the demo dealer in over HTTP and registers an invented lot for them; returns it with its head. */
async function heldLot(baseUrl: string): Promise<{ code: string; title: string; ref: string }> {
  const signIn = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1' },
    body: JSON.stringify({ email: dealer.email, password: demo.password }),
  });
  expect(signIn.ok).toBe(true);
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const title = 'Green glass melon beads on the fair stand';
  const res = await fetch(`${baseUrl}/api/lots`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Beadroll-Request': '1', cookie },
    body: JSON.stringify({
      description: {
        title,
        form: 'strand',
        count: { value: 24, estimated: false },
        colours: ['green'],
        baseGlass: ['transparent'],
        decoration: [],
        listed: false,
      },
    }),
  });
  const lot = (await res.json()) as { code: string; headHash: string };
  expect(res.status, JSON.stringify(lot)).toBe(201);
  return { code: lot.code, title, ref: tagReference(lot.headHash) };
}

describe('the fair scanner, signed in as the holder', () => {
  const baseUrl = inject('baseUrl');
  let lot: { code: string; title: string; ref: string };
  const browser = useCameraBrowser(
    async () => {
      lot = await heldLot(baseUrl);
      return tagPayload(new URL(baseUrl).host, lot.code, lot.ref);
    },
    { width: 420, height: 860 },
  );

  it('reads the tag of a lot the dealer holds and opens that lot with its quick actions', async () => {
    const { page } = browser;
    await signIn(page, baseUrl, dealer.email);
    await page.goto(`${baseUrl}/scan`);
    await page.getByRole('button', { name: 'Start camera' }).click();
    await page.waitForURL(`${baseUrl}/scan/lots/${lot.code}?ref=${lot.ref}`, { timeout: 30_000 });
    await page.getByRole('heading', { level: 1, name: lot.title }).waitFor();
    await page.getByText('This tag names the newest entry.').waitFor();
    await page.getByRole('button', { name: 'Print a new tag' }).waitFor();
    await screenshot(page, 'scanner-held-lot');
  });
});
