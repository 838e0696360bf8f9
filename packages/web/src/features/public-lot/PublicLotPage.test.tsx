import * as core from '@beadroll/core';
import { QueryClient } from '@tanstack/react-query';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import {
  ABC_BYTES,
  ASSESSOR,
  CARDS,
  DEALER_A,
  DEALER_B,
  exampleRolls,
  lotWithPhoto,
  responseFor,
} from './lot-fixtures';
import type { PublicLotResponse } from './public-lot.api';
import { PublicLotApp } from './PublicLotPage';

const NOT_FOUND = { error: { code: 'not_found', message: 'Not found.' } };
const json = (body: unknown, status = 200) =>
  new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

let served: Map<string, () => Response>;
let fetchMock: ReturnType<typeof vi.fn>;

beforeEach(() => {
  served = new Map();
  fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const url = String(input);
    const make = served.get(url);
    return make ? make() : json(NOT_FOUND, 404);
  });
  vi.stubGlobal('fetch', fetchMock);
  let n = 0;
  URL.createObjectURL = vi.fn(() => `blob:test/${++n}`);
  URL.revokeObjectURL = vi.fn();
});

function serve(data: PublicLotResponse) {
  served.set(`/api/public/lots/${data.code}`, () => json(data));
}

function open(pathname: string) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(<PublicLotApp pathname={pathname} client={client} />);
}

const status = () => screen.getByRole('status');
const refOf = (data: PublicLotResponse, seq: number) =>
  core.tagReference(data.bundle.rolls[0]!.entries[seq]!.hash);

describe('public lot page: a lot that changed hands', () => {
  const rolls = exampleRolls();
  const lot = responseFor(rolls, 0);

  it('checks the roll in the browser and the tag from the address, sending only the code', async () => {
    serve(lot);
    const h = refOf(lot, 3);
    open(`/L/${lot.code}/${h}`);
    expect(status()).toHaveAttribute('aria-live', 'polite');
    await waitFor(() => expect(status()).toHaveTextContent('Unbroken history as served: 6 entries'));
    expect(status()).toHaveTextContent('This tag matches entry 3; 2 entries added since.');
    expect(screen.getByText('your tag was printed here')).toBeInTheDocument();
    // The data request and the photo's file; the file is not served here, so it is not shown.
    expect(fetchMock.mock.calls.map(([url]) => String(url))).toEqual([
      `/api/public/lots/${lot.code}`,
      `/api/public/lots/${lot.code}/exhibits/2/web`,
    ]);
    for (const [url] of fetchMock.mock.calls) expect(String(url)).not.toContain(h);
    expect(screen.getByRole('heading', { level: 1 })).toHaveTextContent(
      'Blue and white wound beads, old strand',
    );
  });

  it('tells the transfer with both dealers’ names and never a price', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    await screen.findByText(/Unbroken history/);
    expect(
      screen.getByText('Ines Varro (Varro Old Glass) offered the lot to Osric Pell (Pell & Daughter Beads).'),
    ).toBeInTheDocument();
    expect(
      screen.getByText(
        'Passed from Ines Varro (Varro Old Glass) to Osric Pell (Pell & Daughter Beads), who accepted the transfer.',
      ),
    ).toBeInTheDocument();
    const text = document.body.textContent ?? '';
    // The sealed transfer price (9000 EUR minor units) and acquisition facts never reach the page.
    for (const secret of ['9000', '90.00', '90,00', 'EUR', '€', 'house clearance', '4500'])
      expect(text).not.toContain(secret);
    expect(
      screen.getAllByText('Private details were sealed with this entry; they are not public.').length,
    ).toBe(2);
  });

  it('shows the holder as the registry reports them', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    const holder = await screen.findByRole('region', { name: 'Held by' });
    expect(within(holder).getByText('Osric Pell')).toBeInTheDocument();
    expect(within(holder).getByText(/^Verified by the registry since/)).toBeInTheDocument();
    expect(
      within(holder).getByText('Reported by the registry; not part of the checked history.'),
    ).toBeInTheDocument();
  });

  it('gives strand lengths in millimetres and inches', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959; NIST SP 811 B.8):
    // 406.4 mm is 16 in.
    expect(await screen.findByText('406.4 mm (16 in)')).toBeInTheDocument();
    expect(screen.getByText('7–9.5 mm')).toBeInTheDocument();
  });

  it('links to the bundle and gives the command to verify it offline', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    const link = await screen.findByRole('link', {
      name: `Download the history of lot ${core.formatLotCode(lot.code)}`,
    });
    expect(link).toHaveAttribute('href', `/api/public/lots/${lot.code}/bundle`);
    expect(screen.getByRole('link', { name: 'Beadroll’s checking page' })).toHaveAttribute('href', '/verify');
    expect(screen.getByRole('link', { name: 'Keep a copy of the checking page' })).toHaveAttribute(
      'href',
      '/verify/download',
    );
    expect(document.body.textContent).not.toMatch(/\bnpm\b|\bnpx\b/);
  });

  it('says a tag whose entry is not in the roll no longer matches', async () => {
    serve(lot);
    // The worked example's tag reference belongs to another lot's entry (ledger format §12).
    open(`/L/${lot.code}/AVV5EN5TQ3`);
    await waitFor(() => expect(status()).toHaveTextContent('Unbroken history as served: 6 entries'));
    expect(status()).toHaveTextContent(
      'Warning: this history no longer contains the entry this tag was printed from.',
    );
    expect(screen.queryByText('your tag was printed here')).not.toBeInTheDocument();
  });

  it('checks a code typed from the tag when the address has none', async () => {
    serve(lot);
    const user = userEvent.setup();
    open(`/l/${lot.code}`);
    await screen.findByText(/Unbroken history/);
    const box = screen.getByLabelText('Check the code printed on the tag');
    await user.type(box, 'nonsense');
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(box).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByText(/Type the code printed on the tag/)).toBeInTheDocument();
    const h = refOf(lot, 4);
    await user.clear(box);
    // Typed as printed, lower case: read case-insensitively (ledger format §4).
    await user.type(box, `entry 4 · ${h.slice(0, 5).toLowerCase()}-${h.slice(5).toLowerCase()}`);
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(status()).toHaveTextContent('The code you typed matches entry 4; 1 entry added since.');
    expect(box).not.toHaveAttribute('aria-invalid');
    // The code as printed now, with its check symbol (ledger format §4), spaces instead of dashes.
    await user.clear(box);
    await user.type(box, core.printedTagCode(h).replace(/-/g, ' '));
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(status()).toHaveTextContent('The code you typed matches entry 4; 1 entry added since.');
    // One symbol off: a typing error, not a rewritten history.
    const off = `${h.slice(0, 9)}${h[9] === '0' ? '1' : '0'}`;
    await user.clear(box);
    await user.type(box, off);
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(status()).toHaveTextContent('This code has a typing error; compare it with the tag again.');
    // The right code at the wrong entry number is a typing error too.
    await user.clear(box);
    await user.type(box, `entry 2 · ${h}`);
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(status()).toHaveTextContent('This code has a typing error');
    // A well-formed code, check symbol and all, that names no entry: the history changed.
    const stranger = core.tagReference('00'.repeat(32));
    await user.clear(box);
    await user.type(box, core.printedTagCode(stranger));
    await user.click(screen.getByRole('button', { name: 'Check tag' }));
    expect(status()).toHaveTextContent('Warning: this history no longer contains the entry that code names.');
  });
});

describe('public lot page: opinions, dissent and a removed body', () => {
  const rolls = exampleRolls();
  const lot = responseFor(rolls, 1);

  it('shows the holder’s attribution, the dissent with its author, and the chart', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    await screen.findByText(/Unbroken history as served: 7 entries/);
    // The first thing on the page: the attribution on record and the counts, each a link.
    const onRecord = screen.getByRole('region', { name: 'Attribution on record' });
    expect(within(onRecord).getByRole('link', { name: '1 dissent' })).toHaveAttribute(
      'href',
      '#pl-op-dissent',
    );
    expect(within(onRecord).getByRole('link', { name: '0 opinions agree' })).toHaveAttribute(
      'href',
      '#pl-op-agree',
    );
    expect(onRecord).toHaveTextContent(`Attributed by the holder, ${nameOf(DEALER_B)}`);
    const attribution = screen.getByRole('article', { name: `Attribution on record by ${nameOf(DEALER_B)}` });
    expect(within(attribution).getByText('Venice / Murano, about 1880–1920')).toBeInTheDocument();
    // The assessor's role shows on their opinion.
    const dissent = screen.getByRole('article', {
      name: `Dissent by ${nameOf(ASSESSOR)}, independent assessor`,
    });
    expect(within(dissent).getByText('Bohemia / Czech lands, 1950–1980')).toBeInTheDocument();
    expect(
      within(dissent).getByText(/a later copy · pressed or moulded · high confidence · cites 1 exhibit/),
    ).toBeInTheDocument();
    const chart = screen.getByRole('img', { name: /Opinions by origin and period/ });
    expect(chart).toHaveAccessibleDescription(
      '2 opinions: 1 for Venice / Murano, 1 for Bohemia / Czech lands; years 1880 to 1980.',
    );
    expect(chart.querySelectorAll('.pl-bar-dissent').length).toBe(1);
    expect(chart.querySelectorAll('.pl-bar-attribution').length).toBe(1);
    // The holder asked the assessor on the roll; the evidence and opinion say they answer it.
    expect(
      screen.getByText(`Opinion asked of an assessor, ${nameOf(ASSESSOR)}, by ${nameOf(DEALER_B)}.`),
    ).toBeInTheDocument();
    expect(screen.getByText(/in answer to the request of entry 2\./)).toBeInTheDocument();
  });

  it('says when the registrar removed an entry and shows nothing of it', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    await screen.findByText(/Unbroken history/);
    const when = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' }).format(
      new Date('2025-03-08T10:00:00.000Z'),
    );
    expect(
      screen.getByText(`Removed by the registrar on ${when}, reason: personal data.`),
    ).toBeInTheDocument();
    expect(document.body.textContent).not.toContain('private number');
  });
});

describe('public lot page: splits', () => {
  const rolls = exampleRolls();

  it('links a split child to its parent and checks the link both ways', async () => {
    const child = responseFor(rolls, 3, 2);
    serve(child);
    open(`/l/${child.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('Unbroken history as served: 1 entry'));
    expect(status()).toHaveTextContent('with 2 linked entries of the lots it came from');
    const tree = screen.getByRole('region', { name: 'Where the beads came from and went' });
    const parent = within(tree).getByRole('link', { name: core.formatLotCode(rolls[2]!.lot) });
    expect(parent).toHaveAttribute('href', `/l/${rolls[2]!.lot}`);
    expect(within(tree).getByText('split at its entry 1')).toBeInTheDocument();
  });

  it('lists the lots a parent was split into', async () => {
    const parent = responseFor(rolls, 2);
    serve(parent);
    open(`/l/${parent.code}`);
    await screen.findByText(/Unbroken history as served: 2 entries/);
    expect(screen.getByText('Ines Varro (Varro Old Glass) split the lot into 3 lots.')).toBeInTheDocument();
    for (const i of [3, 4, 5]) {
      const code = core.formatLotCode(rolls[i]!.lot);
      expect(
        screen.getByRole('link', { name: `lot ${code} (20 beads): its public history` }),
      ).toHaveAttribute('href', `/l/${rolls[i]!.lot}`);
    }
    expect(screen.getByText('split into other lots', { exact: false })).toBeInTheDocument();
  });

  it('breaks when a parent in the bundle does not name the child back', async () => {
    const child = responseFor(rolls, 3, 2);
    // A parent roll that stops before its split entry: the child's link has nothing to point to.
    child.bundle.rolls[1]!.entries.pop();
    serve(child);
    open(`/l/${child.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('History broken at entry 0 of 1'));
    expect(status()).toHaveTextContent('bad-parent');
  });
});

describe('public lot page: a history that has been changed', () => {
  const rolls = exampleRolls();

  it('names the entry where a changed body breaks the chain, and why', async () => {
    const lot = responseFor(rolls, 0);
    const e = lot.bundle.rolls[0]!.entries[3]!;
    e.body = e.body!.replace('Irregular wound shapes', 'Regular wound shapes');
    serve(lot);
    open(`/L/${lot.code}/${refOf(lot, 1)}`);
    await waitFor(() => expect(status()).toHaveTextContent(/History broken at entry 3 of 6 \(opinion, .+\)/));
    expect(status()).toHaveTextContent('its contents do not match the fingerprint recorded in its header');
    expect(status()).toHaveTextContent('bad-body-digest');
    expect(status()).not.toHaveTextContent('Unbroken');
    expect(status()).toHaveTextContent(
      'This tag matches entry 1; 1 entry added since, but the history after it does not check out.',
    );
    expect(screen.getByRole('heading', { name: 'The 3 entries before the break' })).toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Attribution and opinions' })).not.toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Held by' })).not.toBeInTheDocument();
  });

  it('names a header changed without its hash', async () => {
    const lot = responseFor(rolls, 0);
    const e = lot.bundle.rolls[0]!.entries[5]!;
    e.header = e.header.replace(DEALER_B, 'acct-ffffff');
    serve(lot);
    open(`/l/${lot.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('History broken at entry 5 of 6'));
    expect(status()).toHaveTextContent('its header does not match its fingerprint');
  });

  it('names a missing entry', async () => {
    const lot = responseFor(rolls, 0);
    lot.bundle.rolls[0]!.entries.splice(2, 1);
    serve(lot);
    open(`/l/${lot.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('History broken at entry 2 of 5'));
    expect(status()).toHaveTextContent('bad-seq');
  });

  it('refuses data that is not this lot’s roll', async () => {
    const other = responseFor(rolls, 1);
    served.set(`/api/public/lots/${rolls[0]!.lot}`, () => json({ ...other, code: rolls[0]!.lot }));
    open(`/l/${rolls[0]!.lot}`);
    await waitFor(() =>
      expect(status()).toHaveTextContent('The data served is not a readable history of this lot.'),
    );
  });
});

describe('public lot page: evidence photos', () => {
  it('shows a photo only once its bytes match the SHA-256 on the roll', async () => {
    const lot = lotWithPhoto();
    serve(lot);
    served.set(`/api/public/lots/${lot.code}/exhibits/1/web`, () => new Response(ABC_BYTES));
    open(`/l/${lot.code}`);
    const img = await screen.findByRole('img', { name: 'Six beads on a grey card' });
    expect(img.getAttribute('src')).toMatch(/^blob:/);
    expect(screen.getByText('image checked')).toBeInTheDocument();
  });

  it('refuses a photo whose bytes were swapped', async () => {
    const lot = lotWithPhoto();
    serve(lot);
    served.set(
      `/api/public/lots/${lot.code}/exhibits/1/web`,
      () => new Response(new TextEncoder().encode('abd')),
    );
    open(`/l/${lot.code}`);
    expect(
      await screen.findByText(
        'This image does not match the fingerprint recorded on the roll, so it is not shown.',
      ),
    ).toBeInTheDocument();
    expect(screen.queryByRole('img', { name: 'Six beads on a grey card' })).not.toBeInTheDocument();
    expect(URL.createObjectURL).not.toHaveBeenCalled();
  });

  it('says so when the file is not served', async () => {
    const lot = lotWithPhoto();
    serve(lot);
    open(`/l/${lot.code}`);
    expect(await screen.findByText('The image file is not available from the server.')).toBeInTheDocument();
  });
});

describe('public lot page: not found', () => {
  it('shows the same page for an unknown code and a malformed one', async () => {
    const rolls = exampleRolls();
    const unknown = open(`/l/${rolls[0]!.lot}`);
    expect(
      await screen.findByRole('heading', { name: 'No public history at this address' }),
    ).toBeInTheDocument();
    const first = document.querySelector('main')!.innerHTML;
    unknown.unmount();
    open('/l/NOT-A-CODE');
    expect(
      await screen.findByRole('heading', { name: 'No public history at this address' }),
    ).toBeInTheDocument();
    expect(document.querySelector('main')!.innerHTML).toBe(first);
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});

function nameOf(id: string): string {
  const c = CARDS[id]!;
  return `${c.displayName} (${c.business})`;
}
void DEALER_A;

describe('public lot page: an old (format version 1) roll whose removed body held a rule fact', () => {
  it('says the history is unbroken but not fully checkable after a removal', async () => {
    // The version-1 example bundle as the version-1 writer made it: its second lot has a note
    // whose body the registrar removed, so the note's reference can no longer be checked.
    const frozen = (await import('../../../../core/test/fixtures/bundle-v1.json')).default as core.Bundle;
    const data: PublicLotResponse = {
      code: frozen.rolls[1]!.lot,
      bundle: core.createBundle([structuredClone(frozen.rolls[1]!)]),
      cards: CARDS,
    };
    serve(data);
    open(`/L/${data.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('not fully checkable after a removal'));
    expect(status()).not.toHaveTextContent('History broken');
  });
});

describe('public lot page: the copy kept for no signal', () => {
  const rolls = exampleRolls();
  const lot = responseFor(rolls, 0);
  // What the page's service worker gives with no signal: the kept answer, with the server's
  // Date (RFC 9110 §6.6.1) and the worker's mark.
  const saved = (body: unknown) =>
    new Response(JSON.stringify(body), {
      status: 200,
      headers: {
        'content-type': 'application/json',
        date: 'Sat, 05 Dec 2026 13:32:00 GMT',
        'beadroll-saved-copy': 'true',
      },
    });

  it('checks the kept copy again and marks it offline with the time it was verified', async () => {
    served.set(`/api/public/lots/${lot.code}`, () => saved(lot));
    open(`/l/${lot.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('Unbroken history as served: 6 entries'));
    const when = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' }).format(
      new Date('2026-12-05T13:32:00Z'),
    );
    expect(status()).toHaveTextContent(`offline: as verified at ${when}`);
    expect(
      screen.getByText('The registry’s public log is checked when there is a signal.'),
    ).toBeInTheDocument();
    // Only the lot's data (and the photo) were asked for: no log check with no signal.
    expect(fetchMock.mock.calls.map(([url]) => String(url))).not.toContain('/api/log/key');
  });

  it('says when the kept copy no longer verifies', async () => {
    const changed = structuredClone(lot);
    const entry = changed.bundle.rolls[0]!.entries[1] as unknown as { hash: string };
    entry.hash = `${entry.hash.slice(0, -1)}${entry.hash.endsWith('0') ? '1' : '0'}`;
    served.set(`/api/public/lots/${lot.code}`, () => saved(changed));
    open(`/l/${lot.code}`);
    await waitFor(() =>
      expect(status()).toHaveTextContent(/offline: the copy kept at .* no longer verifies/),
    );
    expect(status()).not.toHaveTextContent('Unbroken history');
  });

  it('shows no offline mark on an answer from the server itself', async () => {
    serve(lot);
    open(`/l/${lot.code}`);
    await waitFor(() => expect(status()).toHaveTextContent('Unbroken history as served: 6 entries'));
    expect(status()).not.toHaveTextContent('offline');
  });
});
