import { QueryClient } from '@tanstack/react-query';
import { render, screen, waitFor } from '@testing-library/react';
import { renderToString } from 'react-dom/server';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { checkLot } from './check-lot';
import { embeddedLot, LOT_DATA_ELEMENT } from './embedded';
import { firstCheck } from './first-check';
import { writeHistoryLine } from './history-words';
import { exampleRolls, responseFor } from './lot-fixtures';
import { PublicLotApp } from './PublicLotPage';

// The page as the server sends a listed lot: its data in a JSON block and its history rendered,
// the verdict left to the browser's own check.

const rolls = exampleRolls();

let fetchMock: ReturnType<typeof vi.fn>;
beforeEach(() => {
  fetchMock = vi.fn(async () => new Response('{}', { status: 404 }));
  vi.stubGlobal('fetch', fetchMock);
  URL.createObjectURL = vi.fn(() => 'blob:test/1');
  URL.revokeObjectURL = vi.fn();
});

/** A document holding `text` in the data block, as the server writes it. */
function pageWith(text: string): Document {
  const doc = document.implementation.createHTMLDocument('lot');
  const block = doc.createElement('script');
  block.type = 'application/json';
  block.id = LOT_DATA_ELEMENT;
  block.textContent = text;
  doc.body.append(block);
  return doc;
}

describe('the lot data sent with the page', () => {
  it('is read for the lot the address names, with `<` written as \\u003c as the server writes it', () => {
    const lot = responseFor(rolls, 0);
    const text = JSON.stringify(lot).replace(/</g, '\\u003c');
    const read = embeddedLot(lot.code, pageWith(text));
    expect(read).toEqual(lot);
  });

  it('is ignored when it names another lot, is not JSON or is missing', () => {
    const lot = responseFor(rolls, 0);
    expect(embeddedLot(rolls[1]!.lot, pageWith(JSON.stringify(lot)))).toBeNull();
    expect(embeddedLot(lot.code, pageWith('{"code":'))).toBeNull();
    expect(embeddedLot(lot.code, pageWith('null'))).toBeNull();
    expect(embeddedLot(lot.code, document.implementation.createHTMLDocument('empty'))).toBeNull();
  });

  it('is checked and shown without asking the server again', async () => {
    const lot = responseFor(rolls, 0);
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<PublicLotApp pathname={`/l/${lot.code}`} client={client} data={lot} />);
    await waitFor(() =>
      expect(screen.getByRole('status')).toHaveTextContent('Unbroken history as served: 6 entries'),
    );
    expect(fetchMock.mock.calls.map(([url]) => String(url))).not.toContain(`/api/public/lots/${lot.code}`);
  });

  it('is checked like fetched data: a changed body is caught', async () => {
    const lot = responseFor(rolls, 0);
    const e = lot.bundle.rolls[0]!.entries[3]!;
    e.body = e.body!.replace('Irregular wound shapes', 'Regular wound shapes');
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<PublicLotApp pathname={`/l/${lot.code}`} client={client} data={lot} />);
    await waitFor(() =>
      expect(screen.getByRole('status')).toHaveTextContent('History broken at entry 3 of 6'),
    );
    expect(screen.getByRole('status')).not.toHaveTextContent('Unbroken');
  });
});

describe('the server’s rendering of the page', () => {
  it('shows the history as served but gives no verdict: that is the browser’s', () => {
    const lot = responseFor(rolls, 0);
    const html = renderToString(
      <PublicLotApp pathname={`/l/${lot.code}`} data={lot} client={new QueryClient()} prerender />,
    );
    const doc = new DOMParser().parseFromString(html, 'text/html');
    expect(doc.querySelector('h1')?.textContent).toBe('Blue and white wound beads, old strand');
    expect(doc.querySelector('.pl-status-live')?.textContent).toBe('Checking this history in this browser…');
    expect(doc.querySelector('.pl-ok')).toBeNull();
    expect(doc.querySelector('.pl-bad')).toBeNull();
    // The tag box is there to type into; nothing is fetched while rendering.
    expect(doc.querySelector('.pl-tagbox input')).not.toBeNull();
    expect(fetchMock).not.toHaveBeenCalled();
  });
});

describe('the verdict written before the rest of the page has loaded', () => {
  const live = () => {
    const el = document.createElement('div');
    el.className = 'pl-status-live';
    el.textContent = 'Checking this history in this browser…';
    return el;
  };

  it('says what the page itself says for an unbroken history', async () => {
    const lot = responseFor(rolls, 0);
    const el = live();
    writeHistoryLine(el, checkLot(lot.code, lot.bundle));
    expect(el.querySelector('.pl-status-line.pl-ok')?.textContent).toBe(
      '✓ Unbroken history as served: 6 entries',
    );
    expect(el.querySelector('.pl-mark')).toHaveAttribute('aria-hidden', 'true');
    const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<PublicLotApp pathname={`/l/${lot.code}`} client={client} data={lot} />);
    await waitFor(() => expect(screen.getByRole('status')).toHaveTextContent(/Unbroken/));
    const page = screen.getByRole('status');
    expect(page.querySelector('.pl-status-line')?.textContent).toBe(
      el.querySelector('.pl-status-line')?.textContent,
    );
    expect(page.querySelector('.pl-status-sub')?.textContent).toBe(
      el.querySelector('.pl-status-sub')?.textContent,
    );
  });

  it('names the break and its reason code when the history does not check out', () => {
    const lot = responseFor(rolls, 0);
    lot.bundle.rolls[0]!.entries.splice(2, 1);
    const el = live();
    writeHistoryLine(el, checkLot(lot.code, lot.bundle));
    expect(el.querySelector('.pl-ok')).toBeNull();
    expect(el.querySelector('.pl-status-line.pl-bad')?.textContent).toMatch(
      /^✗ History broken at entry 2 of 5/,
    );
    expect(el.querySelector('code')?.textContent).toBe('bad-seq');
  });

  it('checks a data object once: the page is given the first check’s result', () => {
    const lot = responseFor(rolls, 0);
    const first = checkLot(lot.code, lot.bundle);
    expect(checkLot(lot.code, lot.bundle)).toBe(first);
    // A copy of the same data is checked on its own.
    expect(checkLot(lot.code, structuredClone(lot.bundle))).not.toBe(first);
  });
});

describe('the page’s first script', () => {
  /** The page as the server sends it: the rendered status panel in #root, then the data block. */
  function sentPage(text: string): Document {
    const doc = pageWith(text);
    const root = doc.createElement('div');
    root.id = 'root';
    root.innerHTML = '<div class="pl-status-live">Checking this history in this browser…</div>';
    doc.body.prepend(root);
    return doc;
  }

  it('checks the data sent with the page and writes the verdict into the rendered panel', () => {
    const lot = responseFor(rolls, 0);
    const doc = sentPage(JSON.stringify(lot));
    const data = firstCheck(`/l/${lot.code}`, doc);
    expect(data).toEqual(lot);
    expect(doc.querySelector('#root .pl-status-line.pl-ok')?.textContent).toBe(
      '✓ Unbroken history as served: 6 entries',
    );
    // The rest of the page is given the same object, whose check is kept, not run again.
    expect(checkLot(lot.code, data!.bundle)).toBe(checkLot(lot.code, data!.bundle));
  });

  it('gives no verdict for data under another lot’s address, or with no data', () => {
    const lot = responseFor(rolls, 0);
    const other = sentPage(JSON.stringify(lot));
    expect(firstCheck(`/l/${rolls[1]!.lot}`, other)).toBeNull();
    expect(other.querySelector('.pl-status-live')?.textContent).toBe(
      'Checking this history in this browser…',
    );
    const none = sentPage('');
    expect(firstCheck(`/l/${lot.code}`, none)).toBeNull();
    expect(none.querySelector('.pl-ok, .pl-bad')).toBeNull();
  });
});
