import canonicalize from 'canonicalize';
import { CanonicalError } from './errors.js';

const LONE_SURROGATE = /\p{Cs}/u;

/** Returns true when every object's keys are already in RFC 8785 (UTF-16 code unit) order. */
function checkValue(root: unknown, limitIntegers: boolean): boolean {
  let sorted = true;
  const stack: Array<{ v: unknown; path: string }> = [{ v: root, path: '' }];
  while (stack.length > 0) {
    const { v, path } = stack.pop()!;
    if (v === null || typeof v === 'boolean') continue;
    if (typeof v === 'string') {
      if (LONE_SURROGATE.test(v))
        throw new CanonicalError('unsupported-value', `lone surrogate in string at ${path || '(root)'}`);
      continue;
    }
    if (typeof v === 'number') {
      if (!Number.isFinite(v))
        throw new CanonicalError('unsafe-number', `non-finite number at ${path || '(root)'}`);
      if (limitIntegers && Number.isInteger(v) && !Number.isSafeInteger(v)) {
        throw new CanonicalError('unsafe-number', `integer outside ±(2^53−1) at ${path || '(root)'}`);
      }
      continue;
    }
    if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], path: `${path}[${i}]` });
      continue;
    }
    if (typeof v === 'object') {
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) {
        throw new CanonicalError('unsupported-value', `not a plain object at ${path || '(root)'}`);
      }
      let prev: string | null = null;
      for (const k of Object.keys(v)) {
        if (prev !== null && !(prev < k)) sorted = false;
        prev = k;
        if (LONE_SURROGATE.test(k))
          throw new CanonicalError('unsupported-value', `lone surrogate in key at ${path}`);
        stack.push({ v: (v as Record<string, unknown>)[k], path: path ? `${path}.${k}` : k });
      }
      continue;
    }
    throw new CanonicalError('unsupported-value', `${typeof v} is not a JSON value at ${path || '(root)'}`);
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
  checkValue(value, false);
  return serialise(value);
}

/**
 * Ledger canonical JSON: RFC 8785 with one extra rule — every integer-valued number must be a
 * safe integer (|n| ≤ 2^53 − 1), so every language reads the same value.
 * Preconditions: as {@link canonicaliseJcs}. Throws {@link CanonicalError} (`unsafe-number`,
 * `unsupported-value`).
 */
export function canonicalise(value: unknown): string {
  checkValue(value, true);
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
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new CanonicalError('not-json', `malformed JSON: ${(e as Error).message}`);
  }
  // Fast path: with keys already in order, JSON.stringify writes exactly what RFC 8785 writes
  // (same number and string rules). Anything else, such as integer-like keys that JavaScript
  // reorders, takes the full serialiser.
  const sorted = checkValue(parsed, true);
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
