import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '../../lib/api';

export interface RequestParty {
  id: string;
  handle: string;
  displayName: string;
  business: string;
}

export interface OpinionRequest {
  id: string;
  lot: { code: string; displayCode: string; title: string; listed: boolean };
  requester: RequestParty;
  /** null: any verified assessor. */
  assessor: RequestParty | null;
  note: string | null;
  status: 'open' | 'answered' | 'cancelled';
  createdAt: string;
  closedAt: string | null;
  opinionSeq: number | null;
  answeredBy: RequestParty | null;
}

interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

export const opinionRequestQueries = {
  box: (box: 'sent' | 'received', page = 1) =>
    queryOptions({
      queryKey: ['opinion-requests', box, { page }],
      queryFn: () => api<Page<OpinionRequest>>(`/api/opinion-requests?box=${box}&page=${page}&pageSize=50`),
      placeholderData: keepPreviousData,
    }),
  assessors: (q: string) =>
    queryOptions({
      queryKey: ['opinion-requests', 'assessors', q],
      queryFn: () =>
        api<{ items: RequestParty[] }>(`/api/opinion-requests/assessors?q=${encodeURIComponent(q.trim())}`),
      staleTime: 30_000,
    }),
};

export const opinionRequestsApi = {
  ask: (draft: { lot: string; assessor?: string; note?: string }) =>
    api<OpinionRequest>('/api/opinion-requests', { method: 'POST', body: { ...draft } }),
  cancel: (id: string) =>
    api<OpinionRequest>(`/api/opinion-requests/${encodeURIComponent(id)}/cancel`, {
      method: 'POST',
      body: {},
    }),
};

export const REQUEST_STATUS: Record<OpinionRequest['status'], string> = {
  open: 'Waiting for an opinion',
  answered: 'Answered',
  cancelled: 'Cancelled by the holder',
};
