import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';

/**
 * SHA-256 of the UTF-8 encoding of `text`, as 64 lower-case hex digits.
 * Precondition: `text` is a well-formed string (lone surrogates are encoded as U+FFFD).
 */
export function sha256HexOfText(text: string): string {
  return bytesToHex(sha256(utf8ToBytes(text)));
}

/**
 * SHA-256 of raw bytes, as 64 lower-case hex digits.
 */
export function sha256HexOfBytes(bytes: Uint8Array): string {
  return bytesToHex(sha256(bytes));
}

/**
 * Domain-separation tags of format version 1. Each hash input is
 * `UTF-8(tag) || 0x00 || data`; no tag is a prefix of another, and none starts with the
 * byte 0x00 or 0x01 that RFC 6962 Merkle hashing uses.
 */
export const DOMAIN = {
  entry: 'beadroll/v1/entry',
  body: 'beadroll/v1/body',
  sealedField: 'beadroll/v1/sealed-field',
  sealedRoot: 'beadroll/v1/sealed-root',
} as const;

/** Name of a domain-separation tag in {@link DOMAIN}. */
export type Domain = keyof typeof DOMAIN;

const tagBytes: Record<Domain, Uint8Array> = {
  entry: tagged(DOMAIN.entry),
  body: tagged(DOMAIN.body),
  sealedField: tagged(DOMAIN.sealedField),
  sealedRoot: tagged(DOMAIN.sealedRoot),
};

function tagged(tag: string): Uint8Array {
  const t = utf8ToBytes(tag);
  const out = new Uint8Array(t.length + 1);
  out.set(t);
  return out;
}

/**
 * Domain-separated SHA-256: SHA-256(UTF-8(DOMAIN[domain]) || 0x00 || UTF-8(text)), as hex.
 * Precondition: `text` is the exact canonical string being committed to.
 */
export function domainHash(domain: Domain, text: string): string {
  const tag = tagBytes[domain];
  // One reusable buffer: a UTF-8 string takes at most 3 bytes per UTF-16 code unit.
  const need = tag.length + text.length * 3;
  if (scratch.length < need) scratch = new Uint8Array(Math.max(need, scratch.length * 2));
  scratch.set(tag);
  const { written } = encoder.encodeInto(text, scratch.subarray(tag.length));
  return bytesToHex(sha256(scratch.subarray(0, tag.length + written)));
}

interface Utf8Encoder {
  encodeInto(text: string, into: Uint8Array): { written: number };
}
// TextEncoder exists in every browser and in Node; the core's type library lists no DOM.
const encoder: Utf8Encoder = new (
  globalThis as unknown as { TextEncoder: new () => Utf8Encoder }
).TextEncoder();
let scratch = new Uint8Array(4096);

/** Entry hash of a canonical header string (domain `entry`), as 64 lower-case hex digits. */
export function entryHash(canonicalHeader: string): string {
  return domainHash('entry', canonicalHeader);
}

/** Body digest of a canonical body string (domain `body`), as 64 lower-case hex digits. */
export function bodyDigest(canonicalBody: string): string {
  return domainHash('body', canonicalBody);
}
