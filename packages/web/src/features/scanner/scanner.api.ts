import { queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';
import { ApiError } from '../../lib/api';

/** A scanned lot as the server's tag maker answers: held by the signed-in dealer or not. */
export type ScannedLot = Schemas['TagLotResponse'] & {
  /** No answer (no signal): whether the dealer holds it is not known. */
  offline?: boolean;
};

const tagLot = (code: string) => answer(client.GET('/api/tags/lots/{code}', { params: { path: { code } } }));

export const scannerQueries = {
  lot: (code: string) =>
    queryOptions({
      queryKey: ['tags', 'lot', code],
      queryFn: () => tagLot(code),
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
    return await tagLot(code);
  } catch (e) {
    if (e instanceof ApiError && e.status === 0) return { code, held: false, offline: true };
    if (e instanceof ApiError) return { code, held: false };
    throw e;
  }
}
