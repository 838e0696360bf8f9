import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';

/** A requester or assessor: the names part of the dealer card. */
export type RequestParty = Schemas['PartyName'];

export type OpinionRequest = Schemas['OpinionRequestResponse'];

export const opinionRequestQueries = {
  box: (box: 'sent' | 'received', page = 1) =>
    queryOptions({
      queryKey: ['opinion-requests', box, { page }],
      queryFn: () =>
        answer(client.GET('/api/opinion-requests', { params: { query: { box, page, pageSize: 50 } } })),
      placeholderData: keepPreviousData,
    }),
  assessors: (q: string) =>
    queryOptions({
      queryKey: ['opinion-requests', 'assessors', q],
      queryFn: () =>
        answer(client.GET('/api/opinion-requests/assessors', { params: { query: { q: q.trim() } } })),
      staleTime: 30_000,
    }),
};

export const opinionRequestsApi = {
  ask: (draft: Schemas['CreateOpinionRequestDto']) =>
    answer(client.POST('/api/opinion-requests', { body: draft })),
  cancel: (id: string) =>
    answer(client.POST('/api/opinion-requests/{id}/cancel', { params: { path: { id } } })),
};

export const REQUEST_STATUS: Record<OpinionRequest['status'], string> = {
  open: 'Waiting for an opinion',
  answered: 'Answered',
  cancelled: 'Cancelled by the holder',
};
