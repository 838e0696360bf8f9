import { parseLotCode } from '@beadroll/core';

/** The lot a public address names, and the tag reference when it is a tag's address. */
export interface PublicRoute {
  code: string;
  /** The tag reference H as it stands in the address (checked later, in the browser). */
  tagRef: string | null;
}

/**
 * Reads `/l/{code}` and `/L/{code}/{H}` (either case). Returns null for any other path or a code
 * that is not a well-formed lot code; the page then shows the same "not found" as for any code
 * that is not a listed lot.
 */
export function parsePublicPath(pathname: string): PublicRoute | null {
  const m = /^\/[lL]\/([^/]+)(?:\/([^/]+))?\/?$/.exec(pathname);
  if (!m) return null;
  let code: string;
  try {
    code = parseLotCode(decodeURIComponent(m[1]!));
  } catch {
    return null;
  }
  return { code, tagRef: m[2] ? decodeURIComponent(m[2]) : null };
}

/** The API address of a lot's public data. */
export const publicLotPath = (code: string) => `/api/public/lots/${encodeURIComponent(code)}`;
