import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { json, renderWithProviders } from '../../common/testing/render';
import { OpinionForm } from './OpinionForm';
import { OpinionsPanel } from './OpinionsPanel';
import type { OpinionBody } from '@beadroll/core';
import type { LotOpinions } from './opinions.api';

const HOLDER = '11111111-1111-4111-8111-111111111111';
const ASSESSOR = '22222222-2222-4222-8222-222222222222';

const base: OpinionBody = {
  nonce: '0123456789abcdef0123456789abcdef',
  origin: 'venice-murano',
  period: { from: 1880, to: 1920, approximate: true },
  technique: 'wound-lampwork',
  qualifier: 'attributed-to',
  confidence: 'medium',
  rationale: 'Raised roses over trailing.',
  exhibits: [],
};

const opinions: LotOpinions = {
  lot: '7K2QM9XAT',
  holder: HOLDER,
  listed: true,
  attribution: 1,
  dissents: [2],
  opinions: [
    {
      seq: 1,
      author: HOLDER,
      time: '2026-03-01T10:00:00.000Z',
      role: 'attribution',
      body: base,
      replies: [],
    },
    {
      seq: 2,
      author: ASSESSOR,
      time: '2026-03-02T10:00:00.000Z',
      role: 'dissent',
      body: {
        ...base,
        origin: 'india',
        period: { from: 1985, to: 2015, approximate: true },
        qualifier: 'later-copy',
      },
      replies: [],
    },
  ],
  cards: {
    [HOLDER]: {
      id: HOLDER,
      handle: 'mirela',
      displayName: 'Mirela Holt',
      business: 'Holt Beads',
      town: 'Murrine Vale',
      country: 'Marver Isles',
      status: 'verified',
    },
    [ASSESSOR]: {
      id: ASSESSOR,
      handle: 'thea',
      displayName: 'Thea Quill',
      business: '',
      town: 'Murrine Vale',
      country: 'Marver Isles',
      status: 'verified',
    },
  },
};

describe('the opinion form runs the attribution aid as the fields change', () => {
  it('shows the powder indication, its sources, the disclaimer, and warns about an early aventurine period before submitting', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => json(200, { lot: 'X', entries: [] })),
    );
    renderWithProviders(
      <OpinionForm code="7K2QM9XAT" observations={{ hole: 'powder' }} decoration={['aventurine']} />,
    );
    // Powder in the hole → release-coated mandrel (trade source: "Tornado Beads Redux and Musings on Cleaning Beads").
    const indications = screen.getByRole('list', { name: 'Indications' });
    expect(within(indications).getAllByText(/release/).length).toBeGreaterThan(0);
    expect(within(indications).getAllByRole('link', { name: /Tornado Beads Redux/ }).length).toBeGreaterThan(
      0,
    );
    expect(screen.getByRole('note')).toHaveTextContent('aid, not an authentication');
    expect(screen.getByRole('note')).toHaveTextContent('consumer-protection');
    const user = userEvent.setup({ delay: null });
    // Aventurine is a 17th-century Murano invention (Margaretologist vol. 12 no. 1, 1999): 1550–1580 is too early.
    await user.type(screen.getByRole('textbox', { name: /From year/ }), '1550');
    await user.type(screen.getByRole('textbox', { name: /To year/ }), '1580');
    expect(await screen.findByText(/17th-century Murano invention/)).toBeInTheDocument();
    expect(screen.getByText('The whole period is too early')).toBeInTheDocument();
    await user.clear(screen.getByRole('textbox', { name: /From year/ }));
    await user.type(screen.getByRole('textbox', { name: /From year/ }), '1850');
    await user.clear(screen.getByRole('textbox', { name: /To year/ }));
    await user.type(screen.getByRole('textbox', { name: /To year/ }), '1900');
    await waitFor(() => expect(screen.queryByText(/17th-century Murano invention/)).not.toBeInTheDocument());
  }, 30_000);

  it('shows the UV-A caution when a UV test was recorded, and the uranium handling caution on a green glow', () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => json(200, { lot: 'X', entries: [] })),
    );
    renderWithProviders(
      <OpinionForm code="7K2QM9XAT" observations={{ uvA: 'green-glow' }} decoration={[]} />,
    );
    expect(screen.getByLabelText('Caution: ultraviolet light')).toHaveTextContent(/germicidal \(UV-C\) lamp/);
    expect(screen.getByText(/never grind, drill, sand or break it/)).toBeInTheDocument();
  }, 30_000);

  it('refuses a reversed range on the spot and shows the server’s field message', async () => {
    const calls: Array<{ url: string; body?: string }> = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        calls.push({ url, body: init?.body as string | undefined });
        if (url.endsWith('/roll')) return json(200, { lot: 'X', entries: [] });
        return json(400, {
          error: {
            code: 'validation',
            message: 'Some fields need attention',
            fields: [{ field: 'rationale', reason: 'must be shorter than or equal to 5000 characters' }],
          },
        });
      }),
    );
    renderWithProviders(<OpinionForm code="7K2QM9XAT" observations={null} decoration={[]} />);
    const user = userEvent.setup({ delay: null });
    await user.type(screen.getByRole('textbox', { name: /From year/ }), '1900');
    await user.type(screen.getByRole('textbox', { name: /To year/ }), '1850');
    expect(screen.getByText('The period ends before it starts.')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Record opinion' }));
    expect(calls.filter((c) => c.url.endsWith('/opinions'))).toHaveLength(0);
    await user.clear(screen.getByRole('textbox', { name: /To year/ }));
    await user.type(screen.getByRole('textbox', { name: /To year/ }), '1950');
    await user.click(screen.getByRole('button', { name: 'Record opinion' }));
    expect(await screen.findByText('must be shorter than or equal to 5000 characters')).toBeInTheDocument();
    const sent = JSON.parse(calls.find((c) => c.url.endsWith('/opinions'))!.body!);
    expect(sent.period).toEqual({ from: 1900, to: 1950, approximate: true });
  }, 30_000);
});

describe('the opinions panel', () => {
  it('shows the dissent plainly beside the holder’s attribution, with the chart, and lets the holder answer', async () => {
    const calls: Array<{ url: string; body?: string }> = [];
    let current = opinions;
    vi.stubGlobal(
      'fetch',
      vi.fn(async (url: string, init?: RequestInit) => {
        calls.push({ url, body: init?.body as string | undefined });
        if (url.endsWith('/replies')) {
          const next = structuredClone(opinions);
          next.opinions[1]!.replies.push({
            seq: 3,
            author: HOLDER,
            time: '2026-03-03T10:00:00.000Z',
            text: 'Reamed later.',
          });
          current = next;
          return json(201, { seq: 3, hash: 'h', opinions: next });
        }
        return json(200, current);
      }),
    );
    renderWithProviders(<OpinionsPanel code="7K2QM9XAT" viewer={{ id: HOLDER, canWrite: true }} />);
    const attribution = await screen.findByRole('article', { name: /Holder’s attribution by Mirela Holt/ });
    expect(attribution).toHaveTextContent('Venice / Murano, about 1880–1920');
    const dissent = screen.getByRole('article', { name: /Dissent by Thea Quill/ });
    expect(dissent).toHaveTextContent('India, about 1985–2015');
    expect(dissent).toHaveTextContent('Later copy');
    expect(screen.getByText('1 dissent from the holder’s attribution.')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'Opinions by origin and period' })).toBeInTheDocument();
    expect(within(attribution).queryByRole('button', { name: 'Answer' })).toBeNull();
    expect(within(attribution).getByRole('button', { name: 'Withdraw my opinion' })).toBeInTheDocument();
    const user = userEvent.setup({ delay: null });
    await user.click(within(dissent).getByRole('button', { name: 'Answer' }));
    await user.type(within(dissent).getByRole('textbox', { name: 'Your answer' }), 'Reamed later.');
    await user.click(within(dissent).getByRole('button', { name: 'Add answer' }));
    expect(await screen.findByText('Reamed later.')).toBeInTheDocument();
    expect(JSON.parse(calls.find((c) => c.url.endsWith('/opinions/2/replies'))!.body!)).toEqual({
      text: 'Reamed later.',
    });
  }, 30_000);

  it('says plainly when the holder has no attribution yet; an author sees withdraw on their own opinion only', async () => {
    const none: LotOpinions = {
      ...opinions,
      attribution: null,
      dissents: [],
      opinions: [{ ...opinions.opinions[1]!, role: 'other' }],
    };
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => json(200, none)),
    );
    renderWithProviders(<OpinionsPanel code="7K2QM9XAT" viewer={{ id: ASSESSOR, canWrite: true }} />);
    expect(await screen.findByText('No attribution by the holder yet.')).toBeInTheDocument();
    const mine = screen.getByRole('article', { name: /Opinion by Thea Quill/ });
    expect(within(mine).getByRole('button', { name: 'Withdraw my opinion' })).toBeInTheDocument();
    expect(within(mine).queryByRole('button', { name: 'Answer' })).toBeNull();
  }, 30_000);
});
