import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';

/** One-shot SHA-256 of bytes as lower-case hex, from the host's own crypto library. */
type HostSha256 = (bytes: Uint8Array) => string;

/**
 * In Node (20.16 and later) the digest comes from node:crypto, which hashes several times
 * faster than script; it is reached through `process.getBuiltinModule`, so nothing is imported
 * and a browser bundle is unaffected. Elsewhere (browsers, where WebCrypto only hashes
 * asynchronously) @noble/hashes computes it. Both are SHA-256 (FIPS 180-4): the same bytes give
 * the same digest, whichever runs.
 */
const hostSha256: HostSha256 | null = (() => {
  type NodeCrypto = {
    hash?: (algorithm: string, data: Uint8Array, encoding: 'hex') => string;
    createHash?: (algorithm: string) => { update(d: Uint8Array): { digest(e: 'hex'): string } };
  };
  try {
    const proc = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
    const c = proc?.getBuiltinModule?.('node:crypto') as NodeCrypto | undefined;
    if (typeof c?.hash === 'function') {
      const hash = c.hash;
      return (bytes) => hash('sha256', bytes, 'hex');
    }
    if (typeof c?.createHash === 'function') {
      const createHash = c.createHash;
      return (bytes) => createHash('sha256').update(bytes).digest('hex');
    }
  } catch {
    // no host library: script it is
  }
  return null;
})();

/**
 * The host's one-shot SHA-256 of a string's UTF-8 encoding (node:crypto `hash`, which encodes
 * natively and, like TextEncoder, writes a lone surrogate as U+FFFD), or null where there is none.
 */
const hostSha256OfText: ((text: string) => string) | null = (() => {
  try {
    const proc = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
    const c = proc?.getBuiltinModule?.('node:crypto') as
      { hash?: (algorithm: string, data: string, encoding: 'hex') => string } | undefined;
    if (typeof c?.hash === 'function') {
      const hash = c.hash;
      return (text) => hash('sha256', text, 'hex');
    }
  } catch {
    // no host library
  }
  return null;
})();

function sha256Hex(bytes: Uint8Array): string {
  return hostSha256 ? hostSha256(bytes) : bytesToHex(sha256(bytes));
}

/**
 * SHA-256 of the UTF-8 encoding of `text`, as 64 lower-case hex digits.
 * Precondition: `text` is a well-formed string (lone surrogates are encoded as U+FFFD).
 */
export function sha256HexOfText(text: string): string {
  return sha256Hex(utf8ToBytes(text));
}

/**
 * SHA-256 of raw bytes, as 64 lower-case hex digits.
 */
export function sha256HexOfBytes(bytes: Uint8Array): string {
  return sha256Hex(bytes);
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

const tagText: Record<Domain, string> = {
  entry: DOMAIN.entry + '\0',
  body: DOMAIN.body + '\0',
  sealedField: DOMAIN.sealedField + '\0',
  sealedRoot: DOMAIN.sealedRoot + '\0',
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
  if (hostSha256OfText) return hostSha256OfText(tagText[domain] + text);
  const tag = tagBytes[domain];
  // One reusable buffer: a UTF-8 string takes at most 3 bytes per UTF-16 code unit.
  const need = tag.length + text.length * 3;
  if (scratch.length < need) scratch = new Uint8Array(Math.max(need, scratch.length * 2));
  scratch.set(tag);
  const { written } = encoder.encodeInto(text, scratch.subarray(tag.length));
  return sha256Hex(scratch.subarray(0, tag.length + written));
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
