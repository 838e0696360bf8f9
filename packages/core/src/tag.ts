import { TagError } from './errors.js';
import { parseLotCode, parseTagReference } from './lotcode.js';

/**
 * The 45 characters of QR alphanumeric mode, in the order of their mode values 0–44
 * (ISO/IEC 18004, table of alphanumeric encoding). Upper case only.
 */
export const QR_ALPHANUMERIC_CHARSET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ $%*+-./:';

/** True when every character of `text` can be encoded in QR alphanumeric mode. Never throws. */
export function isQrAlphanumeric(text: string): boolean {
  for (const ch of text) if (!QR_ALPHANUMERIC_CHARSET.includes(ch)) return false;
  return true;
}

/** QR error-correction levels, from least to most redundancy. */
export type QrEcLevel = 'L' | 'M' | 'Q' | 'H';

/**
 * Alphanumeric-mode capacity in characters of QR versions 1–6 at each error-correction level
 * (index 0 is version 1). Values of ISO/IEC 18004's capacity table, as reproduced in the
 * Panasonic LP-RV series manual (p. 162) and in the alibabacloud "QR code encoding principle"
 * article, both of which agree on every alphanumeric value; they also follow from the data
 * codeword counts with the alphanumeric mode-bit rule (4 mode bits, 9 count bits, 11 bits per
 * pair, 6 for an odd last character). Six versions are enough for any tag: larger symbols do
 * not fit the printed layouts at a scannable module size.
 */
export const QR_ALPHANUMERIC_CAPACITY: Readonly<Record<QrEcLevel, readonly number[]>> = Object.freeze({
  L: Object.freeze([25, 47, 77, 114, 154, 195]),
  M: Object.freeze([20, 38, 61, 90, 122, 154]),
  Q: Object.freeze([16, 29, 47, 67, 87, 108]),
  H: Object.freeze([10, 20, 35, 50, 64, 84]),
});

/** The largest QR version held in {@link QR_ALPHANUMERIC_CAPACITY}. */
export const QR_MAX_TABLED_VERSION = 6;

/**
 * The smallest QR version (1–6) whose alphanumeric capacity at error-correction level `level`
 * holds `length` characters, or `null` when even version 6 is too small. Precondition: the
 * whole text is encoded as one alphanumeric segment; `length` is a non-negative integer.
 */
export function qrVersionForAlphanumeric(length: number, level: QrEcLevel = 'L'): number | null {
  if (!Number.isInteger(length) || length < 0) throw new RangeError('length must be a non-negative integer');
  const row = QR_ALPHANUMERIC_CAPACITY[level];
  if (!row) throw new RangeError(`unknown error-correction level "${String(level)}"`);
  const i = row.findIndex((cap) => cap >= length);
  return i < 0 ? null : i + 1;
}

/**
 * Side of a QR symbol of version `version` in modules, without the quiet zone: 17 + 4 × version
 * (ISO/IEC 18004). Precondition: `version` is an integer 1–40.
 */
export function qrModulesPerSide(version: number): number {
  if (!Number.isInteger(version) || version < 1 || version > 40)
    throw new RangeError('a QR version is an integer from 1 to 40');
  return 17 + 4 * version;
}

/** Width of the quiet zone a QR symbol needs on every side, in modules (ISO/IEC 18004). */
export const QR_QUIET_ZONE_MODULES = 4;

/** The path segment a tag's address starts with: `/L/{CODE}/{H}`. */
export const TAG_PATH_SEGMENT = 'L';

const HOST_LABEL = /^[A-Z0-9](?:[A-Z0-9-]*[A-Z0-9])?$/;

/**
 * Normalises the host of a tag address: upper case, a DNS name or IPv4 address with an optional
 * `:port`. Accepts a bare host (`beads.example`, `127.0.0.1:3000`) or an http(s) origin
 * (`https://beads.example`), from which only the host and port are kept. Throws
 * {@link TagError} `bad-host` for anything else (user info, IPv6 literals, empty labels…).
 */
export function normaliseTagHost(host: string): string {
  if (typeof host !== 'string') throw new TagError('bad-host', 'the host is text');
  let s = host.trim();
  const scheme = /^https?:\/\//i.exec(s);
  if (scheme) {
    s = s.slice(scheme[0].length);
    s = s.replace(/\/+$/, '');
  }
  s = s.toUpperCase();
  const m = /^([^:/]+)(?::(\d{1,5}))?$/.exec(s);
  if (!m) throw new TagError('bad-host', 'a host is a name or address with an optional :port, nothing more');
  const name = m[1]!.replace(/\.$/, '');
  const port = m[2];
  if (name.length === 0 || name.length > 253)
    throw new TagError('bad-host', 'the host name is empty or too long');
  for (const label of name.split('.')) {
    if (label.length === 0 || label.length > 63 || !HOST_LABEL.test(label))
      throw new TagError('bad-host', `"${label}" is not a valid host label`);
  }
  if (port !== undefined && (Number(port) < 1 || Number(port) > 65535))
    throw new TagError('bad-host', 'the port is out of range');
  return port === undefined ? name : `${name}:${port}`;
}

/**
 * The text a tag's QR symbol holds: `HTTPS://{HOST}/L/{CODE}/{H}`, all upper case, so every
 * character is in QR alphanumeric mode and the symbol is as small as it can be. `host` as
 * {@link normaliseTagHost} accepts it; `code` any spelling {@link parseLotCode} accepts; `ref`
 * the tag reference H of the entry the tag is printed at (any spelling
 * {@link parseTagReference} accepts). `scheme` is `https` unless the public site is served
 * over plain HTTP (a local demo), where a tag must say `HTTP` to be followed at all.
 * Throws {@link TagError} or {@link LotCodeError}.
 */
export function tagPayload(
  host: string,
  code: string,
  ref: string,
  scheme: 'https' | 'http' = 'https',
): string {
  const h = normaliseTagHost(host);
  const s = scheme === 'http' ? 'HTTP' : 'HTTPS';
  return `${s}://${h}/${TAG_PATH_SEGMENT}/${parseLotCode(code)}/${parseTagReference(ref)}`;
}

/** What a scanned tag names: the canonical lot code and the tag reference H it was printed at. */
export interface TagPayload {
  code: string;
  ref: string;
}

const PAYLOAD = /^https?:\/\/([^/?#\s]+)\/l\/([0-9a-z-]+)\/([0-9a-z-]+)\/?$/i;

/**
 * Reads a scanned tag: `http(s)://{host}/L/{code}/{H}` in any case, hyphens allowed in the
 * code and the reference (and I/L/O read as Crockford does). Returns the canonical code and H,
 * or `null` for any text that is not a tag address with a valid code and reference. Never
 * throws.
 */
export function parseTagPayload(text: string): TagPayload | null {
  if (typeof text !== 'string') return null;
  const m = PAYLOAD.exec(text.trim());
  if (!m) return null;
  try {
    normaliseTagHost(m[1]!);
    return { code: parseLotCode(m[2]!), ref: parseTagReference(m[3]!) };
  } catch {
    return null;
  }
}

/**
 * The QR version a tag payload gets at error-correction level `level` (default L), or `null`
 * when it needs more than version 6. Throws what {@link tagPayload} throws.
 */
export function tagQrVersion(host: string, level: QrEcLevel = 'L'): number | null {
  // Every payload for one host has the same length: code and H have fixed widths.
  const sample = tagPayload(host, '000000000', '0000000000');
  return qrVersionForAlphanumeric(sample.length, level);
}
