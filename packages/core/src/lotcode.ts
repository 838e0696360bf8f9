import { hexToBytes } from '@noble/hashes/utils.js';
import { LotCodeError } from './errors.js';
import { secureRandom, type RandomSource } from './random.js';

/** Crockford's Base32 symbols for the values 0–31. */
export const CROCKFORD_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
/** Crockford's extra check symbols for the values 32–36 (never used in lot codes). */
export const CROCKFORD_CHECK_EXTRA = '*~$=U';

const DATA_SYMBOLS = 8;

function normaliseSymbols(text: string): string {
  return text.toUpperCase().replace(/[IL]/g, '1').replace(/O/g, '0');
}

function valueOf(symbol: string): number {
  const v = CROCKFORD_ALPHABET.indexOf(symbol);
  return v;
}

/**
 * Crockford's check symbol for a string of data symbols: the number they spell, modulo 37,
 * written with the 37-symbol check alphabet. Precondition: `symbols` are already normalised
 * Crockford symbols (upper case, no hyphens). Throws {@link LotCodeError} `bad-symbol` otherwise.
 */
export function crockfordCheckSymbol(symbols: string): string {
  let mod = 0;
  for (const s of symbols) {
    const v = valueOf(s);
    if (v < 0) throw new LotCodeError('bad-symbol', `"${s}" is not a Crockford Base32 symbol`);
    mod = (mod * 32 + v) % 37;
  }
  return (CROCKFORD_ALPHABET + CROCKFORD_CHECK_EXTRA)[mod]!;
}

/**
 * Draws a new lot code: 8 random Crockford symbols (40 bits) and the check symbol, redrawn
 * while the check would be one of `* ~ $ = U`, so every code uses only 0–9 and A–Z.
 * Returns the 9-symbol canonical form (no hyphens), as stored in entry headers.
 */
export function generateLotCode(random: RandomSource = secureRandom): string {
  for (;;) {
    const bytes = random(5);
    let bits = 0n;
    for (const b of bytes) bits = (bits << 8n) | BigInt(b);
    let data = '';
    for (let i = DATA_SYMBOLS - 1; i >= 0; i--)
      data += CROCKFORD_ALPHABET[Number((bits >> BigInt(i * 5)) & 31n)];
    const check = crockfordCheckSymbol(data);
    if (CROCKFORD_ALPHABET.includes(check)) return data + check;
  }
}

/**
 * Parses a lot code as a person may type it: case-insensitive, hyphens optional, I and L read
 * as 1, O read as 0. Returns the canonical 9-symbol form. Throws {@link LotCodeError}
 * (`bad-length`, `bad-symbol`, `bad-check`).
 */
export function parseLotCode(text: string): string {
  if (typeof text !== 'string') throw new LotCodeError('bad-symbol', 'a lot code is text');
  const s = normaliseSymbols(text.replace(/-/g, ''));
  if (s.length !== DATA_SYMBOLS + 1) {
    throw new LotCodeError('bad-length', `a lot code has ${DATA_SYMBOLS + 1} symbols, got ${s.length}`);
  }
  for (const ch of s) {
    if (valueOf(ch) < 0) throw new LotCodeError('bad-symbol', `"${ch}" is not a lot-code symbol`);
  }
  const expected = crockfordCheckSymbol(s.slice(0, DATA_SYMBOLS));
  if (expected !== s[DATA_SYMBOLS]) throw new LotCodeError('bad-check', 'the check symbol does not match');
  return s;
}

/** True when `text` parses as a lot code (see {@link parseLotCode}). Never throws. */
export function isLotCode(text: string): boolean {
  try {
    parseLotCode(text);
    return true;
  } catch {
    return false;
  }
}

/** True when `text` is already a canonical 9-symbol lot code (upper case, no hyphens). Never throws. */
export function isCanonicalLotCode(text: unknown): text is string {
  return typeof text === 'string' && /^[0-9A-HJKMNP-TV-Z]{9}$/.test(text) && isLotCode(text);
}

/**
 * Formats a lot code for people: `XXXX-XXXX-X`. Accepts any form {@link parseLotCode} accepts
 * and throws its errors.
 */
export function formatLotCode(text: string): string {
  const s = parseLotCode(text);
  return `${s.slice(0, 4)}-${s.slice(4, 8)}-${s.slice(8)}`;
}

/** Number of Crockford symbols in a tag reference (50 bits of the entry hash). */
export const TAG_REF_SYMBOLS = 10;

/**
 * The tag reference H of an entry: the first 10 Crockford Base32 symbols (the first 50 bits,
 * most significant first) of its 32-byte entry hash. Precondition: `hashHex` is 64 hex digits.
 */
export function tagReference(hashHex: string): string {
  const bytes = hexToBytes(hashHex);
  if (bytes.length !== 32) throw new LotCodeError('bad-length', 'an entry hash has 32 bytes');
  let bits = 0n;
  for (let i = 0; i < 7; i++) bits = (bits << 8n) | BigInt(bytes[i]!);
  // 56 bits read; keep the top 50.
  bits >>= 6n;
  let out = '';
  for (let i = TAG_REF_SYMBOLS - 1; i >= 0; i--)
    out += CROCKFORD_ALPHABET[Number((bits >> BigInt(i * 5)) & 31n)];
  return out;
}

/**
 * Normalises a typed tag reference (case-insensitive, hyphens optional, I/L→1, O→0).
 * Throws {@link LotCodeError} when it is not 10 Crockford symbols.
 */
export function parseTagReference(text: string): string {
  const s = normaliseSymbols(String(text).replace(/-/g, ''));
  if (s.length !== TAG_REF_SYMBOLS)
    throw new LotCodeError('bad-length', `a tag reference has ${TAG_REF_SYMBOLS} symbols`);
  for (const ch of s)
    if (valueOf(ch) < 0) throw new LotCodeError('bad-symbol', `"${ch}" is not a Crockford symbol`);
  return s;
}

/**
 * Finds the entries whose hash starts with the tag reference `ref`. Returns every match in
 * input order (normally exactly one; none means the page no longer holds the tagged entry).
 * Throws {@link LotCodeError} when `ref` is malformed.
 */
export function findEntriesByTagReference<T extends { hash: string }>(
  entries: Iterable<T>,
  ref: string,
): T[] {
  const want = parseTagReference(ref);
  const out: T[] = [];
  for (const e of entries) if (tagReference(e.hash) === want) out.push(e);
  return out;
}

/** Outcome of checking a printed tag against a verified roll. */
export type TagMatch = 'found' | 'missing' | 'mismatch';

/**
 * Checks what a printed tag promised (the entry at `seq` has tag reference `ref`) against the
 * entries of a verified roll: `found` when that entry is there with that prefix, `missing`
 * when the roll is shorter (truncated, or older than the tag), `mismatch` when the entry at
 * `seq` has another hash (the roll was rewritten). Throws {@link LotCodeError} for a
 * malformed `ref`.
 */
export function matchTag(
  entries: ReadonlyArray<{ hash: string }>,
  tag: { seq: number; ref: string },
): TagMatch {
  const want = parseTagReference(tag.ref);
  const e = entries[tag.seq];
  if (!e) return 'missing';
  return tagReference(e.hash) === want ? 'found' : 'mismatch';
}
