import { describe, expect, inject, it } from 'vitest';
import { tagPayload } from '@beadroll/core';
import { screenshot } from './support/browser';
import { useCameraBrowser, useHeldLotCamera } from './support/journey';

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

describe('the fair scanner, signed in as the holder', () => {
  const camera = useHeldLotCamera('Green glass melon beads on the fair stand', { width: 420, height: 860 });

  it('reads the tag of a lot the dealer holds and opens that lot with its quick actions', async () => {
    const { page } = await camera.scan();
    await page.getByText('This tag names the newest entry.').waitFor();
    await page.getByRole('button', { name: 'Print a new tag' }).waitFor();
    await screenshot(page, 'scanner-held-lot');
  });
});
