import { queryOptions } from '@tanstack/react-query';
import { api } from '../../lib/api';

/** A witness of the log as the registrar sees it. */
export interface Witness {
  id: string;
  name: string;
  key: string;
  registeredAt: string;
  lastCosignedAt: string | null;
  lastCosignedSize: number | null;
}

export interface WitnessList {
  /** The log's own verifier key, for witnesses to be given. */
  logKey: string;
  items: Witness[];
}

export const witnessesQuery = () =>
  queryOptions({
    queryKey: ['registry', 'witnesses'],
    queryFn: ({ signal }) => api<WitnessList>('/api/registry/witnesses', { signal }),
    refetchInterval: 30_000,
  });

export const witnessesApi = {
  register: (key: string) => api<Witness>('/api/registry/witnesses', { method: 'POST', body: { key } }),
};
