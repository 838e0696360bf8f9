import { queryOptions } from '@tanstack/react-query';
import {
  parseBundle,
  type BeadCount,
  type Bundle,
  type LotDescription,
  type LotStatus,
} from '@beadroll/core';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';

/** A lot in the ancestry graph the server draws for a signed-in viewer. */
export type AncestryNode = Schemas['AncestryNodeResponse'];

/** Beads went from `from` to `to` through `from`'s entry `seq`. */
export type AncestryEdge = Schemas['AncestryEdgeResponse'];

export type Ancestry = Schemas['AncestryResponse'];
export type LinkedLot = Schemas['LinkedLotResponse'];
export type SplitResult = Schemas['SplitResponse'];
export type CombineResult = Schemas['CombineResponse'];

/** What the split and combine dialogs need to know about a lot (from its roll state or its detail). */
export interface LotBasics {
  code: string;
  description: LotDescription | null;
  remaining: BeadCount;
  status: LotStatus;
}

/** One row of the dealer's held lots, for choosing what goes into a combination. */
export type HeldLot = Pick<
  Schemas['LotSummaryResponse'],
  'code' | 'displayCode' | 'title' | 'count' | 'status'
>;

const lot = (code: string) => ({ params: { path: { code } } });

export const ancestryQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'ancestry', code],
    queryFn: () => answer(client.GET('/api/lots/{code}/ancestry', lot(code))),
  });

/** The viewer's export bundle of a lot (ancestors in full where the viewer may read them). */
export const lotBundleQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'bundle', code],
    queryFn: async (): Promise<Bundle> =>
      parseBundle(await answer<unknown>(client.GET('/api/lots/{code}/bundle', lot(code)))),
  });

export const heldLotsQuery = () =>
  queryOptions({
    queryKey: ['lots', 'list', { mine: true, status: 'held', pageSize: 100 }],
    queryFn: async (): Promise<HeldLot[]> =>
      (
        await answer(
          client.GET('/api/lots', {
            params: { query: { mine: true, status: 'held', pageSize: 100, sort: 'title', order: 'asc' } },
          }),
        )
      ).items,
  });

export const lineageApi = {
  split: (code: string, children: Array<{ description: LotDescription }>) =>
    answer(
      client.POST('/api/lots/{code}/splits', {
        ...lot(code),
        body: { children },
      }),
    ),
  combine: (parts: Array<{ lot: string; count?: BeadCount }>, description: LotDescription) =>
    answer(
      client.POST('/api/combinations', {
        body: { parts, description },
      }),
    ),
};
