import { queryOptions } from '@tanstack/react-query';
import type { OpinionBody } from '@beadroll/core';
import { api } from '../../lib/api';

export type OpinionRole = 'attribution' | 'dissent' | 'other';
export type OpinionDraft = Omit<OpinionBody, 'nonce'>;

export interface OpinionReply {
  seq: number;
  author: string;
  time: string;
  text: string;
}

export interface OpinionView {
  seq: number;
  author: string;
  time: string;
  role: OpinionRole;
  body: OpinionBody | null;
  replies: OpinionReply[];
}

export interface AuthorCard {
  id: string;
  handle: string;
  displayName: string;
  business: string;
  town: string;
  country: string;
  status: string;
}

/** The opinions on a lot as the server derives them (core's reducer over the verified roll). */
export interface LotOpinions {
  lot: string;
  holder: string;
  listed: boolean;
  attribution: number | null;
  dissents: number[];
  opinions: OpinionView[];
  cards: Record<string, AuthorCard>;
}

export interface OpinionWrite {
  seq: number;
  hash: string;
  dissent?: boolean;
  opinions: LotOpinions;
}

export const opinionsQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'detail', code, 'opinions'],
    queryFn: () => api<LotOpinions>(`/api/lots/${encodeURIComponent(code)}/opinions`),
  });

export const opinionsApi = {
  record: (code: string, body: OpinionDraft) =>
    api<OpinionWrite>(`/api/lots/${encodeURIComponent(code)}/opinions`, {
      method: 'POST',
      body: { ...body },
    }),
  withdraw: (code: string, seq: number, note?: string) =>
    api<OpinionWrite>(`/api/lots/${encodeURIComponent(code)}/opinions/${seq}/withdrawal`, {
      method: 'POST',
      body: note ? { note } : {},
    }),
  reply: (code: string, seq: number, text: string) =>
    api<OpinionWrite>(`/api/lots/${encodeURIComponent(code)}/opinions/${seq}/replies`, {
      method: 'POST',
      body: { text },
    }),
};
