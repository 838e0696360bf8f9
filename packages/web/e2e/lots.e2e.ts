import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demoAccount, expectNoSideScroll, onPhone, signIn, useJourneys } from './support/journey';

const dealer = demoAccount('dealer');
const TITLE = 'Pink rose beads from Quillmere';

/** Nothing on the page reaches past a 390 px phone screen, so it never scrolls sideways. */
describe('the dealer’s lots in Chromium', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;
  let lotUrl = '';

  it('register a lot with observations → find it in the inventory → its page shows registered and observed, verified', async () => {
    const { page, errors } = journeys.start();
    await signIn(page, baseUrl, dealer.email);

    await page.getByRole('link', { name: 'Register a lot' }).click();
    await page.getByRole('heading', { name: 'Register a lot' }).waitFor();
    await page.getByRole('textbox', { name: /^Title/ }).fill(TITLE);
    await page.getByRole('textbox', { name: 'or in inches' }).fill('16');
    await page.getByRole('textbox', { name: /largest/ }).fill('8');
    await page.getByRole('button', { name: /Use 51 as an estimate/ }).click();
    await page.getByRole('textbox', { name: 'Colours' }).fill('white, rose pink, green');
    await page.getByRole('checkbox', { name: 'Opaque' }).check();
    await page.getByRole('checkbox', { name: 'Roses' }).check();
    await page.locator('label').filter({ hasText: 'White or grey powder' }).click();
    await page.locator('label').filter({ hasText: 'Swirls or lines running round the hole' }).click();
    await page.locator('label').filter({ hasText: 'No glow' }).click();
    await page
      .getByText(/365 nm/)
      .first()
      .waitFor();
    await page.getByRole('textbox', { name: 'Storage location' }).fill('Cabinet 2, drawer C');

    // The draft survives a reload.
    await page.reload();
    await expect(page.getByRole('textbox', { name: /^Title/ }).inputValue()).resolves.toBe(TITLE);
    await expect(page.getByRole('textbox', { name: 'Number of beads' }).inputValue()).resolves.toBe('51');
    await screenshot(page, 'lots-register-1280');

    await page.getByRole('button', { name: 'Register the lot' }).click();
    await page.getByRole('heading', { level: 1, name: TITLE }).waitFor();
    lotUrl = page.url();

    await page.getByRole('link', { name: 'Inventory' }).click();
    await page.getByRole('heading', { name: 'Inventory' }).waitFor();
    await page.getByRole('searchbox').fill('Quillmere');
    await page.waitForURL(/q=Quillmere/);
    const table = page.getByRole('table', { name: 'Lots' });
    await table.getByRole('row').filter({ hasText: TITLE }).waitFor();
    // The previous page stays on screen while the filtered one loads: wait for the filter to apply.
    await expect.poll(() => table.getByRole('row').count(), { timeout: 15_000 }).toBe(2);
    await screenshot(page, 'lots-inventory-1280');
    // Side by side, each search and filter control stays inside its own cell.
    const controls = await page
      .getByRole('search', { name: 'Find lots' })
      .locator('.fui-SearchBox, .fui-Dropdown')
      .evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect));
    expect(controls).toHaveLength(7);
    for (let i = 1; i < controls.length; i++) {
      const [a, b] = [controls[i - 1]!, controls[i]!];
      if (a.top === b.top) expect(a.right).toBeLessThan(b.left);
    }

    await table.getByRole('link', { name: TITLE }).click();
    await page.getByText('Verified in this browser').waitFor();
    const history = page
      .getByRole('region', { name: 'History' })
      .or(page.locator('section[aria-labelledby="lot-timeline-title"]'));
    const kinds = await history
      .locator('li')
      .evaluateAll((els) => els.map((e) => e.getAttribute('data-kind')));
    expect(kinds).toEqual(['observed', 'registered']);
    await history.getByText('You registered the lot').waitFor();
    await page.getByText('Cabinet 2, drawer C').waitFor();
    await page.getByText('406.4 mm (16 in)').waitFor();
    await screenshot(page, 'lots-lot-page-1280');
    expect(errors).toEqual([]);
  });

  it('fits a phone screen (390 px): the form, the inventory as cards, the lot page', async () => {
    await onPhone(async (page) => {
      await signIn(page, baseUrl, dealer.email);
      await page.goto(`${baseUrl}/lots/new`);
      await page.getByRole('heading', { name: 'Register a lot' }).waitFor();
      await screenshot(page, 'lots-register-390');
      await expectNoSideScroll(page);

      // The navigation folds into one menu on a phone.
      expect(await page.locator('nav[aria-label="Main"]').isVisible()).toBe(false);
      await page.getByRole('button', { name: 'Menu', exact: true }).click();
      await page.getByRole('menuitem', { name: 'Inventory' }).click();
      await page.getByRole('heading', { name: 'Inventory' }).waitFor();

      await page.goto(`${baseUrl}/lots?q=Quillmere`);
      const cards = page.getByRole('list', { name: 'Lots' });
      await cards.getByText(TITLE).waitFor();
      expect(await page.getByRole('table', { name: 'Lots' }).isVisible()).toBe(false);
      await screenshot(page, 'lots-inventory-390');
      await expectNoSideScroll(page);

      await page.goto(lotUrl);
      await page.getByText('Verified in this browser').waitFor();
      await screenshot(page, 'lots-lot-page-390');
      await expectNoSideScroll(page);
    });
  });
});
