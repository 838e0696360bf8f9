import type { LotDescription, Money, Observations, StoredEntry } from '@beadroll/core';
import { SYSTEM_ACTOR } from '@beadroll/core';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { answer, answerWithCore, client } from '../../api/client';
import type { operations } from '../../api/schema';
import type { Schemas, WithCore } from '../../api/types';

/** One row of the lot list, as the server pages it. */
export type LotSummary = Schemas['LotSummaryResponse'];

export type LotListPage = Schemas['LotListResponse'];

/** The viewer's own sealed details (newest value of each). */
export type OwnSealedDetails = Schemas['OwnSealedDetails'];

/** The server's summary of a lot; the lot page uses it only for the viewer's sealed details. */
export type LotDetail = WithCore<
  Schemas['LotDetailResponse'],
  { description: LotDescription | null; observations: Observations | null }
>;

/** One sealed value the viewer recorded, with its salt. */
export type RollSealedField = WithCore<
  Schemas['SealedFieldResponse'],
  { value: unknown; commitments: Record<string, string> }
>;

/** One stored entry, with the exact strings the verifier checks. */
export type RollEntry = WithCore<Schemas['RollEntryResponse'], { sealed?: RollSealedField[] }> & StoredEntry;

/** A lot's whole roll as stored. */
export type RawRoll = WithCore<Schemas['RollResponse'], { entries: RollEntry[] }>;

type ListQuery = NonNullable<operations['LotsController_list']['parameters']['query']>;

/** An order the server lists lots in. */
export type ListSort = NonNullable<ListQuery['sort']>;

/** Paging, sorting, filters and search of the lot list (the server's query names). */
export type LotListParams = ListQuery & Required<Pick<ListQuery, 'page' | 'pageSize' | 'sort' | 'order'>>;

/** The list request's query: unset and empty filters are left out. */
export function listQuery(params: Partial<LotListParams>): ListQuery {
  return Object.fromEntries(
    Object.entries(params).filter(([, v]) => v !== undefined && v !== ''),
  ) as ListQuery;
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

const lot = (code: string) => ({ params: { path: { code } } });

export const lotsQueries = {
  list: (params: LotListParams) =>
    queryOptions({
      queryKey: ['lots', 'list', params],
      queryFn: ({ signal }) =>
        answer(client.GET('/api/lots', { params: { query: listQuery(params) }, signal })),
      placeholderData: keepPreviousData,
    }),
  detail: (code: string) =>
    queryOptions({
      queryKey: ['lots', 'detail', code],
      queryFn: ({ signal }) =>
        answerWithCore<LotDetail>(client.GET('/api/lots/{code}', { ...lot(code), signal })),
    }),
  roll: (code: string) =>
    queryOptions({
      queryKey: ['lots', 'roll', code],
      queryFn: ({ signal }) =>
        answerWithCore<RawRoll>(client.GET('/api/lots/{code}/roll', { ...lot(code), signal })),
    }),
};

export const lotsApi = {
  register: (body: CreateLotInput) => answerWithCore<LotDetail>(client.POST('/api/lots', { body })),
  describe: (
    code: string,
    body: { description: DescriptionInput; sealed?: SealedInput; corrects?: { seq: number; reason: string } },
  ) => answerWithCore<LotDetail>(client.POST('/api/lots/{code}/descriptions', { ...lot(code), body })),
  observe: (code: string, observations: Observations, corrects?: { seq: number; reason: string }) =>
    answerWithCore<LotDetail>(
      client.POST('/api/lots/{code}/observations', {
        ...lot(code),
        body: { observations, ...(corrects ? { corrects } : {}) },
      }),
    ),
  voidSale: (code: string, reason?: string) =>
    answer(client.POST('/api/transfers/sales/{code}/void', { ...lot(code), body: reason ? { reason } : {} })),
  setListing: (code: string, listed: boolean) =>
    answerWithCore<LotDetail>(client.PUT('/api/lots/{code}/listing', { ...lot(code), body: { listed } })),
};

/** A public card of a verified dealer or assessor. */
export type DealerCard = Schemas['DealerCard'];

export const dealerQueries = {
  cards: (ids: readonly string[]) =>
    queryOptions({
      queryKey: ['dealers', 'cards', [...ids].sort()],
      queryFn: ({ signal }) =>
        answer(
          client.GET('/api/public/dealers', {
            params: { query: { ids: [...ids].sort().join(',') } },
            signal,
          }),
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
