import { parseBundle, type OpinionBody } from '@beadroll/core';
import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import {
  addCloseUp,
  demoHandle,
  openAction,
  PHONE,
  postAsSignedIn,
  signIn,
  strand,
  useJourneys,
} from './support/journey';

const holder = demoHandle('odile-varnas');
const second = demoHandle('teodor-brasko');

describe('opinions in Chromium', () => {
  const journeys = useJourneys();

  it('a second dealer adds an exhibit and records a dissent citing it, with the aid beside the form; the holder sees it on the lot and finds the e-mail', async () => {
    const { page, baseUrl, errors } = journeys.start();

    // The holder registers a listed lot and records an attribution (through the API, as a client would).
    await signIn(page, baseUrl, holder.email, { fresh: true });
    const { code, displayCode } = await postAsSignedIn<{ code: string; displayCode: string }>(
      page,
      '/api/lots',
      {
        description: strand('Rose beads from a house clearance', {
          count: { value: 32, estimated: false },
          colours: ['white', 'pink'],
          baseGlass: ['opaque'],
          decoration: ['roses'],
        }),
        observations: { hole: 'powder', windingMarks: 'seen' },
      },
    );
    await postAsSignedIn(page, `/api/lots/${code}/opinions`, {
      origin: 'venice-murano',
      period: { from: 1880, to: 1920, approximate: true },
      technique: 'wound-lampwork',
      qualifier: 'attributed-to',
      confidence: 'medium',
      rationale: 'Raised roses over white, soft shapes.',
      exhibits: [],
    });

    // A second dealer opens the lot page and first adds evidence of their own: a close-up of a hole.
    await signIn(page, baseUrl, second.email, { fresh: true });
    await page.goto(`${baseUrl}/lots/${code}`);
    await page.getByRole('article', { name: /Holder’s attribution by Odile Varnas/ }).waitFor();
    await addCloseUp(page, 'hole-powder.jpg', 'Grey powder inside the hole', { r: 150, g: 150, b: 160 });

    // Then drafts a dissent citing it; the aid reacts as fields change.
    const dialog = await openAction(page, 'Record an opinion');
    await dialog
      .getByRole('list', { name: 'Indications' })
      .getByText(/release/)
      .first()
      .waitFor();
    await expect(dialog.getByRole('note').textContent()).resolves.toMatch(/aid, not an authentication/);
    await dialog.getByRole('combobox', { name: /^Origin/ }).selectOption('india');
    await dialog.getByRole('textbox', { name: /^From year/ }).fill('1985');
    await dialog.getByRole('textbox', { name: /^To year/ }).fill('2015');
    await dialog.getByRole('combobox', { name: /^Certainty/ }).selectOption('later-copy');
    await dialog
      .getByRole('textbox', { name: /^Rationale/ })
      .fill('Grey powder in the holes: wound on a release-coated mandrel. The roses are heavy and bright.');
    await dialog.getByRole('checkbox', { name: /Grey powder inside the hole/ }).check();
    await screenshot(page, 'opinions-form-1280');
    await dialog.getByRole('button', { name: 'Record opinion' }).click();
    await dialog.waitFor({ state: 'detached' });
    const dissent = page.getByRole('article', { name: /Dissent by Teodor Brasko/ });
    await dissent.waitFor();
    await page.getByText('1 dissent from the holder’s attribution.').waitFor();
    expect(await dissent.textContent()).toContain('cites 1 exhibit');

    // The opinion on the roll names the new exhibit by the SHA-256 of its stored original.
    const served = await page.request.get(`${baseUrl}/api/public/lots/${code}`);
    const entries = parseBundle(((await served.json()) as { bundle: unknown }).bundle).rolls[0]!.entries;
    const kinds = entries.map((e) => JSON.parse(e.header).kind as string);
    const exhibit = JSON.parse(entries[kinds.lastIndexOf('exhibit-added')]!.body!) as {
      exhibit: { original: { sha256: string } };
    };
    const opinion = JSON.parse(entries[kinds.lastIndexOf('opinion')]!.body!) as OpinionBody;
    expect(opinion.exhibits).toEqual([exhibit.exhibit.original.sha256]);

    // The holder sees the dissent beside the attribution on the lot's page, answers it, and has the e-mail.
    await signIn(page, baseUrl, holder.email, { fresh: true });
    await page.goto(`${baseUrl}/lots/${code}`);
    const seen = page.getByRole('article', { name: /Dissent by Teodor Brasko/ });
    await seen.waitFor();
    expect(await seen.textContent()).toContain('India, about 1985–2015');
    await page.getByRole('img', { name: 'Opinions by origin and period' }).waitFor();
    await screenshot(page, 'opinions-panel-1280');
    await seen.getByRole('button', { name: 'Answer' }).click();
    await seen.getByRole('textbox', { name: 'Your answer' }).fill('The holes were reamed by a later owner.');
    await seen.getByRole('button', { name: 'Add answer' }).click();
    await seen.getByText(/^Answer by Odile Varnas/).waitFor();
    expect(await seen.textContent()).toContain('The holes were reamed by a later owner.');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'opinions-panel-390');
    await page.setViewportSize({ width: 1280, height: 900 });

    await page.goto(`${baseUrl}/dev/mailbox`);
    const mail = page
      .getByRole('article', { name: `A dissent on your lot ${displayCode}` })
      .filter({ hasText: holder.email });
    await mail.waitFor();
    expect(await mail.textContent()).toContain('Teodor Brasko');
    expect(errors).toEqual([]);
  });
});
