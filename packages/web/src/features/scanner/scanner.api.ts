import { queryOptions } from '@tanstack/react-query';
import { answer, client } from '../../api/client';
import type { Schemas } from '../../api/types';
import { ApiError } from '../../lib/api';

/** A scanned lot as the server's tag maker answers: held by the signed-in dealer or not. */
export type ScannedLot = Schemas['TagLotResponse'];

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
 * listed lot.
 */
export async function lookupScannedLot(code: string): Promise<ScannedLot> {
  try {
    return await tagLot(code);
  } catch (e) {
    if (e instanceof ApiError) return { code, held: false };
    throw e;
  }
}
