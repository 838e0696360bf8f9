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
function quickCheck(v: unknown, limitIntegers: boolean, depth: number): boolean {
  switch (typeof v) {
    case 'boolean':
      return true;
    case 'string':
      if (!wellFormed(v)) throw UNSURE;
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
        for (let i = 0; i < v.length; i++) if (!quickCheck(v[i], limitIntegers, depth + 1)) sorted = false;
        return sorted;
      }
      const proto = Object.getPrototypeOf(v);
      if (proto !== Object.prototype && proto !== null) throw UNSURE;
      let prev: string | null = null;
      for (const k in v) {
        if (!Object.prototype.hasOwnProperty.call(v, k)) continue;
        if (prev !== null && !(prev < k)) sorted = false;
        prev = k;
        if (!wellFormed(k)) throw UNSURE;
        if (!quickCheck((v as Record<string, unknown>)[k], limitIntegers, depth + 1)) sorted = false;
      }
      return sorted;
    }
    default:
      throw UNSURE;
  }
}

/** {@link checkValue}, by {@link quickCheck} when it can decide. Same result, same errors. */
function check(root: unknown, limitIntegers: boolean): boolean {
  try {
    return quickCheck(root, limitIntegers, 0);
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
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new CanonicalError('not-json', `malformed JSON: ${(e as Error).message}`);
  }
  // Fast path: with keys already in order, JSON.stringify writes exactly what RFC 8785 writes
  // (same number and string rules). Anything else, such as integer-like keys that JavaScript
  // reorders, takes the full serialiser.
  const sorted = check(parsed, true);
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
