import { ApiError, api } from '../../lib/api';

/** What the scanner needs to know about a scanned lot: is it one the signed-in dealer holds? */
export interface ScannedLot {
  code: string;
  held: boolean;
}

/**
 * Asks the server whether the signed-in dealer holds the lot. Any refusal (not found, not
 * theirs, not signed in) means "not held": the scanner then opens the public page, which
 * answers for every listed lot.
 */
export async function lookupScannedLot(code: string): Promise<ScannedLot> {
  try {
    const lot = await api<{ held?: boolean }>(`/api/tags/lots/${encodeURIComponent(code)}`);
    return { code, held: lot.held === true };
  } catch (e) {
    if (e instanceof ApiError) return { code, held: false };
    throw e;
  }
}
