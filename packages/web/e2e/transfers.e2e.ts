import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demo, demoHandle, expectNoSideScroll, onPhone, signOut, useJourneys } from './support/journey';

const teodor = demoHandle('teodor-brasko');
const ines = demoHandle('ines-calloway-rue');
// A lot of the demo scenario that Teodor holds after it changed hands (seed-demo/transfers.json).
const LOT = 'Wound beads with blue trailing, a long strand';

async function signIn(page: Page, email: string) {
  await page.getByRole('textbox', { name: 'E-mail address' }).fill(email);
  await page.getByLabel('Password').fill(demo.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

/** Chooses the option of a select whose text contains `text`. */
async function choose(page: Page, name: string, text: string) {
  const select = page.getByRole('dialog').getByRole('combobox', { name });
  await select.locator('option', { hasText: text }).waitFor({ state: 'attached' });
  const value = await select.locator('option', { hasText: text }).getAttribute('value');
  await select.selectOption(value!);
}

describe('transfers in Chromium', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;

  it('A offers, B follows the e-mailed link and accepts, the lot is B’s, B records a sale', async () => {
    const { page, errors } = journeys.start();

    // Dealer A offers one of their lots, with a sealed price.
    await page.goto(`${baseUrl}/sign-in?next=/transfers/outgoing`);
    await signIn(page, teodor.email);
    await page.getByRole('heading', { name: 'Outgoing offers' }).waitFor();
    await page.getByRole('button', { name: 'Offer a lot' }).click();
    const dialog = page.getByRole('dialog');
    await choose(page, 'Lot', LOT);
    await dialog.getByRole('textbox', { name: /Find the dealer/ }).fill('calloway');
    await dialog.getByRole('radio', { name: new RegExp(ines.displayName) }).check();
    await dialog.getByRole('textbox', { name: /Note/ }).fill('the strand you liked at Aventurine Combe');
    await dialog.getByRole('textbox', { name: 'Agreed price (optional): amount' }).fill('210.00');
    await screenshot(page, 'transfers-offer-dialog-1280');
    await dialog.getByRole('button', { name: 'Send the offer' }).click();
    await page.getByText(`Offer sent to ${ines.displayName}.`).waitFor();
    const row = page.getByRole('row').filter({ hasText: LOT }).filter({ hasText: 'Waiting for an answer' });
    await row.waitFor();
    await screenshot(page, 'transfers-outgoing-1280');
    await signOut(page);

    // Dealer B opens the mail in the development mailbox and follows its link.
    await page.goto(`${baseUrl}/dev/mailbox`);
    const mail = page.getByRole('article', {
      name: new RegExp(`^${teodor.displayName} .*offers you a lot: ${LOT}$`),
    });
    await mail.waitFor();
    expect(await mail.textContent()).not.toMatch(/210/);
    await mail
      .getByRole('link', { name: /\/transfers\/offers\// })
      .first()
      .click();
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await signIn(page, ines.email);
    await page.getByRole('heading', { name: `${teodor.displayName} offers you a lot` }).waitFor();
    await page.getByText(/210[.,]00/).waitFor();
    await screenshot(page, 'transfers-answer-1280');
    await page.getByRole('button', { name: 'Accept the lot' }).click();
    await page.getByText('The lot is yours now.', { exact: false }).waitFor();

    // The lot is now among B's lots: it is offered for a sale, which B records.
    await page.getByRole('link', { name: 'Sales' }).click();
    await page.getByRole('heading', { name: 'Sales' }).waitFor();
    await page.getByRole('button', { name: 'Record a sale' }).click();
    const sale = page.getByRole('dialog');
    await choose(page, 'Lot', LOT);
    await sale.getByRole('textbox', { name: 'Price: amount' }).fill('260');
    await screenshot(page, 'transfers-record-sale-1280');
    await sale.getByRole('button', { name: 'Record the sale' }).click();
    await page.getByText(`Sale of “${LOT}” recorded`).waitFor();
    await page.getByRole('row').filter({ hasText: LOT }).waitFor();
    await screenshot(page, 'transfers-sales-1280');

    // Incoming shows the accepted offer; the lot is no longer offered to anyone.
    await page.goto(`${baseUrl}/transfers/incoming?status=accepted`);
    await page.getByRole('row').filter({ hasText: LOT }).waitFor();
    expect(errors).toEqual([]);
  });

  it('fits a phone screen (390 px): incoming offers and the answer page', async () => {
    await onPhone(async (page) => {
      // Odile has an open incoming offer in the demo scenario.
      await page.goto(`${baseUrl}/sign-in?next=/transfers/incoming`);
      await signIn(page, demoHandle('odile-varnas').email);
      await page.getByRole('heading', { name: 'Incoming offers' }).waitFor();
      await page.getByRole('link', { name: 'Opaque turquoise ring beads' }).waitFor();
      await screenshot(page, 'transfers-incoming-390');
      await page.getByRole('link', { name: 'Opaque turquoise ring beads' }).click();
      await page.getByRole('button', { name: 'Accept the lot' }).waitFor();
      await screenshot(page, 'transfers-answer-390');
      await expectNoSideScroll(page);
    });
  });
});
