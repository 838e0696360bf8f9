import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demoHandle, PHONE, postAsSignedIn, signIn, strand, useJourneys } from './support/journey';

const ines = demoHandle('ines-calloway-rue');

describe('splitting a strand in Chromium', () => {
  const journeys = useJourneys();

  it('splits a strand into two and shows the ancestry on a new lot’s dealer and public pages', async () => {
    const { page, baseUrl, errors } = journeys.start();
    await signIn(page, baseUrl, ines.email);

    // A fresh strand to split, registered through the API as the signed-in dealer.
    const { code } = await postAsSignedIn<{ code: string }>(page, '/api/lots', {
      description: strand('Green striped wound beads', {
        count: { value: 40, estimated: false },
        colours: ['green', 'yellow'],
        baseGlass: ['opaque'],
        decoration: ['trailing'],
      }),
    });

    await page.goto(`${baseUrl}/lots/${code}`);
    await page.getByRole('button', { name: 'Split', exact: true }).click();
    const dialog = page.getByRole('dialog', { name: /Split lot/ });
    const counts = dialog.getByRole('spinbutton', { name: 'Beads' });
    await counts.nth(0).fill('25');
    await counts.nth(1).fill('20');
    await dialog.getByText('The new lots hold 45 beads; the lot has 40.').waitFor();
    await counts.nth(1).fill('10');
    await dialog.getByText('5 beads stay with this lot.').waitFor();
    await screenshot(page, 'lineage-split-dialog-1280');
    await dialog.getByRole('button', { name: 'Split', exact: true }).click();
    const done = dialog.getByText(/^Split into /);
    await done.waitFor();
    const childDisplay = /Split into ([0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z])/.exec(
      (await done.textContent()) ?? '',
    )![1]!;
    await dialog.getByRole('button', { name: 'Close' }).click();

    // The new lot's page shows where its beads came from, the parent box linking to its page.
    await page.goto(`${baseUrl}/lots/${childDisplay.replace(/-/g, '')}`);
    const diagram = page.getByRole('group', { name: /Where the beads of lot/ });
    await diagram.waitFor();
    const parentLink = diagram.getByRole('link', { name: /Green striped wound beads/ });
    expect(await parentLink.getAttribute('href')).toBe(`/lots/${code}`);
    await screenshot(page, 'lineage-child-1280');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'lineage-child-390');
    await page.setViewportSize({ width: 1280, height: 900 });

    // The new lot's public page draws its ancestry from the verified bundle, the parent linked.
    const childCode = childDisplay.replace(/-/g, '');
    await page.goto(`${baseUrl}/l/${childCode}`);
    const tree = page.getByRole('region', { name: 'Where the beads came from and went' });
    await tree.waitFor();
    const parentDisplay = `${code.slice(0, 4)}-${code.slice(4, 8)}-${code.slice(8)}`;
    expect(await tree.getByRole('link', { name: parentDisplay }).getAttribute('href')).toBe(`/l/${code}`);
    await screenshot(page, 'lineage-child-public-1280');

    // The public data of the new lot carries the parent's roll, and it verifies.
    const pub = await page.evaluate(
      async (c) => {
        const res = await fetch(`/api/public/lots/${c}`);
        return (await res.json()) as { bundle: { rolls: Array<{ lot: string; scope: string }> } };
      },
      childDisplay.replace(/-/g, ''),
    );
    expect(pub.bundle.rolls.map((r) => [r.lot, r.scope])).toEqual([
      [childDisplay.replace(/-/g, ''), 'full'],
      [code, 'full'],
    ]);
    expect(errors).toEqual([]);
  });
});
