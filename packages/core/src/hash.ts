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
