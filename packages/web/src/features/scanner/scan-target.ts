import { parseLotCode, parseTagPayload } from '@beadroll/core';

/** What a scan or a typed code points at: a lot, and the tag reference when a tag was read. */
export interface ScanTarget {
  code: string;
  ref?: string;
}

const PUBLIC_LINK = /^https?:\/\/[^/?#\s]+\/l\/([0-9a-z-]+)\/?$/i;

/**
 * Reads a tag payload (`HTTPS://HOST/L/CODE/H`), a public page link (`…/l/CODE`) or a typed lot
 * code in any accepted spelling. Returns null for anything else.
 */
export function readScan(text: string): ScanTarget | null {
  const trimmed = text.trim();
  const tag = parseTagPayload(trimmed);
  if (tag) return tag;
  const link = PUBLIC_LINK.exec(trimmed);
  try {
    return { code: parseLotCode(link ? link[1]! : trimmed) };
  } catch {
    return null;
  }
}

/** The public page of a lot; with a tag reference, the page also checks the tag against the roll. */
export function publicPath(target: ScanTarget): string {
  return target.ref ? `/L/${target.code}/${target.ref}` : `/l/${target.code}`;
}
