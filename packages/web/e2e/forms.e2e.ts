import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demoAccount, expectNoSideScroll, onPhone, signIn, useJourneys } from './support/journey';

const dealer = demoAccount('dealer');
const registrar = demoAccount('registrar');
const assessor = demoAccount('assessor');
const AXE = readFileSync(createRequire(__filename).resolve('axe-core/axe.min.js'), 'utf8');

const TOGGLES = 'input[type=checkbox], input[type=radio]';

/** Tag → checked, for every checkbox, radio and switch in `scope` tagged by {@link tag}. */
async function states(scope: Locator): Promise<Record<string, boolean>> {
  return scope.evaluate((root, sel) => {
    const out: Record<string, boolean> = {};
    root.querySelectorAll<HTMLInputElement>(sel).forEach((el) => {
      if (el.dataset.labelTest) out[el.dataset.labelTest] = el.checked;
    });
    return out;
  }, TOGGLES);
}

/**
 * Clicks the words of each checkbox, radio and switch in `scope` (its own <label>) and checks
 * that exactly that control changed: a radio also unchecks the one it replaces in its group.
 * Returns how many labels were clicked.
 */
async function clickEveryLabel(page: Page, scope: Locator, where: string): Promise<number> {
  const ids = await scope.evaluate((root, sel) => {
    const all = [...root.ownerDocument.querySelectorAll('[id]')].map((e) => e.id);
    const dupes = all.filter((id, i) => all.indexOf(id) !== i);
    return {
      dupes,
      controls: [...root.querySelectorAll<HTMLInputElement>(sel)].map((el, i) => {
        el.dataset.labelTest = String(i);
        return { tag: String(i), radio: el.type === 'radio', name: el.name };
      }),
    };
  }, TOGGLES);
  expect(ids.dupes, `${where}: ids used twice`).toEqual([]);
  let clicked = 0;
  for (const c of ids.controls) {
    const input = scope.locator(`[data-label-test="${c.tag}"]`);
    if ((await input.count()) === 0 || (await input.isDisabled())) continue;
    if (c.radio && (await input.isChecked())) continue;
    const id = await input.getAttribute('id');
    const own = id ? scope.locator(`label[for="${id}"]`) : null;
    const label = own && (await own.count()) > 0 ? own.first() : input.locator('xpath=ancestor::label[1]');
    // A box named only by aria-label (a table's row choice) has no words beside it to click.
    if ((await label.count()) === 0 && (await input.getAttribute('aria-label'))) continue;
    expect(await label.count(), `${where}: control ${c.tag} (${id}) has no label of its own`).toBe(1);
    if (!(await label.isVisible())) continue;
    const before = await states(scope);
    await label.click();
    await page.waitForTimeout(30);
    const after = await states(scope);
    const changed = Object.keys(before).filter((k) => k in after && before[k] !== after[k]);
    const text = (await label.innerText()).trim();
    if (c.radio) {
      const replaced = ids.controls
        .filter((o) => o.radio && o.name === c.name && before[o.tag])
        .map((o) => o.tag);
      expect(changed.sort(), `${where}: clicking “${text}”`).toEqual([c.tag, ...replaced].sort());
    } else {
      expect(changed, `${where}: clicking “${text}”`).toEqual([c.tag]);
    }
    clicked++;
  }
  return clicked;
}

/** Runs axe-core on the page; serious and critical violations, in short. */
async function axeProblems(page: Page): Promise<string[]> {
  // Evaluated through the browser's debugging protocol, which the page's CSP does not govern.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE);
  const results = await page.evaluate(async () => {
    const r = await (
      window as unknown as {
        axe: {
          run: (
            ctx: Document,
            o: object,
          ) => Promise<{
            violations: Array<{ id: string; impact: string; nodes: Array<{ target: string[] }> }>;
          }>;
        };
      }
    ).axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      targets: v.nodes.map((n) => {
        const p = document.querySelector(n.target.join(' '))?.parentElement;
        return `${n.target.join(' ')} in <${p?.tagName.toLowerCase()} class="${p?.className}" role="${p?.getAttribute('role')}">`;
      }),
    }));
  });
  return results
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.targets.slice(0, 3).join(', ')}`);
}

async function photo(hue: number): Promise<Buffer> {
  return sharp({
    create: { width: 800, height: 600, channels: 3, background: { r: hue, g: 120, b: 255 - hue } },
  })
    .jpeg({ quality: 85 })
    .toBuffer();
}

describe('forms a dealer fills in, in Chromium', () => {
  const journeys = useJourneys();
  const { baseUrl } = journeys;
  let lotUrl = '';

  it('registers a lot with two photos chosen on the form; they upload with progress once the lot exists', async () => {
    const { page } = journeys.start();
    await signIn(page, baseUrl, dealer.email, { fresh: true });
    // A dealer lands on the inventory.
    await page.getByRole('heading', { name: 'Inventory', level: 1 }).waitFor();
    await page.goto(`${baseUrl}/lots/new`);
    await page.getByRole('button', { name: 'Clear the form' }).click();
    // Wrong values first: each message says what to enter, and the page goes to the first one.
    await page.getByRole('textbox', { name: /^Title/ }).fill('Green foiled beads from Orrowmere');
    await page.getByRole('textbox', { name: /largest/ }).fill('99999');
    await page.getByRole('textbox', { name: /^Number of beads/ }).fill('-5');
    await page.getByRole('button', { name: 'Register the lot' }).click();
    await page
      .getByText('Enter a whole number of beads between 1 and 1,000,000 (estimate if need be).')
      .waitFor();
    await page.getByText(/Enter a bead size between 0.5 and 100 mm/).waitFor();
    expect(await page.evaluate(() => document.activeElement?.getAttribute('inputmode'))).toBe('decimal');
    await page.getByRole('textbox', { name: /largest/ }).fill('9');
    await page.getByRole('textbox', { name: /^Number of beads/ }).fill('24');
    await page.getByTestId('choose-photos').setInputFiles([
      { name: 'whole-strand.jpg', mimeType: 'image/jpeg', buffer: await photo(200) },
      { name: 'close-up.jpg', mimeType: 'image/jpeg', buffer: await photo(40) },
    ]);
    await page.getByRole('list', { name: 'Photos to add' }).getByRole('listitem').nth(1).waitFor();
    await page.getByRole('combobox', { name: 'What close-up.jpg shows' }).selectOption('close-up');
    await screenshot(page, 'register-with-photos-1280');
    await page.getByRole('button', { name: 'Register the lot and add its 2 photos' }).click();
    await page.waitForURL(/\/lots\/[0-9A-Z]{9}$/);
    lotUrl = page.url();
    await page.getByRole('heading', { name: 'Green foiled beads from Orrowmere' }).waitFor();
    await page.getByText('added an exhibit').nth(1).waitFor();
    expect(await page.getByText('added an exhibit').count()).toBe(2);
  });

  it('every label toggles its own control on every dealer form', async () => {
    const { page } = journeys.start();
    let total = 0;
    await page.goto(`${baseUrl}/lots/new`);
    total += await clickEveryLabel(page, page.locator('form'), 'register form');

    const dialogs: Array<[string, string]> = [
      ['Describe', 'describe dialog'],
      ['Record observations', 'observations dialog'],
      ['Split', 'split dialog'],
      ['Combine with other lots', 'combine dialog'],
      ['Offer to a dealer', 'offer dialog'],
      ['Record a sale', 'sale dialog'],
      ['Record an opinion', 'opinion form'],
    ];
    for (const [button, where] of dialogs) {
      await page.goto(lotUrl);
      await page.getByRole('button', { name: button, exact: true }).click();
      const dialog = page.getByRole('dialog');
      await dialog.waitFor();
      // Controls that appear after a first choice are clicked too.
      if (where === 'combine dialog') await dialog.locator('input[type=checkbox]').first().check();
      // The correction's own fields show once it is ticked (a lot with no observations yet has none).
      const correction = dialog.getByText(/This corrects an earlier/);
      if ((await correction.count()) > 0) await correction.click();
      total += await clickEveryLabel(page, dialog, where);
    }
    await page.goto(`${baseUrl}/tags`);
    await page.getByRole('table', { name: 'Your lots' }).waitFor();
    total += await clickEveryLabel(page, page.locator('main'), 'tags page');
    expect(total).toBeGreaterThan(30);
  });

  it('axe-core finds no serious or critical problem on dealer, assessor and registrar pages', async () => {
    const { page } = journeys.start();
    const problems: string[] = [];
    const check = async (path: string, ready: () => Promise<unknown>) => {
      await page.goto(`${baseUrl}${path}`);
      await ready();
      await page.waitForTimeout(200);
      for (const p of await axeProblems(page)) problems.push(`${path}: ${p}`);
    };
    const h1 = () => page.getByRole('heading', { level: 1 }).first().waitFor();
    const lotPath = new URL(lotUrl).pathname;
    for (const path of [
      '/lots',
      '/lots/new',
      lotPath,
      '/lots/import',
      '/transfers/incoming',
      '/transfers/outgoing',
      '/transfers/sales',
      '/tags',
      '/account',
      '/account/data',
    ])
      await check(path, h1);
    await signIn(page, baseUrl, assessor.email, { fresh: true });
    for (const path of ['/', '/account', '/account/data']) await check(path, h1);
    await signIn(page, baseUrl, registrar.email, { fresh: true });
    // The registrar lands on the verification queue.
    expect(new URL(page.url()).pathname).toBe('/registry');
    for (const path of [
      '/registry',
      '/registry/reports',
      '/registry/redactions',
      '/registry/record',
      '/registry/audit',
    ])
      await check(path, h1);
    if (problems.length) console.log(problems.join('\n'));
    expect(problems).toEqual([]);
  });

  it('imports lots from a spreadsheet: the dry run names a bad row, nothing is written until it is fixed', async () => {
    const { page } = journeys.start();
    await signIn(page, baseUrl, dealer.email, { fresh: true });
    await page.goto(`${baseUrl}/lots/import`);
    const header = 'Title,Form,Number of beads,Bead size largest (mm),Currency,Cost\n';
    const bad = header + 'Amber strand,strand,40,8,EUR,12.50\nBlue strand,strand,30,99999,EUR,9\n';
    await page.getByLabel('Your filled-in spreadsheet (CSV or XLSX)').setInputFiles({
      name: 'estate.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(bad),
    });
    await page.getByRole('table', { name: 'Column mapping' }).waitFor();
    await page.getByRole('button', { name: 'Check every row' }).click();
    const rows = page.getByRole('table', { name: 'Rows that need attention' });
    await rows
      .getByRole('row')
      .filter({ hasText: 'Bead size largest (mm)' })
      .filter({ hasText: '3' })
      .waitFor();
    expect(await page.getByRole('button', { name: /^Import/ }).count()).toBe(0);
    await screenshot(page, 'import-dry-run-1280');
    await page.getByLabel('Your filled-in spreadsheet (CSV or XLSX)').setInputFiles({
      name: 'estate.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(bad.replace('99999', '9')),
    });
    await page.getByRole('button', { name: 'Check every row' }).click();
    await page.getByText('All 2 rows are ready to import.').waitFor();
    await page.getByRole('button', { name: 'Import 2 lots' }).click();
    await page.getByText('2 lots registered.').waitFor();
    await page.getByRole('link', { name: 'See them in the inventory' }).click();
    await page.getByRole('cell', { name: 'Blue strand' }).first().waitFor();
  });

  it('fits a 390 px phone: the register form with its photo buttons', async () => {
    await onPhone(async (page) => {
      await signIn(page, baseUrl, dealer.email, { fresh: true });
      await page.goto(`${baseUrl}/lots/new`);
      await page.getByRole('button', { name: 'Take a photo' }).waitFor();
      await expectNoSideScroll(page);
      await screenshot(page, 'register-390');
    });
  });
});
