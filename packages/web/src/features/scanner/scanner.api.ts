import { queryOptions } from '@tanstack/react-query';
import { ApiError, api } from '../../lib/api';

/** A scanned lot as the server's tag maker answers: held by the signed-in dealer or not. */
export interface ScannedLot {
  code: string;
  held: boolean;
  title?: string;
  listed?: boolean;
  status?: string;
  seq?: number;
  ref?: string;
}

export const scannerQueries = {
  lot: (code: string) =>
    queryOptions({
      queryKey: ['tags', 'lot', code],
      queryFn: () => api<ScannedLot>(`/api/tags/lots/${encodeURIComponent(code)}`),
    }),
};

/**
 * Asks the server whether the signed-in dealer holds the lot. Any refusal (not signed in, not
 * a dealer) means "not held": the scanner then opens the public page, which answers for every
 * listed lot.
 */
export async function lookupScannedLot(code: string): Promise<ScannedLot> {
  try {
    return await api<ScannedLot>(`/api/tags/lots/${encodeURIComponent(code)}`);
  } catch (e) {
    if (e instanceof ApiError) return { code, held: false };
    throw e;
  }
}
