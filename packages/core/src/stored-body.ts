import { parseCanonical } from './canonical.js';
import { bodyDigest } from './hash.js';

/** Why a stored body was refused: not canonical JSON, or not the body its header's digest names. */
export interface StoredBodyProblem {
  reason: 'non-canonical' | 'bad-body-digest';
  message: string;
}

/**
 * Reads a stored body string against `digest`, its header's `body` field: canonical form first,
 * then the digest. Never throws; returns the parsed body or the first problem. The body's shape
 * is the caller's to check (it depends on the kind and format version).
 */
export function decodeStoredBody(text: string, digest: string): { body: unknown } | StoredBodyProblem {
  let body: unknown;
  try {
    body = parseCanonical(text);
  } catch (x) {
    return { reason: 'non-canonical', message: `body: ${(x as Error).message}` };
  }
  if (bodyDigest(text) !== digest)
    return { reason: 'bad-body-digest', message: 'the body does not match its digest' };
  return { body };
}
