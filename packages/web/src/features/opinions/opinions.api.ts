import { queryOptions } from '@tanstack/react-query';
import type { OpinionBody } from '@beadroll/core';
import { answerWithCore, client } from '../../api/client';
import type { Schemas, WithCore } from '../../api/types';

export type OpinionRole = 'attribution' | 'dissent' | 'other';
export type OpinionDraft = Omit<OpinionBody, 'nonce'>;

export type OpinionReply = Schemas['OpinionReply'];

export type OpinionView = WithCore<Schemas['OpinionView'], { role: OpinionRole; body: OpinionBody | null }>;

/** An author named on the opinions: the party part of the dealer card. */
export type AuthorCard = Schemas['PartyCard'];

/** The opinions on a lot as the server derives them (core's reducer over the verified roll). */
export type LotOpinions = WithCore<Schemas['LotOpinionsResponse'], { opinions: OpinionView[] }>;

export type OpinionWrite = WithCore<Schemas['OpinionWriteResponse'], { opinions: LotOpinions }>;

const opinion = (code: string, seq: number) => ({ params: { path: { code, seq: String(seq) } } });

export const opinionsQuery = (code: string) =>
  queryOptions({
    queryKey: ['lots', 'detail', code, 'opinions'],
    queryFn: () =>
      answerWithCore<LotOpinions>(client.GET('/api/lots/{code}/opinions', { params: { path: { code } } })),
  });

export const opinionsApi = {
  record: (code: string, body: OpinionDraft) =>
    answerWithCore<OpinionWrite>(
      client.POST('/api/lots/{code}/opinions', {
        params: { path: { code } },
        body,
      }),
    ),
  withdraw: (code: string, seq: number, note?: string) =>
    answerWithCore<OpinionWrite>(
      client.POST('/api/lots/{code}/opinions/{seq}/withdrawal', {
        ...opinion(code, seq),
        body: note ? { note } : {},
      }),
    ),
  reply: (code: string, seq: number, text: string) =>
    answerWithCore<OpinionWrite>(
      client.POST('/api/lots/{code}/opinions/{seq}/replies', { ...opinion(code, seq), body: { text } }),
    ),
};
