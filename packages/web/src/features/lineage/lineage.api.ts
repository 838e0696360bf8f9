import { queryOptions } from '@tanstack/react-query';
import {
  parseBundle,
  type BeadCount,
  type Bundle,
  type LotDescription,
  type LotStatus,
} from '@beadroll/core';
import { api } from '../../lib/api';

/** A lot in the ancestry graph the server draws for a signed-in viewer. */
export interface AncestryNode {
  code: string;
  displayCode: string;
  depth: number;
  readable: boolean;
  title: string | null;
  status: LotStatus | null;
  listed: boolean | null;
  count: BeadCount | null;
}

/** Beads went from `from` to `to` through `from`'s entry `seq`. */
export interface AncestryEdge {
  from: string;
  to: string;
  kind: 'split' | 'combined';
  seq: number;
  count: BeadCount;
}

export interface Ancestry {
  code: string;
  nodes: AncestryNode[];
  edges: AncestryEdge[];
  truncated: boolean;
}

export interface LinkedLot {
  code: string;
  displayCode: string;
  count: BeadCount;
}

export interface SplitResult {
  parent: string;
  seq: number;
  remaining: BeadCount;
  status: LotStatus;
  children: LinkedLot[];
}

export interface CombineResult {
  lot: LinkedLot;
  parents: Array<{ code: string; seq: number; count: BeadCount; remaining: BeadCount; status: LotStatus }>;
}

/** What the split and combine dialogs need to know about a lot (from its roll state or its detail). */
export interface LotBasics {
  code: string;
  description: LotDescription | null;
  remaining: BeadCount;
  status: LotStatus;
}

/** One row of the dealer's held lots, for choosing what goes into a combination. */
export interface HeldLot {
  code: string;
  displayCode: string;
  title: string;
  count: BeadCount;
  status: LotStatus;
}

export const ancestryQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'ancestry', code],
    queryFn: () => api<Ancestry>(`/api/lots/${encodeURIComponent(code)}/ancestry`),
  });

/** The viewer's export bundle of a lot (ancestors in full where the viewer may read them). */
export const lotBundleQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'bundle', code],
    queryFn: async (): Promise<Bundle> =>
      parseBundle(await api<unknown>(`/api/lots/${encodeURIComponent(code)}/bundle`)),
  });

export const heldLotsQuery = () =>
  queryOptions({
    queryKey: ['lots', 'list', { mine: true, status: 'held', pageSize: 100 }],
    queryFn: async () =>
      (await api<{ items: HeldLot[] }>('/api/lots?mine=true&status=held&pageSize=100&sort=title&order=asc'))
        .items,
  });

export const lineageApi = {
  split: (code: string, children: Array<{ description: LotDescription }>) =>
    api<SplitResult>(`/api/lots/${encodeURIComponent(code)}/splits`, { method: 'POST', body: { children } }),
  combine: (parts: Array<{ lot: string; count?: BeadCount }>, description: LotDescription) =>
    api<CombineResult>('/api/combinations', {
      method: 'POST',
      body: { parts, description } as unknown as Record<string, unknown>,
    }),
};
