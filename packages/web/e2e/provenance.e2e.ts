import { printedTagCode, tagReference } from '@beadroll/core';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot } from './support/browser';
import { demo, demoHandle, PHONE, superuser, useJourneys } from './support/journey';

const email = (handle: string) => demoHandle(handle).email;

/** A signed-in API client for one demo account, through the same routes the dealer screens use. */
async function client(baseUrl: string, handle: string) {
  const headers: Record<string, string> = { 'content-type': 'application/json', 'x-beadroll-request': '1' };
  const res = await fetch(`${baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email: email(handle), password: demo.password }),
  });
  expect(res.status).toBe(200);
  const id = ((await res.json()) as { account: { id: string } }).account.id;
  headers.cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const send = async <T>(method: string, path: string, body: unknown): Promise<T> => {
    const r = await fetch(`${baseUrl}${path}`, { method, headers, body: JSON.stringify(body) });
    expect(r.ok, `${method} ${path}: ${r.status} ${await r.clone().text()}`).toBe(true);
    return (await r.json()) as T;
  };
  return {
    id,
    post: <T>(path: string, body: unknown) => send<T>('POST', path, body),
    put: <T>(path: string, body: unknown) => send<T>('PUT', path, body),
  };
}

type Client = Awaited<ReturnType<typeof client>>;

const description = (title: string, count: number, listed = true) => ({
  title,
  form: 'strand',
  count: { value: count, estimated: false },
  colours: ['blue', 'white'],
  baseGlass: ['opaque'],
  decoration: [],
  listed,
});

/** Records `by`'s attribution of `lot`: wound lampwork from `origin`, about `from` to `to`. */
const recordOpinion = (
  by: Client,
  lot: string,
  [origin, from, to]: [string, number, number],
  rationale: string,
) =>
  by.post(`/api/lots/${lot}/opinions`, {
    origin,
    period: { from, to, approximate: true },
    technique: 'wound-lampwork',
    qualifier: 'attributed-to',
    confidence: 'medium',
    rationale,
    exhibits: [],
  });

/** The attribution on record at the top of the public page, and how much of it a phone shows at once. */
async function firstScreen(page: Page, url: string) {
  await page.setViewportSize(PHONE);
  await page.goto(url);
  const record = page.getByRole('region', { name: 'Attribution on record' });
  await record.waitFor();
  await page.getByText(/Unbroken history as served/).waitFor();
  return record;
}

/** True when the element lies wholly inside the first screen of the page, unscrolled. */
async function inFirstScreen(page: Page, locator: ReturnType<Page['locator']>): Promise<boolean> {
  const box = await locator.boundingBox();
  const scrolled = await page.evaluate(() => window.scrollY);
  return box !== null && scrolled === 0 && box.y >= 0 && box.y + box.height <= PHONE.height;
}

describe('provenance travels with the beads, at 390 px in Chromium', () => {
  const journeys = useJourneys(PHONE);
  const { baseUrl } = journeys;

  it('an assessor’s dissent on a parent strand shows on the first screen of a strand split from it', async () => {
    const { page, errors } = journeys.start();
    const ines = await client(baseUrl, 'ines-calloway-rue');
    const halvard = await client(baseUrl, 'halvard-nimmo');
    const { code: parent } = await ines.post<{ code: string }>('/api/lots', {
      description: description('Blue eye beads for splitting', 30),
    });
    await recordOpinion(ines, parent, ['venice-murano', 1860, 1900], 'Soft shapes and winding marks.');
    await recordOpinion(
      halvard,
      parent,
      ['bohemia-czech', 1920, 1938],
      'Even eyes and bright glass: later work in the older style.',
    );
    const split = await ines.post<{ children: Array<{ code: string }> }>(`/api/lots/${parent}/splits`, {
      children: [
        { description: description('Blue eye beads, first half', 15) },
        { description: description('Blue eye beads, second half', 15) },
      ],
    });
    const child = split.children[0]!.code;

    const record = await firstScreen(page, `${baseUrl}/l/${child}`);
    await expect.poll(() => record.textContent()).toContain('Venice / Murano');
    const dissent = record.getByRole('link', { name: '1 dissent' });
    expect(await dissent.getAttribute('href')).toBe('#pl-op-dissent');
    expect(await inFirstScreen(page, dissent)).toBe(true);
    // The verification badge sits below it and does not push it down.
    const badge = page.getByText(/Unbroken history as served/);
    expect((await badge.boundingBox())!.y).toBeGreaterThan((await dissent.boundingBox())!.y);
    await screenshot(page, 'provenance-split-child-390');
    // Following the link shows the dissent with the assessor's role and where it was recorded.
    await dissent.click();
    const card = page.getByRole('article', { name: /^Dissent by Halvard Nimmo.*independent assessor/ });
    await card.waitFor();
    expect(await card.textContent()).toMatch(/before it was split on/);
    expect(errors).toEqual([]);
  });

  it('a piece combined from two lots shows the dissent of a part that was made private first', async () => {
    const { page } = journeys.start();
    const wren = await client(baseUrl, 'wren-ashdown');
    const halvard = await client(baseUrl, 'halvard-nimmo');
    const { code: a } = await wren.post<{ code: string }>('/api/lots', {
      description: description('Red white-hearts for a necklace', 20),
    });
    const { code: b } = await wren.post<{ code: string }>('/api/lots', {
      description: description('Brown spacers for a necklace', 10),
    });
    await recordOpinion(wren, a, ['venice-murano', 1870, 1910], 'White cores, worn ends.');
    await recordOpinion(halvard, a, ['india', 1950, 1990], 'The white core is too even for the older beads.');
    // Keeping the part unlisted must not leave the dissent behind.
    await wren.put(`/api/lots/${a}/listing`, { listed: false });
    const made = await wren.post<{ lot: { code: string } }>('/api/combinations', {
      parts: [{ lot: a }, { lot: b }],
      description: { ...description('Necklace of white-hearts and spacers', 30), form: 'necklace' },
    });
    const piece = made.lot.code;

    const record = await firstScreen(page, `${baseUrl}/l/${piece}`);
    const dissent = record.getByRole('link', { name: '1 dissent' });
    expect(await inFirstScreen(page, dissent)).toBe(true);
    await screenshot(page, 'provenance-combined-piece-390');
    await dissent.click();
    const card = page.getByRole('article', { name: /^Dissent by Halvard Nimmo/ });
    await card.waitFor();
    expect(await card.textContent()).toMatch(/before it was combined into another lot/);
    // The private part's other entries stay private: its title is nowhere on the page.
    expect(await page.getByText('Red white-hearts for a necklace').count()).toBe(0);
  });

  it('after a transfer the new holder sees the attribution on record and adopts it in one step', async () => {
    const { page } = journeys.start();
    const odile = await client(baseUrl, 'odile-varnas');
    const teodor = await client(baseUrl, 'teodor-brasko');
    const { code } = await odile.post<{ code: string }>('/api/lots', {
      description: description('Black beads with forget-me-nots, for a transfer', 25),
    });
    await recordOpinion(
      odile,
      code,
      ['venice-murano', 1880, 1920],
      'Raised forget-me-nots on black, soft shapes.',
    );
    const offer = await odile.post<{ offer: { id: string } }>('/api/transfers/offers', {
      lot: code,
      recipient: teodor.id,
    });
    // The public page names the verified dealer the open offer is made to.
    await page.setViewportSize(PHONE);
    await page.goto(`${baseUrl}/l/${code}`);
    await page.getByText(/offered the lot to Teodor Brasko/).waitFor();
    await teodor.post(`/api/transfers/offers/${offer.offer.id}/accept`, {});

    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('textbox', { name: 'E-mail address' }).fill(email('teodor-brasko'));
    await page.getByLabel('Password').fill(demo.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    // Signing in lands each role on its own start page, away from the sign-in form.
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await page.goto(`${baseUrl}/lots/${code}`);
    const panel = page.getByRole('region', { name: 'Attribution on record' });
    await panel.getByText(/Attributed by the previous holder, Odile Varnas/).waitFor();
    await screenshot(page, 'provenance-new-holder-390');
    await panel.getByRole('button', { name: 'Adopt this attribution' }).click();
    await panel.getByText(/Your attribution, adopting the attribution on this lot/).waitFor();
    await screenshot(page, 'provenance-adopted-390');

    // The public page now states the new holder's attribution, which cites the earlier one.
    const record = await firstScreen(page, `${baseUrl}/l/${code}`);
    await expect.poll(() => record.textContent()).toMatch(/Attributed by the holder, Teodor Brasko/);
    expect(await record.textContent()).toMatch(
      /adopting the attribution of the previous holder, Odile Varnas/,
    );
  });

  it('a tag code typed with one wrong symbol is a typing error, not a rewritten history', async () => {
    const { page } = journeys.start();
    const ines = await client(baseUrl, 'ines-calloway-rue');
    const { code } = await ines.post<{ code: string }>('/api/lots', {
      description: description('Strand for a tag check', 12),
    });
    const roll = await (await fetch(`${baseUrl}/api/public/lots/${code}`)).json();
    const hash = (roll as { bundle: { rolls: Array<{ entries: Array<{ hash: string }> }> } }).bundle.rolls[0]!
      .entries[0]!.hash;
    const printed = printedTagCode(tagReference(hash));
    const wrong = `${printed.slice(0, 3)}${printed[3] === '7' ? '8' : '7'}${printed.slice(4)}`;
    await firstScreen(page, `${baseUrl}/l/${code}`);
    const box = page.getByLabel('Check the code printed on the tag');
    await box.fill(wrong.toLowerCase());
    await page.getByRole('button', { name: 'Check tag' }).click();
    await page.getByText('This code has a typing error; compare it with the tag again.').waitFor();
    expect(await page.getByText(/may have been rewritten/).count()).toBe(0);
    await screenshot(page, 'provenance-typing-error-390');
    await box.fill(`entry 0 ${printed.replace(/-/g, ' ').toLowerCase()}`);
    await page.getByRole('button', { name: 'Check tag' }).click();
    await page.getByText('The code you typed matches entry 0; no entries added since.').waitFor();
  });

  it('a roll changed in PostgreSQL no longer holds the tag’s entry: the page warns of a rewritten history', async () => {
    const { page } = journeys.start();
    const ines = await client(baseUrl, 'ines-calloway-rue');
    const { code } = await ines.post<{ code: string }>('/api/lots', {
      description: description('Strand whose history is cut', 12),
    });
    await ines.post(`/api/lots/${code}/observations`, {
      observations: { hole: 'clean', note: 'Tagged here.' },
    });
    const roll = (await (await fetch(`${baseUrl}/api/public/lots/${code}`)).json()) as {
      bundle: { rolls: Array<{ entries: Array<{ hash: string }> }> };
    };
    const tagged = roll.bundle.rolls[0]!.entries[1]!.hash;
    // Someone with the database's keys removes the newest entry, the one the tag was printed at.
    const db = superuser();
    await db.connect();
    const where = `"entry_id" IN (SELECT e."id" FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id"
                    WHERE l."code" = $1 AND e."seq" = 1)`;
    // The removed rows, put back afterwards: the journeys share one database, and the public log
    // must not keep a hole where this entry was numbered (no checkpoint could cover it).
    const { rows: kept } = await db.query<{ entry: unknown; body: unknown }>(
      `SELECT row_to_json(e) AS "entry", (SELECT row_to_json(b) FROM "entry_bodies" b WHERE ${where}) AS "body"
         FROM "entries" e JOIN "lots" l ON l."id" = e."lot_id" WHERE l."code" = $1 AND e."seq" = 1`,
      [code],
    );
    try {
      await db.query('BEGIN');
      await db.query("SET LOCAL session_replication_role = 'replica'");
      await db.query(`DELETE FROM "entry_bodies" WHERE ${where}`, [code]);
      const r = await db.query(
        `DELETE FROM "entries" e USING "lots" l WHERE l."id" = e."lot_id" AND l."code" = $1 AND e."seq" = 1`,
        [code],
      );
      expect(r.rowCount).toBe(1);
      await db.query('COMMIT');
      await page.setViewportSize(PHONE);
      await page.goto(`${baseUrl}/L/${code}/${tagReference(tagged)}`);
      await page.getByText(/this history no longer contains the entry this tag was printed from/).waitFor();
      expect(await page.getByText(/The history may have been rewritten/).count()).toBe(1);
      expect(await page.getByText(/typing error/).count()).toBe(0);
      await screenshot(page, 'provenance-rewritten-390');
    } finally {
      await db.query('ROLLBACK').catch(() => undefined);
      await db.query('BEGIN');
      await db.query("SET LOCAL session_replication_role = 'replica'");
      await db.query(
        `INSERT INTO "entries" OVERRIDING SYSTEM VALUE SELECT * FROM json_populate_record(NULL::"entries", $1)
          ON CONFLICT DO NOTHING`,
        [kept[0]!.entry],
      );
      if (kept[0]!.body)
        await db.query(
          `INSERT INTO "entry_bodies" OVERRIDING SYSTEM VALUE
             SELECT * FROM json_populate_record(NULL::"entry_bodies", $1) ON CONFLICT DO NOTHING`,
          [kept[0]!.body],
        );
      await db.query('COMMIT');
      await db.end();
    }
  });
});
