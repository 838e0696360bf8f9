import canonicalize from 'canonicalize';
import { CanonicalError } from './errors.js';

const LONE_SURROGATE = /\p{Cs}/u;

/** True when `s` has no lone surrogate; the engine's own check where it has one. */
const wellFormed: (s: string) => boolean =
  typeof (String.prototype as { isWellFormed?: unknown }).isWellFormed === 'function'
    ? (s) => (s as unknown as { isWellFormed(): boolean }).isWellFormed()
    : (s) => !LONE_SURROGATE.test(s);

/** A value waiting to be checked, and where it sits (the path is written only for an error). */
interface Frame {
  v: unknown;
  parent: Frame | null;
  key: string | number | null;
}

function pathOf(f: Frame): string {
  const chain: Frame[] = [];
  for (let at: Frame | null = f; at && at.key !== null; at = at.parent) chain.push(at);
  let path = '';
  for (let i = chain.length - 1; i >= 0; i--) {
    const key = chain[i]!.key!;
    path = typeof key === 'number' ? `${path}[${key}]` : path ? `${path}.${key}` : key;
  }
  return path;
}

/** Thrown by {@link quickCheck} when it leaves the decision to {@link checkValue}. */
const UNSURE = Symbol('unsure');
const QUICK_DEPTH = 200;

/**
 * The common case of {@link checkValue}, recursive and allocation-free: returns whether every
 * object's keys are in order, or throws {@link UNSURE} at anything {@link checkValue} must look
 * at (a bad value, or nesting deeper than {@link QUICK_DEPTH}), which then decides and words the error.
 */
function quickCheck(v: unknown, limitIntegers: boolean, depth: number, strings = true): boolean {
  switch (typeof v) {
    case 'boolean':
      return true;
    case 'string':
      if (strings && !wellFormed(v)) throw UNSURE;
      return true;
    case 'number':
      if (!Number.isFinite(v) || (limitIntegers && Number.isInteger(v) && !Number.isSafeInteger(v)))
        throw UNSURE;
      return true;
    case 'object': {
      if (v === null) return true;
      if (depth > QUICK_DEPTH) throw UNSURE;
      let sorted = true;
      if (Array.isArray(v)) {
        for (let i = 0; i < v.length; i++)
          if (!quickCheck(v[i], limitIntegers, depth + 1, strings)) sorted = false;
        return sorted;
      }
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) throw UNSURE;
      let prev: string | null = null;
      for (const k in v) {
        if (!Object.prototype.hasOwnProperty.call(v, k)) continue;
        if (prev !== null && !(prev < k)) sorted = false;
        prev = k;
        if (strings && !wellFormed(k)) throw UNSURE;
        if (!quickCheck((v as Record<string, unknown>)[k], limitIntegers, depth + 1, strings)) sorted = false;
      }
      return sorted;
    }
    default:
      throw UNSURE;
  }
}

/** {@link checkValue}, by {@link quickCheck} when it can decide. Same result, same errors. */
function check(root: unknown, limitIntegers: boolean, strings = true): boolean {
  try {
    return quickCheck(root, limitIntegers, 0, strings);
  } catch (e) {
    if (e !== UNSURE) throw e;
    return checkValue(root, limitIntegers);
  }
}

/** Returns true when every object's keys are already in RFC 8785 (UTF-16 code unit) order. */
function checkValue(root: unknown, limitIntegers: boolean): boolean {
  let sorted = true;
  const stack: Frame[] = [{ v: root, parent: null, key: null }];
  while (stack.length > 0) {
    const f = stack.pop()!;
    const v = f.v;
    if (v === null || typeof v === 'boolean') continue;
    if (typeof v === 'string') {
      if (!wellFormed(v))
        throw new CanonicalError('unsupported-value', `lone surrogate in string at ${pathOf(f) || '(root)'}`);
      continue;
    }
    if (typeof v === 'number') {
      if (!Number.isFinite(v))
        throw new CanonicalError('unsafe-number', `non-finite number at ${pathOf(f) || '(root)'}`);
      if (limitIntegers && Number.isInteger(v) && !Number.isSafeInteger(v)) {
        throw new CanonicalError('unsafe-number', `integer outside ±(2^53−1) at ${pathOf(f) || '(root)'}`);
      }
      continue;
    }
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], parent: f, key: i });
      continue;
    }
    if (typeof v === 'object') {
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) {
        throw new CanonicalError('unsupported-value', `not a plain object at ${pathOf(f) || '(root)'}`);
      }
      let prev: string | null = null;
      for (const k of Object.keys(v)) {
        if (prev !== null && !(prev < k)) sorted = false;
        prev = k;
        if (!wellFormed(k))
          throw new CanonicalError('unsupported-value', `lone surrogate in key at ${pathOf(f)}`);
        stack.push({ v: (v as Record<string, unknown>)[k], parent: f, key: k });
      }
      continue;
    }
    throw new CanonicalError(
      'unsupported-value',
      `${typeof v} is not a JSON value at ${pathOf(f) || '(root)'}`,
    );
  }
  return sorted;
}

/**
 * Plain RFC 8785 (JSON Canonicalization Scheme) serialisation of a JSON value, without the
 * ledger's integer limit. Use it for interoperability checks; entries use {@link canonicalise}.
 * Preconditions: `value` is built from null, booleans, finite numbers, well-formed strings,
 * arrays and plain objects. Throws {@link CanonicalError} otherwise.
 */
export function canonicaliseJcs(value: unknown): string {
  check(value, false);
  return serialise(value);
}

/**
 * Ledger canonical JSON: RFC 8785 with one extra rule — every integer-valued number must be a
 * safe integer (|n| ≤ 2^53 − 1), so every language reads the same value.
 * Preconditions: as {@link canonicaliseJcs}. Throws {@link CanonicalError} (`unsafe-number`,
 * `unsupported-value`).
 */
export function canonicalise(value: unknown): string {
  check(value, true);
  return serialise(value);
}

function serialise(value: unknown): string {
  try {
    const out = canonicalize(value);
    if (typeof out !== 'string') throw new CanonicalError('unsupported-value', 'value has no JSON form');
    return out;
  } catch (e) {
    if (e instanceof CanonicalError) throw e;
    throw new CanonicalError('unsupported-value', (e as Error).message);
  }
}

/**
 * Parses `text` as JSON and checks that it is exactly the ledger canonical form of its own
 * parse. Returns the parsed value. Throws {@link CanonicalError}: `not-json` (malformed),
 * `unsafe-number`, `unsupported-value` or `non-canonical` (valid JSON written another way,
 * including a duplicated key).
 */
export function parseCanonical(text: string): unknown {
  if (typeof text !== 'string') throw new CanonicalError('not-json', 'expected a string');
  // Fastest path: one reading that both builds the value and sees that the text is canonical.
  const read = readCanonical(text);
  if (read !== UNDECIDED) return read;
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new CanonicalError('not-json', `malformed JSON: ${(e as Error).message}`);
  }
  // Every string and key of the parse is a piece of `text` between quotes, or is written with
  // escapes: when the text is well-formed and has no \u escape, so is each of them.
  const sorted = check(parsed, true, !(text.indexOf('\\u') === -1 && wellFormed(text)));
  // Fast path: with keys already in order, JSON.stringify writes exactly what RFC 8785 writes
  // (same number and string rules). Anything else, such as integer-like keys that JavaScript
  // reorders, takes the full serialiser.
  if (sorted && fastStringify(parsed) === text) return parsed;
  const again = serialise(parsed);
  if (again !== text)
    throw new CanonicalError('non-canonical', 'text differs from the canonical form of its parse');
  return parsed;
}

function fastStringify(v: unknown): string | null {
  try {
    return JSON.stringify(v);
  } catch {
    return null; // too deep for the engine's recursive writer; the full serialiser decides
  }
}

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
/** What {@link readCanonical} returns when it leaves the decision to the full check. */
const UNDECIDED: unique symbol = Symbol('undecided');
const READ_DEPTH = 100;
/** The text being read by {@link readCanonical} and the position in it. */
let src = '';
let at = 0;
/** True when {@link src} holds no backslash, no control character and no lone surrogate. */
let plain = false;
/** A backslash or a control character (anything outside space to U+FFFF but the backslash). */
const ESCAPE_OR_CONTROL = /[^ -[\]-\uffff]/;

/**
 * Reads `text` as JSON in one pass and returns its value, exactly as JSON.parse would build it
 * (the same members in the same order), but only when the same pass shows that the text is the
 * ledger canonical form of that value: no white space; keys, compared as UTF-16 code units,
 * strictly increasing and written without escapes; strings holding only well-formed characters
 * as themselves and the short escapes the canonical form writes; numbers that are integers of at
 * most 15 digits, written without a leading zero; nesting at most {@link READ_DEPTH} deep.
 * Anything else gives {@link UNDECIDED}, and the full check (JSON.parse, then the RFC 8785
 * serialiser) decides, so both paths accept exactly the same texts with the same values.
 */
function readCanonical(text: string): unknown {
  src = text;
  at = 0;
  // The usual text has no escape, no control character and no lone surrogate: each of its
  // strings then simply runs to the next quote.
  plain = !ESCAPE_OR_CONTROL.test(text) && wellFormed(text);
  const v = readValue(0);
  const done = at === text.length;
  src = '';
  return done ? v : UNDECIDED;
}

/**
 * Reads one JSON value of `text` from index `start` as {@link readCanonical} reads a whole text,
 * for a caller that reads the text around it. Returns the value when that piece is written the
 * canonical way (its end is then {@link endOfCanonicalRead}), or undefined when it cannot tell.
 */
export function readCanonicalAt(text: string, start: number): unknown {
  src = text;
  at = start;
  plain = false;
  const v = readValue(0);
  readEnd = at;
  src = '';
  return v === UNDECIDED ? undefined : v;
}

/** Where the value read by the last {@link readCanonicalAt} ends in its text. */
export function endOfCanonicalRead(): number {
  return readEnd;
}

let readEnd = 0;

function readValue(depth: number): unknown {
  const c = src.charCodeAt(at);
  switch (c) {
    case QUOTE:
      return readString();
    case 0x7b: // {
      return depth < READ_DEPTH ? readObject(depth + 1) : UNDECIDED;
    case 0x5b: // [
      return depth < READ_DEPTH ? readArray(depth + 1) : UNDECIDED;
    case 0x74: // t
      if (!src.startsWith('true', at)) return UNDECIDED;
      at += 4;
      return true;
    case 0x66: // f
      if (!src.startsWith('false', at)) return UNDECIDED;
      at += 5;
      return false;
    case 0x6e: // n
      if (!src.startsWith('null', at)) return UNDECIDED;
      at += 4;
      return null;
    default:
      return readNumber();
  }
}

function readObject(depth: number): unknown {
  at++;
  const o: Record<string, unknown> = {};
  if (src.charCodeAt(at) === 0x7d) {
    at++;
    return o;
  }
  let prev = '';
  for (let first = true; ; first = false) {
    if (src.charCodeAt(at) !== QUOTE) return UNDECIDED;
    const k = readKey();
    // A repeated or unordered key is not canonical; `__proto__` would set the prototype here
    // where JSON.parse makes a member, so the full check reads it.
    if (k === null || (!first && !(prev < k)) || k === '__proto__') return UNDECIDED;
    if (src.charCodeAt(at) !== 0x3a) return UNDECIDED;
    at++;
    const v = readValue(depth);
    if (v === UNDECIDED) return UNDECIDED;
    o[k] = v;
    prev = k;
    const c = src.charCodeAt(at++);
    if (c === 0x7d) return o;
    if (c !== 0x2c) return UNDECIDED;
  }
}

function readArray(depth: number): unknown {
  at++;
  const a: unknown[] = [];
  if (src.charCodeAt(at) === 0x5d) {
    at++;
    return a;
  }
  for (;;) {
    const v = readValue(depth);
    if (v === UNDECIDED) return UNDECIDED;
    a.push(v);
    const c = src.charCodeAt(at++);
    if (c === 0x5d) return a;
    if (c !== 0x2c) return UNDECIDED;
  }
}

/** A key: a string of plain characters (no escape), or null. */
function readKey(): string | null {
  const start = ++at;
  const end = plainRun(start);
  if (src.charCodeAt(end) !== QUOTE) return null;
  at = end + 1;
  return keptText(src, start, end);
}

/**
 * `text.slice(start, end)`, or an equal string returned before. Texts repeat the same few keys
 * and names: the string kept for a piece of this length and first and last characters is taken
 * again when it is the same, saving a copy, and its lookup as a name is quicker the next time.
 */
export function keptText(text: string, start: number, end: number): string {
  const length = end - start;
  const slot = (length * 31 + text.charCodeAt(start) * 7 + text.charCodeAt(end - 1)) & (KEPT_SLOTS - 1);
  const kept = keptTexts[slot]!;
  if (kept.length === length) {
    let i = 0;
    while (i < length && kept.charCodeAt(i) === text.charCodeAt(start + i)) i++;
    if (i === length) return kept;
  }
  const piece = text.slice(start, end);
  keptTexts[slot] = piece;
  return piece;
}

const KEPT_SLOTS = 256;
const keptTexts: string[] = new Array<string>(KEPT_SLOTS).fill('');

/**
 * The end of the run of characters from `i` that the canonical form writes as themselves:
 * anything but a quote, a backslash, a control character or a lone surrogate.
 */
function plainRun(i: number): number {
  if (plain) {
    const end = src.indexOf('"', i);
    return end < 0 ? src.length : end;
  }
  const n = src.length;
  for (; i < n; i++) {
    const c = src.charCodeAt(i);
    if (c === QUOTE || c === BACKSLASH || c < 0x20) return i;
    if (c >= 0xd800 && c <= 0xdfff) {
      // A high surrogate followed by a low one is one character; anything else is lone.
      const d = src.charCodeAt(i + 1);
      if (c > 0xdbff || !(d >= 0xdc00 && d <= 0xdfff)) return i;
      i++;
    }
  }
  return i;
}

function readString(): unknown {
  const start = ++at;
  let end = plainRun(start);
  let out = src.slice(start, end);
  // The short escapes are read here; a \u escape is left to the full check.
  while (src.charCodeAt(end) === BACKSLASH) {
    const ch = SHORT_ESCAPED[src.charCodeAt(end + 1)];
    if (ch === undefined) return UNDECIDED;
    const from = end + 2;
    end = plainRun(from);
    out += ch + src.slice(from, end);
  }
  if (src.charCodeAt(end) !== QUOTE) return UNDECIDED;
  at = end + 1;
  return out;
}

/** What each short escape stands for, by the code unit after its backslash. */
const SHORT_ESCAPED: Record<number, string> = {
  0x22: '"',
  0x5c: '\\',
  0x62: '\b',
  0x66: '\f',
  0x6e: '\n',
  0x72: '\r',
  0x74: '\t',
};

/**
 * An integer of 1 to 15 digits with no leading zero, maybe negative, or 0, as the canonical form
 * writes it; other numbers are left to the full check.
 */
function readNumber(): unknown {
  let c = src.charCodeAt(at);
  if (c === 0x30) {
    c = src.charCodeAt(++at);
    return c === 0x2e || c === 0x65 || c === 0x45 || (c >= 0x30 && c <= 0x39) ? UNDECIDED : 0;
  }
  const negative = c === 0x2d;
  if (negative) c = src.charCodeAt(++at);
  const from = at;
  let value = 0;
  for (; c >= 0x30 && c <= 0x39; c = src.charCodeAt(++at)) value = value * 10 + (c - 0x30);
  const digits = at - from;
  if (digits === 0 || digits > 15 || src.charCodeAt(from) === 0x30 || c === 0x2e || c === 0x65 || c === 0x45)
    return UNDECIDED;
  return negative ? -value : value;
}
