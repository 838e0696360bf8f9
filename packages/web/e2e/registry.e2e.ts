import { beforeAll, describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import {
  demoAccount,
  openAction,
  PHONE,
  postAsSignedIn,
  signIn,
  strand,
  superuser,
  useJourneys,
} from './support/journey';

const registrar = demoAccount('registrar');
const dealer = demoAccount('dealer');

/** A listed lot of the demo scenario. */
async function listedLot(): Promise<string> {
  const db = superuser();
  await db.connect();
  try {
    const { rows } = await db.query<{ code: string }>(
      `SELECT "code" FROM "lot_views" WHERE "listed" ORDER BY "registered_at" LIMIT 1`,
    );
    if (!rows[0]) throw new Error('the demo scenario has no listed lot');
    return rows[0].code;
  } finally {
    await db.end();
  }
}

describe("the registrar's tools in Chromium", () => {
  let code: string;
  beforeAll(async () => {
    code = await listedLot();
  });

  describe('a buyer reports a problem on a phone', () => {
    const journeys = useJourneys(PHONE);

    it('opens the form from the public page, is told what is missing, and sends the report', async () => {
      const { page, baseUrl, errors } = journeys.start();
      await page.goto(`${baseUrl}/l/${code}`);
      await page.getByRole('button', { name: 'Report a problem with this page' }).click();
      await page.getByRole('button', { name: 'Send the report' }).click();
      await page.getByText('Choose what the problem is.').waitFor();
      await page.getByRole('radio', { name: 'Wrong attribution claim' }).check();
      await page
        .getByLabel('What is wrong')
        .fill('The period looks too early for beads with this kind of hole.');
      await page.getByLabel(/Your e-mail address/).fill('fair.visitor@example.invalid');
      await screenshot(page, 'registry-report-form-390');
      await page.getByRole('button', { name: 'Send the report' }).click();
      await page.getByRole('status').filter({ hasText: 'The registrar will look at your report.' }).waitFor();
      const width = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(width).toBeLessThanOrEqual(390);
      expect(errors).toEqual([]);
    });
  });

  describe('the registrar at a desk', () => {
    const journeys = useJourneys();

    it('finds the report in the queue and runs the full-ledger audit with progress', async () => {
      const { page, baseUrl, errors } = journeys.start();
      await signIn(page, baseUrl, registrar.email);

      await page.goto(`${baseUrl}/registry/reports`);
      const row = page.getByRole('row').filter({ hasText: 'too early for beads' });
      await row.waitFor();
      await expect(row.getByText('Open', { exact: true }).count()).resolves.toBe(1);
      await screenshot(page, 'registry-reports-1280');

      await page.goto(`${baseUrl}/registry/audit`);
      await page.getByRole('button', { name: 'Run the audit' }).click();
      const outcome = page.getByRole('status').filter({ hasText: /rolls are broken|Every roll is intact/ });
      await outcome.waitFor();
      await expect(page.getByText(/lots checked, \d+ entries/).count()).resolves.toBe(1);
      // Another journey may have changed a stored body on purpose; then the table names that roll.
      if ((await outcome.textContent())?.includes('broken'))
        await page.getByRole('table', { name: 'Broken rolls' }).waitFor();
      await screenshot(page, 'registry-audit-1280');

      await page.goto(`${baseUrl}/registry/record`);
      await page.getByRole('heading', { name: 'Registrar’s record' }).waitFor();
      expect(errors).toEqual([]);
    });
  });
  describe('a holder asks for the removal of an entry and the registrar removes it', () => {
    const journeys = useJourneys({ width: 1280, height: 900 });

    it('asks from the lot page; the request waits in the registrar’s queue; removal keeps the roll verifying', async () => {
      const { page, baseUrl, errors } = journeys.start();
      await signIn(page, baseUrl, dealer.email);
      const { code: mine } = await postAsSignedIn<{ code: string }>(page, '/api/lots', {
        description: strand('Strand of green drawn seed beads', { count: { value: 120, estimated: true } }),
      });
      await postAsSignedIn(page, `/api/lots/${mine}/observations`, {
        observations: { note: 'Bought from the stall beside the bakery on Ostrel Lane, number 14.' },
      });

      await page.goto(`${baseUrl}/lots/${mine}`);
      await page.getByText('Verified in this browser').waitFor();
      const dialog = await openAction(page, 'Ask for a removal');
      await dialog.getByRole('combobox', { name: /^Entry/ }).selectOption('1');
      await dialog
        .getByRole('textbox', { name: /Why it should go/ })
        .fill('The note names a private address.');
      await dialog.getByRole('button', { name: 'Send the request' }).click();
      await dialog.getByText(/Your request is with the registrar/).waitFor();
      await screenshot(page, 'registry-removal-request-1280');
      await dialog.getByRole('button', { name: 'Close' }).click();

      await page.context().clearCookies();
      await signIn(page, baseUrl, registrar.email);
      await page.goto(`${baseUrl}/registry/redactions`);
      const row = page
        .getByRole('table', { name: 'Holders’ requests' })
        .getByRole('row')
        .filter({ hasText: 'The note names a private address.' });
      await row.getByRole('button', { name: 'Remove it' }).click();
      await row.waitFor({ state: 'detached' });

      await page.goto(`${baseUrl}/l/${mine}`);
      await page.getByText(/Unbroken history as served/).waitFor();
      await page
        .getByText(/removed by the registrar on/i)
        .first()
        .waitFor();
      expect(await page.content()).not.toContain('Ostrel Lane');
      expect(errors).toEqual([]);
    });
  });
});
