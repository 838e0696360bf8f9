import type {
  BeadCount,
  LotDescription,
  LotForm,
  LotStatus,
  Money,
  Observations,
  Origin,
  StoredEntry,
  Technique,
} from '@beadroll/core';
import { SYSTEM_ACTOR } from '@beadroll/core';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../lib/api';

/** One row of the lot list, as the server pages it. */
export interface LotSummary {
  code: string;
  displayCode: string;
  title: string;
  form: LotForm | null;
  status: LotStatus;
  listed: boolean;
  holder: string;
  /** Origin of the attribution on record: the holder's, else an earlier holder's or an ancestor's. */
  origin: Origin | null;
  /** Whose attribution `origin` is; absent from older servers (the holder's). */
  originSource?: 'holder' | 'earlier-holder' | 'ancestor' | null;
  technique: Technique | null;
  period: { from: number; to: number } | null;
  count: BeadCount;
  dissents: number;
  headSeq: number;
  registeredAt: string;
  updatedAt: string;
}

export interface LotListPage {
  items: LotSummary[];
  total: number;
  page: number;
  pageSize: number;
}

/** The viewer's own sealed details (newest value of each). */
export interface OwnSealedDetails {
  storageLocation?: string;
  acquisitionDate?: string;
  acquisitionSource?: string;
  acquisitionCost?: Money;
  privateNote?: string;
}

/** The server's summary of a lot; the lot page uses it only for the viewer's sealed details. */
export interface LotDetail extends LotSummary {
  description: LotDescription | null;
  observations: Observations | null;
  remaining: BeadCount;
  headHash: string;
  viewerIsHolder: boolean;
  sealed: OwnSealedDetails;
}

/** One sealed value the viewer recorded, with its salt. */
export interface RollSealedField {
  name: string;
  salt: string;
  value: unknown;
  commitments: Record<string, string>;
}

/** One stored entry, with the exact strings the verifier checks. */
export interface RollEntry extends StoredEntry {
  seq: number;
  kind: string;
  actor: string;
  time: string;
  logIndex: number | null;
  sealed?: RollSealedField[];
}

/** A lot's whole roll as stored. */
export interface RawRoll {
  lot: string;
  entries: RollEntry[];
}

export const LIST_SORTS = [
  'registered',
  'updated',
  'title',
  'code',
  'form',
  'count',
  'origin',
  'period',
  'technique',
  'status',
  'listed',
] as const;
export type ListSort = (typeof LIST_SORTS)[number];

/** Paging, sorting, filters and search of the lot list (the server's query names). */
export interface LotListParams {
  page: number;
  pageSize: number;
  sort: ListSort;
  order: 'asc' | 'desc';
  q?: string;
  status?: LotStatus;
  form?: LotForm;
  origin?: Origin;
  technique?: Technique;
  listed?: boolean;
  mine?: boolean;
}

/** Where the browser downloads the lot list from, with its filters (the session cookie goes with it). */
export function lotsExportUrl(
  params: Omit<LotListParams, 'page' | 'pageSize'>,
  format: 'csv' | 'xlsx',
): string {
  const q = listQueryString(params);
  return `/api/lots/export?${q ? `${q}&` : ''}format=${format}`;
}

/** The query string of a list request; unset filters are left out. */
export function listQueryString(params: Partial<LotListParams>): string {
  const out = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) {
    if (v === undefined || v === '') continue;
    out.set(k, String(v));
  }
  return out.toString();
}

/** The description a register or describe request sends. */
export type DescriptionInput = LotDescription;

/** Sealed details as the register and describe requests take them. */
export interface SealedInput {
  storageLocation?: string;
  privateNote?: string;
  acquisition?: { date?: string; source?: string; cost?: Money };
}

export interface CreateLotInput {
  description: DescriptionInput;
  observations?: Observations;
  sealed?: SealedInput;
}

const enc = encodeURIComponent;

export const lotsQueries = {
  list: (params: LotListParams) =>
    queryOptions({
      queryKey: ['lots', 'list', params],
      queryFn: ({ signal }) => api<LotListPage>(`/api/lots?${listQueryString(params)}`, { signal }),
      placeholderData: keepPreviousData,
    }),
  detail: (code: string) =>
    queryOptions({
      queryKey: ['lots', 'detail', code],
      queryFn: ({ signal }) => api<LotDetail>(`/api/lots/${enc(code)}`, { signal }),
    }),
  roll: (code: string) =>
    queryOptions({
      queryKey: ['lots', 'roll', code],
      queryFn: ({ signal }) => api<RawRoll>(`/api/lots/${enc(code)}/roll`, { signal }),
    }),
};

export const lotsApi = {
  register: (body: CreateLotInput) => api<LotDetail>('/api/lots', { method: 'POST', body: { ...body } }),
  describe: (
    code: string,
    body: { description: DescriptionInput; sealed?: SealedInput; corrects?: { seq: number; reason: string } },
  ) => api<LotDetail>(`/api/lots/${enc(code)}/descriptions`, { method: 'POST', body: { ...body } }),
  observe: (code: string, observations: Observations, corrects?: { seq: number; reason: string }) =>
    api<LotDetail>(`/api/lots/${enc(code)}/observations`, {
      method: 'POST',
      body: { observations, ...(corrects ? { corrects } : {}) },
    }),
  voidSale: (code: string, reason?: string) =>
    api<void>(`/api/transfers/sales/${enc(code)}/void`, {
      method: 'POST',
      body: reason ? { reason } : {},
    }),
  setListing: (code: string, listed: boolean) =>
    api<LotDetail>(`/api/lots/${enc(code)}/listing`, { method: 'PUT', body: { listed } }),
  /** Every page of the current filter, for the CSV export (the server pages at most 100). */
};

/** A public card of a verified dealer or assessor. */
export interface DealerCard {
  id: string;
  handle: string;
  displayName: string;
  business: string | null;
  town: string | null;
  country: string | null;
  verifiedSince: string | null;
  status: 'verified' | 'suspended' | 'former';
}

export const dealerQueries = {
  cards: (ids: readonly string[]) =>
    queryOptions({
      queryKey: ['dealers', 'cards', [...ids].sort()],
      queryFn: ({ signal }) =>
        api<{ cards: Record<string, DealerCard> }>(
          `/api/public/dealers?${new URLSearchParams({ ids: [...ids].sort().join(',') })}`,
          { signal },
        ),
      staleTime: 5 * 60_000,
    }),
};

/**
 * Names for account ids on a roll: "You" for the viewer, the public card's name for others,
 * and a neutral phrase for accounts the registry does not vouch for.
 */
export function useActorNames(
  ids: readonly string[],
  viewer: { id: string } | null,
): (id: string, capital: boolean) => string {
  const others = [...new Set(ids)].filter((id) => id !== viewer?.id && id !== SYSTEM_ACTOR);
  const cards = useQuery({ ...dealerQueries.cards(others), enabled: others.length > 0 });
  return (id, capital) => {
    if (viewer && id === viewer.id) return capital ? 'You' : 'you';
    if (id === SYSTEM_ACTOR) return capital ? 'Beadroll' : 'Beadroll';
    const card = cards.data?.cards[id];
    if (!card && cards.isPending && others.length > 0) return '…';
    if (card) return card.business ? `${card.displayName} (${card.business})` : card.displayName;
    return `${capital ? 'An' : 'an'} account not vouched for by the registry`;
  };
}
