import { createHash } from 'node:crypto';
import { parseBundle, type ExhibitAddedBody } from '@beadroll/core';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demo, demoAccount, postAsSignedIn, strand, useJourneys } from './support/journey';

/**
 * A generated "photo" of about a megabyte (noise does not compress), with a GPS block in its
 * EXIF so the journey also sees that what comes back carries none.
 */
async function photo(hue: number): Promise<Buffer> {
  return sharp({
    create: {
      width: 1400,
      height: 1000,
      channels: 3,
      background: { r: hue, g: 120, b: 255 - hue },
      noise: { type: 'gaussian', mean: 128, sigma: 40 },
    },
  })
    .jpeg({ quality: 90 })
    .withExif({ IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '45/1 26/1 15/1' } })
    .toBuffer();
}

describe('attaching evidence photos to a lot (1280 px)', () => {
  const journeys = useJourneys({ width: 1280, height: 900 });
  const { baseUrl, browser } = journeys;
  let code: string;

  beforeAll(async () => {
    const api = browser.context.request;
    const signIn = await api.post(`${baseUrl}/api/auth/sign-in`, {
      headers: { 'x-beadroll-request': '1' },
      data: { email: demoAccount('dealer').email, password: demo.password },
    });
    expect(signIn.status()).toBe(200);
    // One of the dealer's own listed lots, or a new one when the scenario gives them none.
    const mine = (await (await api.get(`${baseUrl}/api/lots?mine=true&listed=true`)).json()) as {
      items: { code: string }[];
    };
    code = mine.items[0]?.code ?? '';
    if (!code) {
      const made = await postAsSignedIn<{ code: string }>(browser.page, '/api/lots', {
        description: strand('Strand of amber-coloured wound beads', { colours: ['amber'] }),
      });
      code = made.code;
    }
  });

  it('attaches two photos with progress shown, sees them in the gallery, and their entries verify', async () => {
    const { page, errors } = journeys.start();
    const { context } = browser;
    const files = [
      { name: 'strand-front.jpg', mimeType: 'image/jpeg', buffer: await photo(200) },
      { name: 'strand-clasp.jpg', mimeType: 'image/jpeg', buffer: await photo(60) },
    ];

    await page.goto(`${baseUrl}/lots/${code}`);
    await page.getByText('Verified in this browser').waitFor();
    const uploader = page.getByRole('region', { name: 'Add exhibits' });
    await uploader.getByTestId('exhibit-files').setInputFiles(files);
    for (const f of files) await uploader.getByRole('listitem', { name: f.name }).waitFor();
    await uploader.getByRole('listitem', { name: files[1].name }).getByLabel('Caption').fill('The old clasp');

    // A slow uplink (about 400 kB/s), so each file's progress bar is seen part-way.
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: 20,
      downloadThroughput: -1,
      uploadThroughput: 400 * 1024,
    });
    await uploader.getByRole('button', { name: 'Add 2 exhibits to the roll' }).click();
    const bar = uploader.getByRole('listitem', { name: files[0].name }).getByRole('progressbar');
    await expect
      .poll(async () => Number(await bar.getAttribute('aria-valuenow')), { timeout: 20_000, interval: 50 })
      .toBeGreaterThan(0);
    const partway = Number(await bar.getAttribute('aria-valuenow'));
    expect(partway).toBeLessThan(1);
    await screenshot(page, 'exhibits-uploading-1280');
    for (const f of files)
      await uploader
        .getByRole('listitem', { name: f.name })
        .getByText('Added to the roll.')
        .waitFor({ timeout: 60_000 });
    await cdp.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: 0,
      downloadThroughput: -1,
      uploadThroughput: -1,
    });

    // The roll as served now ends with two exhibit-added entries naming what was stored.
    const res = await context.request.get(`${baseUrl}/api/public/lots/${code}`);
    const entries = parseBundle(((await res.json()) as { bundle: unknown }).bundle).rolls[0]!.entries;
    const added = entries
      .filter((e) => JSON.parse(e.header).kind === 'exhibit-added')
      .slice(-2)
      .map((e) => ({
        seq: JSON.parse(e.header).seq as number,
        body: JSON.parse(e.body!) as ExhibitAddedBody,
      }));
    expect(added).toHaveLength(2);

    // The gallery shows both, each image checked in the browser against the SHA-256 on the roll.
    const gallery = page.getByRole('list', { name: 'Exhibits' });
    for (const { seq, body } of added) {
      if (!('exhibit' in body)) throw new Error('a public exhibit was expected');
      const thumb = body.exhibit.derivatives.find((d) => d.role === 'thumbnail')!;
      await gallery.locator(`img[data-verified="true"][data-sha256="${thumb.sha256}"]`).first().waitFor();
      // Anyone can re-hash a download and match the roll (SHA-256, FIPS 180-4, via node:crypto).
      const file = await context.request.get(`${baseUrl}/api/public/lots/${code}/exhibits/${seq}/original`);
      expect(file.headers()['content-type']).toBe('image/jpeg');
      expect(
        createHash('sha256')
          .update(await file.body())
          .digest('hex'),
      ).toBe(body.exhibit.original.sha256);
    }
    // The page's own verification covers the new entries: the roll still verifies, head included.
    await page.getByText('Verified in this browser').waitFor();
    await page.getByText(`newest entry ${added[1].seq},`).waitFor();
    await page.getByText(`entry ${added[0].seq} · exhibit-added`).waitFor();
    await page.getByText(`entry ${added[1].seq} · exhibit-added`).waitFor();
    await screenshot(page, 'exhibits-gallery-1280');

    // And a buyer's public page shows the same photos, checked.
    await page.goto(`${baseUrl}/l/${code}`);
    await page.getByText(/Unbroken history as served/).waitFor();
    await expect
      .poll(async () => page.locator('[data-image-state="ok"]').count(), {
        timeout: 20_000,
      })
      .toBeGreaterThanOrEqual(2);
    await screenshot(page, 'exhibits-public-1280');
    expect(errors).toEqual([]);
  });
});
