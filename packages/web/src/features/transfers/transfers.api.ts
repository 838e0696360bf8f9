import { currencyOf, parseAmount } from '@beadroll/core';
import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '../../lib/api';

/** Money in integer minor units of an ISO 4217 currency. */
export interface Money {
  amount: number;
  currency: string;
}

export interface Party {
  id: string;
  handle: string;
  displayName: string;
  business: string;
  town: string;
  country: string;
  status: string;
}

export interface TransferLot {
  code: string;
  displayCode: string;
  title: string;
}

export type OfferStatus = 'open' | 'accepted' | 'declined' | 'withdrawn' | 'lapsed';
export type OfferBox = 'incoming' | 'outgoing';

export interface Offer {
  id: string;
  lot: TransferLot;
  offerSeq: number;
  status: OfferStatus;
  offerer: Party | null;
  recipient: Party | null;
  viewerIs: 'offerer' | 'recipient';
  note?: string;
  offeredAt: string;
  lapsesAt?: string;
  answeredAt?: string;
  answerSeq?: number;
  answerNote?: string;
  price?: Money;
}

export interface Invitation {
  id: string;
  lot: TransferLot;
  email: string;
  status: 'waiting' | 'offered' | 'stalled' | 'cancelled';
  statusReason?: string;
  note?: string;
  price?: Money;
  offerId?: string;
  createdAt: string;
}

export interface Sale {
  id: string;
  lot: TransferLot;
  seq: number;
  date: string;
  price?: Money;
  buyerNote?: string;
  recordedAt: string;
  receiptSent: boolean;
  listed: boolean;
}

export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface OfferDraft {
  lot: string;
  recipient?: string;
  email?: string;
  note?: string;
  price?: Money;
}

export interface SaleDraft {
  lot: string;
  date: string;
  price: Money;
  buyerNote?: string;
  buyerEmail?: string;
}

export type SaleReceiptFilter = 'sent' | 'none' | undefined;

export const OFFER_STATUS_LABEL: Record<OfferStatus, string> = {
  open: 'Waiting for an answer',
  accepted: 'Accepted',
  declined: 'Declined',
  withdrawn: 'Withdrawn',
  lapsed: 'Lapsed',
};

const qs = (params: Record<string, string | number | undefined>) =>
  new URLSearchParams(
    Object.entries(params)
      .filter(([, v]) => v !== undefined && v !== '')
      .map(([k, v]) => [k, String(v)]),
  ).toString();

export const offersQuery = (box: OfferBox, status: OfferStatus | undefined, page: number, pageSize = 20) =>
  queryOptions({
    queryKey: ['transfers', 'offers', box, { status, page, pageSize }],
    queryFn: () => api<Page<Offer>>(`/api/transfers/offers?${qs({ box, status, page, pageSize })}`),
    placeholderData: keepPreviousData,
  });

/** The dealer's open outgoing offer of one lot, if any. */
export const openOfferOfLotQuery = (code: string) =>
  queryOptions({
    queryKey: ['transfers', 'offers', 'outgoing', { status: 'open', lot: code }],
    queryFn: async () =>
      (await api<Page<Offer>>(`/api/transfers/offers?${qs({ box: 'outgoing', status: 'open', lot: code })}`))
        .items[0] ?? null,
  });

export const offerQuery = (id: string) =>
  queryOptions({
    queryKey: ['transfers', 'offer', id],
    queryFn: () => api<Offer>(`/api/transfers/offers/${encodeURIComponent(id)}`),
  });

export const invitationsQuery = () =>
  queryOptions({
    queryKey: ['transfers', 'invitations'],
    queryFn: () => api<{ items: Invitation[] }>('/api/transfers/invitations'),
  });

export const salesQuery = (
  receipt: SaleReceiptFilter,
  from: string | undefined,
  page: number,
  pageSize = 20,
) =>
  queryOptions({
    queryKey: ['transfers', 'sales', { receipt, from, page, pageSize }],
    queryFn: () => api<Page<Sale>>(`/api/transfers/sales?${qs({ receipt, from, page, pageSize })}`),
    placeholderData: keepPreviousData,
  });

export const dealerSearchQuery = (q: string) =>
  queryOptions({
    queryKey: ['transfers', 'dealers', q],
    queryFn: () => api<{ items: Party[] }>(`/api/transfers/dealers?${qs({ q })}`),
    enabled: q.trim().length >= 2,
    staleTime: 30_000,
  });

/** Lots the signed-in dealer holds and may still offer or sell. */
export const heldLotsQuery = () =>
  queryOptions({
    queryKey: ['lots', 'list', { mine: true, status: 'held' }],
    queryFn: () =>
      api<Page<{ code: string; displayCode: string; title: string }>>(
        '/api/lots?mine=true&status=held&pageSize=100&sort=updated',
      ),
  });

export const transfersApi = {
  offer: (draft: OfferDraft) =>
    api<{ made: 'offer' | 'invitation'; offer?: Offer; invitation?: Invitation }>('/api/transfers/offers', {
      method: 'POST',
      body: { ...draft },
    }),
  answer: (id: string, action: 'accept' | 'decline' | 'withdraw', note?: string) =>
    api<Offer>(`/api/transfers/offers/${encodeURIComponent(id)}/${action}`, {
      method: 'POST',
      body: note ? { note } : {},
    }),
  salesPath: '/api/transfers/sales',
  recordSale: (draft: SaleDraft) => api<Sale>('/api/transfers/sales', { method: 'POST', body: { ...draft } }),
  offerInvitation: (id: string) =>
    api<Invitation>(`/api/transfers/invitations/${encodeURIComponent(id)}/offer`, {
      method: 'POST',
      body: {},
    }),
  cancelInvitation: (id: string) =>
    api<Invitation>(`/api/transfers/invitations/${encodeURIComponent(id)}/cancel`, {
      method: 'POST',
      body: {},
    }),
};

/** Digits after the decimal point of a currency (ISO 4217 minor units, from core's list). */
export function minorDigits(currency: string): number {
  return currencyOf(currency)?.digits ?? 2;
}

/** "125.50" in EUR → 12550; null when it is not an amount (see {@link priceProblem} for why). */
export function toMinorUnits(text: string, currency: string): number | null {
  const r = parseAmount(text, currency);
  return 'amount' in r ? r.amount : null;
}

/** What to enter instead of `text` as an amount in `currency`, or null when it is fine. */
export function priceProblem(text: string, currency: string): string | null {
  const r = parseAmount(text, currency);
  return 'problem' in r ? r.problem : null;
}

/** An amount in the viewer's locale, e.g. €125.50. */
export function formatMoney(m: Money | undefined): string {
  if (!m) return '—';
  const digits = minorDigits(m.currency);
  try {
    return new Intl.NumberFormat(undefined, { style: 'currency', currency: m.currency }).format(
      m.amount / 10 ** digits,
    );
  } catch {
    return `${m.amount} ${m.currency}`;
  }
}

export function formatDateTime(iso: string | undefined): string {
  return iso ? new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : '—';
}

/** Today as YYYY-MM-DD in the viewer's own time zone. */
export function today(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}
