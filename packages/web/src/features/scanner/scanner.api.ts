import { queryOptions } from '@tanstack/react-query';
import { ApiError, api } from '../../lib/api';

/** A scanned lot as the server's tag maker answers: held by the signed-in dealer or not. */
export interface ScannedLot {
  code: string;
  held: boolean;
  /** No answer (no signal): whether the dealer holds it is not known. */
  offline?: boolean;
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
 * listed lot. No answer at all (no signal) is told apart: the dealer's own page for the lot
 * still opens, to record a sale that waits for the signal.
 */
export async function lookupScannedLot(code: string): Promise<ScannedLot> {
  try {
    return await api<ScannedLot>(`/api/tags/lots/${encodeURIComponent(code)}`);
  } catch (e) {
    if (e instanceof ApiError && e.status === 0) return { code, held: false, offline: true };
    if (e instanceof ApiError) return { code, held: false };
    throw e;
  }
}
