import { readFileSync } from 'node:fs';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demoAccount, expectNoSideScroll, onPhone, signIn, signOut, useJourneys } from './support/journey';

const registrar = demoAccount('registrar');

describe('accounts in Chromium', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;

  it('sign up → open the mail in the mailbox → confirm → the registrar approves → sign in as a verified dealer', async () => {
    const { page, errors } = journeys.start();
    const email = `sela.${Date.now()}@example.invalid`;
    const password = 'seven glass beads in a row';

    await page.goto(`${baseUrl}/sign-up`);
    await page.getByRole('textbox', { name: 'Your name' }).fill('Sela Marrowind');
    await page.getByRole('textbox', { name: /handle/i }).fill(`sela-${Date.now()}`);
    await page.getByRole('textbox', { name: 'Business name' }).fill('Marrowind Old Glass');
    await page.getByRole('textbox', { name: 'Town' }).fill('Smalti Hollow');
    await page.getByRole('textbox', { name: 'Country' }).fill('Frit Marches');
    await page.getByRole('textbox', { name: 'Business address' }).fill('3 Lantern Yard, Smalti Hollow');
    await page
      .getByRole('textbox', { name: 'Trade references' })
      .fill('Table 22 at the Smalti Hollow spring bead fair; buys from Varnas Bead Cellar.');
    await page.getByRole('textbox', { name: 'E-mail address' }).fill(email);
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Apply' }).click();
    await page.getByText('must be 12 to 128 characters long').waitFor();
    await screenshot(page, 'accounts-sign-up-error-1280');
    await page.getByLabel('Password').fill(password);
    // The optional document: a text file is refused at once, naming the field; a PNG is taken.
    const documentInput = page.locator('input[type="file"][name="document"]');
    await documentInput.setInputFiles({
      name: 'notes.txt',
      mimeType: 'text/plain',
      buffer: Buffer.from('hello'),
    });
    await page.getByText('must be a PDF, JPEG or PNG file').waitFor();
    const licence = await sharp({
      create: { width: 400, height: 300, channels: 3, background: { r: 240, g: 236, b: 220 } },
    })
      .png()
      .toBuffer();
    await documentInput.setInputFiles({ name: 'trade-licence.png', mimeType: 'image/png', buffer: licence });
    const wide = page.viewportSize()!;
    await page.setViewportSize({ width: 390, height: 844 });
    await documentInput.scrollIntoViewIfNeeded();
    await screenshot(page, 'accounts-sign-up-document-390');
    await page.setViewportSize(wide);
    await page.getByRole('button', { name: 'Apply' }).click();
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();

    await page.goto(`${baseUrl}/dev/mailbox`);
    const mail = page.getByRole('article', { name: 'Confirm your e-mail address for Beadroll' }).filter({
      hasText: email,
    });
    await mail.waitFor();
    await screenshot(page, 'accounts-mailbox-1280');
    const [response] = await Promise.all([
      page.waitForResponse(
        (r) => r.url().includes('/verify-email?token=') && r.request().isNavigationRequest(),
      ),
      mail.getByRole('link', { name: /verify-email/ }).click(),
    ]);
    expect(response.headers()['referrer-policy']).toBe('no-referrer');
    await page.getByRole('heading', { name: 'Confirm your e-mail address' }).waitFor();
    await page.getByRole('button', { name: 'Confirm my e-mail address' }).click();
    await page.getByRole('heading', { name: 'E-mail address confirmed' }).waitFor();

    await signIn(page, baseUrl, registrar.email);
    await page.getByRole('link', { name: 'Verification queue' }).click();
    const row = page.getByRole('row').filter({ hasText: 'Sela Marrowind' });
    await row.waitFor();
    await screenshot(page, 'accounts-registry-1280');
    // The registrar reads the application before deciding.
    await row.getByRole('button', { name: 'Read the application' }).click();
    const application = page.getByRole('dialog', { name: 'Application of Sela Marrowind' });
    await application.getByText('3 Lantern Yard, Smalti Hollow').waitFor();
    await application.getByText(/Table 22 at the Smalti Hollow spring bead fair/).waitFor();
    await application.getByText('None given').waitFor();
    // The document sent with the application, for the registrar to download: the same bytes.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      application.getByRole('link', { name: /^Download trade-licence\.png/ }).click(),
    ]);
    const saved = await download.path();
    expect(Buffer.compare(readFileSync(saved!), licence)).toBe(0);
    await screenshot(page, 'accounts-application-1280');
    await application.getByRole('button', { name: 'Close' }).click();
    // Approving asks first.
    await row.getByRole('button', { name: 'Approve…' }).click();
    const confirm = page.getByRole('dialog', { name: 'Approve Sela Marrowind?' });
    await confirm.waitFor();
    await confirm.getByRole('button', { name: 'Approve' }).click();
    await row.waitFor({ state: 'detached' });
    await signOut(page);

    await signIn(page, baseUrl, email, { password });
    // A verified dealer lands on the inventory.
    await page.getByRole('heading', { name: 'Inventory', level: 1 }).waitFor();
    await page.goto(`${baseUrl}/account`);
    await expect(page.locator('#account-title').textContent()).resolves.toBe('Sela Marrowind');
    await page.getByText('Verified', { exact: true }).waitFor();
    expect(await page.getByRole('link', { name: 'Verification queue' }).count()).toBe(0);
    await screenshot(page, 'accounts-account-1280');
    expect(errors).toEqual([]);
  });

  it('fits a phone screen (390 px): sign-in, account page and the queue', async () => {
    await onPhone(async (page) => {
      await page.goto(`${baseUrl}/sign-in`);
      await page.getByRole('button', { name: 'Sign in' }).waitFor();
      await screenshot(page, 'accounts-sign-in-390');
      await signIn(page, baseUrl, registrar.email);
      await screenshot(page, 'accounts-account-390');
      await page.goto(`${baseUrl}/registry`);
      await page.getByRole('heading', { name: 'Account verification' }).waitFor();
      await page.getByRole('row').filter({ hasText: 'Pim Oyelaran' }).waitFor();
      await screenshot(page, 'accounts-registry-390');
      await expectNoSideScroll(page);
    });
  });
});
