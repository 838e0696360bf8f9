import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { accounts, json, renderAt, renderWithProviders, stubServer } from '../../common/testing/render';
import { RecordSaleDialog } from './RecordSaleDialog';
import { type Offer, type Party, toMinorUnits } from './transfers.api';

const dealer = accounts.dealer;

const party = (id: string, displayName: string): Party => ({
  id,
  handle: displayName.toLowerCase().replace(' ', '-'),
  displayName,
  business: `${displayName} Beads`,
  town: 'Rocaille Ford',
  country: 'Marver Isles',
  status: 'verified',
});

const offer: Offer = {
  id: '0d8e2a4c-1111-4a4a-8888-000000000001',
  lot: { code: '7K2QM9XAT', displayCode: '7K2Q-M9XA-T', title: 'White wound beads with pink roses' },
  offerSeq: 3,
  status: 'open',
  offerer: party('a', 'Mira Tollan'),
  recipient: party(dealer.id, 'Oskar Wendle'),
  viewerIs: 'recipient',
  note: 'as agreed',
  offeredAt: '2026-05-10T10:00:00.000Z',
  lapsesAt: '2026-05-24T10:00:00.000Z',
  price: { amount: 12550, currency: 'EUR' },
};

function stub(handler: (url: string, init?: RequestInit) => Response | undefined) {
  return stubServer(dealer, handler);
}

describe('transfers in the web app', () => {
  it('reads prices in major units with each currency’s ISO 4217 minor unit', () => {
    // ISO 4217 minor units: EUR 2, JPY 0, BHD 3.
    expect(toMinorUnits('125.50', 'EUR')).toBe(12550);
    expect(toMinorUnits('125,5', 'EUR')).toBe(12550);
    expect(toMinorUnits('125', 'EUR')).toBe(12500);
    expect(toMinorUnits('1200', 'JPY')).toBe(1200);
    expect(toMinorUnits('12.5', 'JPY')).toBeNull();
    expect(toMinorUnits('1.234', 'BHD')).toBe(1234);
    expect(toMinorUnits('1.234', 'EUR')).toBeNull();
    expect(toMinorUnits('-3', 'EUR')).toBeNull();
    expect(toMinorUnits('', 'EUR')).toBeNull();
  }, 30_000);

  it('shows an offer from the e-mailed link with its sealed price, and accepts it', async () => {
    const calls = stub((url, init) => {
      if (url === `/api/transfers/offers/${offer.id}`) return json(200, offer);
      if (url === `/api/transfers/offers/${offer.id}/accept` && init?.method === 'POST')
        return json(200, {
          ...offer,
          status: 'accepted',
          answeredAt: '2026-05-11T09:00:00.000Z',
          lapsesAt: undefined,
        });
      return undefined;
    });
    renderAt(`/transfers/offers/${offer.id}`);
    expect(await screen.findByRole('heading', { name: 'Mira Tollan offers you a lot' })).toBeInTheDocument();
    expect(screen.getByText(/€125\.50|125[.,]50/)).toBeInTheDocument();
    await userEvent.type(screen.getByRole('textbox', { name: /Note/ }), 'thank you');
    await userEvent.click(screen.getByRole('button', { name: 'Accept the lot' }));
    expect(await screen.findByText(/The lot is yours now/)).toBeInTheDocument();
    const post = calls.find((c) => c.method === 'POST');
    expect(post).toMatchObject({
      url: `/api/transfers/offers/${offer.id}/accept`,
      body: { note: 'thank you' },
    });
    expect(screen.queryByRole('button', { name: 'Accept the lot' })).not.toBeInTheDocument();
  }, 30_000);

  it('says clearly when the offer was already answered', async () => {
    stub((url) => {
      if (url === `/api/transfers/offers/${offer.id}`) return json(200, offer);
      if (url.endsWith('/decline'))
        return json(409, {
          error: { code: 'offer_closed', message: 'This offer was already withdrawn; nothing was changed.' },
        });
      return undefined;
    });
    renderAt(`/transfers/offers/${offer.id}`);
    await userEvent.click(await screen.findByRole('button', { name: 'Decline' }));
    expect(
      await screen.findByText('This offer was already withdrawn; nothing was changed.'),
    ).toBeInTheDocument();
  }, 30_000);

  it('lists incoming offers with a status filter kept in the address', async () => {
    const calls = stub((url) => {
      if (url.startsWith('/api/transfers/offers?'))
        return json(200, { items: [offer], total: 1, page: 1, pageSize: 20 });
      return undefined;
    });
    const router = renderAt('/transfers/incoming');
    expect(await screen.findByRole('link', { name: offer.lot.title })).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Accepted' }));
    await waitFor(() => expect(router.state.location.search).toBe('?status=accepted'));
    await waitFor(() =>
      expect(calls.some((c) => c.url.includes('box=incoming') && c.url.includes('status=accepted'))).toBe(
        true,
      ),
    );
  }, 30_000);

  it('records a sale in a few taps: price, then record; today’s date and sealed minor units', async () => {
    const calls = stub((url, init) => {
      if (url === '/api/transfers/sales' && init?.method === 'POST')
        return json(201, {
          id: 's1',
          lot: offer.lot,
          seq: 5,
          date: '2026-05-16',
          price: { amount: 4000, currency: 'EUR' },
          recordedAt: '2026-05-16T12:00:00.000Z',
          receiptSent: false,
          listed: true,
        });
      return undefined;
    });
    const done = vi.fn();
    renderWithProviders(
      <RecordSaleDialog code={offer.lot.code} title={offer.lot.title} onClose={() => {}} onDone={done} />,
    );
    await userEvent.type(screen.getByRole('textbox', { name: 'Price: amount' }), '40');
    await userEvent.click(screen.getByRole('button', { name: 'Record the sale' }));
    await waitFor(() => expect(done).toHaveBeenCalled());
    const post = calls.find((c) => c.method === 'POST')!;
    expect(post.body).toMatchObject({ lot: offer.lot.code, price: { amount: 4000, currency: 'EUR' } });
    expect((post.body as { date: string }).date).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  }, 30_000);
});
