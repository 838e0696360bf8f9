import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../common/testing/render';
import { ExhibitGallery } from './ExhibitGallery';
import { ExhibitUploader } from './ExhibitUploader';
import type { ExhibitResponse } from './exhibits.api';

// Fluent's dialog and user-event are slow in jsdom on a busy two-core machine.
vi.setConfig({ testTimeout: 20_000 });

// FIPS 180-2, appendix B.1: SHA-256("abc").
const ABC_SHA256 = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad';

/** Stands in for the browser's XMLHttpRequest: records what is sent, reports progress on demand. */
class FakeXhr {
  static sent: FakeXhr[] = [];
  headers: Record<string, string> = {};
  method = '';
  url = '';
  body: FormData | undefined;
  status = 0;
  responseText = '';
  responseType = '';
  withCredentials = false;
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } =
    {
      onprogress: null,
    };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(k: string, v: string) {
    this.headers[k] = v;
  }
  send(body: FormData) {
    this.body = body;
    FakeXhr.sent.push(this);
  }
  abort() {
    this.onabort?.();
  }
  progress(loaded: number, total: number) {
    this.upload.onprogress?.({ lengthComputable: true, loaded, total });
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

const exhibit = (seq: number, over: Partial<ExhibitResponse> = {}): ExhibitResponse => ({
  seq,
  kind: 'hole',
  caption: 'Clean hole, no powder',
  sealed: false,
  addedBy: 'acct-1',
  time: '2025-03-01T12:00:00.000Z',
  original: { sha256: ABC_SHA256, size: 3, mediaType: 'image/jpeg', width: 10, height: 10 },
  derivatives: [
    { role: 'web', sha256: ABC_SHA256, size: 3, mediaType: 'image/jpeg', width: 10, height: 10 },
    { role: 'thumbnail', sha256: ABC_SHA256, size: 3, mediaType: 'image/jpeg', width: 10, height: 10 },
  ],
  urls: { original: `/x/${seq}/original`, web: `/x/${seq}/web`, thumb: `/x/${seq}/thumb` },
  ...over,
});

describe('ExhibitUploader', () => {
  beforeEach(() => {
    FakeXhr.sent = [];
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
  });

  it('sends each file on its own with the request header, showing its progress', async () => {
    const user = userEvent.setup();
    renderWithProviders(<ExhibitUploader code="7K2QM9XAT" />);
    const a = new File([new Uint8Array(2000)], 'strand.jpg', { type: 'image/jpeg' });
    const b = new File([new Uint8Array(3000)], 'hole.jpg', { type: 'image/jpeg' });
    await user.upload(screen.getByTestId('exhibit-files'), [a, b]);
    const first = screen.getByRole('listitem', { name: 'strand.jpg' });
    await user.type(within(first).getByRole('textbox', { name: 'Caption' }), 'The whole strand');
    await user.click(screen.getByRole('button', { name: 'Add 2 exhibits to the roll' }));

    await waitFor(() => expect(FakeXhr.sent).toHaveLength(1));
    const x = FakeXhr.sent[0];
    expect(x.method).toBe('POST');
    expect(x.url).toBe('/api/lots/7K2QM9XAT/exhibits');
    expect(x.headers['X-Beadroll-Request']).toBe('1');
    expect(x.body?.get('caption')).toBe('The whole strand');
    expect(x.body?.get('sealed')).toBe('false');
    expect((x.body?.get('file') as File).name).toBe('strand.jpg');

    x.progress(500, 1000);
    const bar = within(first).getByRole('progressbar');
    await waitFor(() => expect(bar).toHaveAttribute('aria-valuenow', '0.5'));
    x.answer(201, { exhibit: exhibit(1), notes: [] });
    await waitFor(() => expect(within(first).getByText(/Added to the roll/)).toBeInTheDocument());

    await waitFor(() => expect(FakeXhr.sent).toHaveLength(2));
    FakeXhr.sent[1].answer(400, {
      error: { code: 'validation', message: 'x', fields: [{ field: 'file', reason: 'is an HTML page' }] },
    });
    const second = screen.getByRole('listitem', { name: 'hole.jpg' });
    await waitFor(() => expect(within(second).getByText('is an HTML page')).toBeInTheDocument());
  });

  it('shows the UV-A caution when that kind is chosen, and seals receipts', async () => {
    const user = userEvent.setup();
    renderWithProviders(<ExhibitUploader code="7K2QM9XAT" />);
    await user.upload(screen.getByTestId('exhibit-files'), [
      new File(['x'], 'glow.jpg', { type: 'image/jpeg' }),
      new File(['y'], 'bill.pdf', { type: 'application/pdf' }),
    ]);
    const glow = screen.getByRole('listitem', { name: 'glow.jpg' });
    expect(within(glow).queryByText(/365 nm/)).not.toBeInTheDocument();
    await user.selectOptions(within(glow).getByRole('combobox', { name: 'Kind' }), 'uv-a');
    expect(within(glow).getByText(/365 nm/)).toBeInTheDocument();
    expect(within(glow).getByText(/germicidal \(UV-C\)/)).toBeInTheDocument();
    expect(within(glow).getByText(/local safety rules/)).toBeInTheDocument();

    const bill = screen.getByRole('listitem', { name: 'bill.pdf' });
    await user.selectOptions(within(bill).getByRole('combobox', { name: 'Kind' }), 'receipt');
    const priv = within(bill).getByRole('checkbox', { name: 'Private (sealed)' });
    expect(priv).toBeChecked();
    expect(priv).toBeDisabled();
  });
});

describe('ExhibitGallery', () => {
  beforeEach(() => {
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: () => 'blob:ok', revokeObjectURL: () => {} }));
  });

  it('shows an image only when its bytes hash to the SHA-256 on the roll', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string) =>
        url.startsWith('/x/1/') ? new Response('abc') : new Response('swapped bytes'),
      ),
    );
    renderWithProviders(
      <ExhibitGallery exhibits={[exhibit(1), exhibit(2, { caption: 'Under the torch' })]} />,
    );
    const cards = await screen.findAllByTestId('exhibit-card');
    await waitFor(() => expect(within(cards[0]).getByRole('img')).toHaveAttribute('data-verified', 'true'));
    await waitFor(() => expect(within(cards[1]).getByRole('alert')).toHaveTextContent(/does not match/));
    expect(within(cards[1]).queryByRole('img')).not.toBeInTheDocument();
    expect(within(cards[0]).getByText(`SHA-256 ${ABC_SHA256.slice(0, 12)}…`)).toBeInTheDocument();
  });

  it('opens a larger view with the caption, kind and hash', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => new Response('abc')),
    );
    renderWithProviders(<ExhibitGallery exhibits={[exhibit(3)]} />);
    fireEvent.click(screen.getByRole('button', { name: /Open exhibit 3/ }));
    const dialog = await screen.findByRole('dialog');
    expect(within(dialog).getByText('Kind: Hole · entry 3')).toBeInTheDocument();
    expect(within(dialog).getByText(`SHA-256 of the original: ${ABC_SHA256}`)).toBeInTheDocument();
    await waitFor(() => expect(within(dialog).getByRole('img')).toHaveAttribute('data-verified', 'true'));
  });
});
