import { queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';

/** A witness of the log as the registrar sees it. */
export type Witness = Schemas['WitnessResponse'];

export type WitnessList = Schemas['WitnessListResponse'];

export const witnessesQuery = () =>
  queryOptions({
    queryKey: ['registry', 'witnesses'],
    queryFn: ({ signal }) => answer(client.GET('/api/registry/witnesses', { signal })),
    refetchInterval: 30_000,
  });

export const witnessesApi = {
  register: (key: string) => answer(client.POST('/api/registry/witnesses', { body: { key } })),
};
