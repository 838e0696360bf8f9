import { currencyOf, parseAmount } from '@beadroll/core';
import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { Money } from '@beadroll/core';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';

export type { Money } from '@beadroll/core';

export type Party = Schemas['PartyCard'];
export type TransferLot = Schemas['TransferLotResponse'];
export type Offer = Schemas['OfferResponse'];
export type OfferStatus = Offer['status'];
export type OfferBox = 'incoming' | 'outgoing';
export type Invitation = Schemas['InvitationResponse'];
export type Sale = Schemas['SaleResponse'];
export type OfferDraft = Schemas['CreateOfferDto'];
export type SaleDraft = Schemas['RecordSaleDto'];

export type SaleReceiptFilter = 'sent' | 'none' | undefined;

export const OFFER_STATUS_LABEL: Record<OfferStatus, string> = {
  open: 'Waiting for an answer',
  accepted: 'Accepted',
  declined: 'Declined',
  withdrawn: 'Withdrawn',
  lapsed: 'Lapsed',
};

/** A query without its unset and empty members. */
const query = <T extends Record<string, unknown>>(params: T): T =>
  Object.fromEntries(Object.entries(params).filter(([, v]) => v !== undefined && v !== '')) as T;
const byId = (id: string) => ({ params: { path: { id } } });

export const offersQuery = (box: OfferBox, status: OfferStatus | undefined, page: number, pageSize = 20) =>
  queryOptions({
    queryKey: ['transfers', 'offers', box, { status, page, pageSize }],
    queryFn: () =>
      answer(
        client.GET('/api/transfers/offers', { params: { query: query({ box, status, page, pageSize }) } }),
      ),
    placeholderData: keepPreviousData,
  });

/** The dealer's open outgoing offer of one lot, if any. */
export const openOfferOfLotQuery = (code: string) =>
  queryOptions({
    queryKey: ['transfers', 'offers', 'outgoing', { status: 'open', lot: code }],
    queryFn: async () =>
      (
        await answer(
          client.GET('/api/transfers/offers', {
            params: { query: { box: 'outgoing', status: 'open', lot: code } },
          }),
        )
      ).items[0] ?? null,
  });

export const offerQuery = (id: string) =>
  queryOptions({
    queryKey: ['transfers', 'offer', id],
    queryFn: () => answer(client.GET('/api/transfers/offers/{id}', byId(id))),
  });

export const invitationsQuery = () =>
  queryOptions({
    queryKey: ['transfers', 'invitations'],
    queryFn: () => answer(client.GET('/api/transfers/invitations')),
  });

export const salesQuery = (
  receipt: SaleReceiptFilter,
  from: string | undefined,
  page: number,
  pageSize = 20,
) =>
  queryOptions({
    queryKey: ['transfers', 'sales', { receipt, from, page, pageSize }],
    queryFn: () =>
      answer(
        client.GET('/api/transfers/sales', { params: { query: query({ receipt, from, page, pageSize }) } }),
      ),
    placeholderData: keepPreviousData,
  });

export const dealerSearchQuery = (q: string) =>
  queryOptions({
    queryKey: ['transfers', 'dealers', q],
    queryFn: () => answer(client.GET('/api/transfers/dealers', { params: { query: { q } } })),
    enabled: q.trim().length >= 2,
    staleTime: 30_000,
  });

/** Lots the signed-in dealer holds and may still offer or sell. */
export const heldLotsQuery = () =>
  queryOptions({
    queryKey: ['lots', 'list', { mine: true, status: 'held' }],
    queryFn: () =>
      answer(
        client.GET('/api/lots', {
          params: { query: { mine: true, status: 'held', pageSize: 100, sort: 'updated' } },
        }),
      ),
  });

export const transfersApi = {
  offer: (draft: OfferDraft) => answer(client.POST('/api/transfers/offers', { body: draft })),
  answer: (id: string, action: 'accept' | 'decline' | 'withdraw', note?: string) =>
    answer(client.POST(`/api/transfers/offers/{id}/${action}`, { ...byId(id), body: note ? { note } : {} })),
  salesPath: '/api/transfers/sales',
  offersPath: '/api/transfers/offers',
  recordSale: (draft: SaleDraft) => answer(client.POST('/api/transfers/sales', { body: draft })),
  offerInvitation: (id: string) => answer(client.POST('/api/transfers/invitations/{id}/offer', byId(id))),
  cancelInvitation: (id: string) => answer(client.POST('/api/transfers/invitations/{id}/cancel', byId(id))),
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
