import { bytesToHex } from '@noble/hashes/utils.js';
import { canonicalise } from './canonical.js';
import { ValidationError } from './errors.js';
import { domainHash } from './hash.js';
import { secureRandom, type RandomSource } from './random.js';
import type { SealedFieldName, SealedValues } from './types.js';
import { isHex64, sealedValueIssues } from './validate.js';

/** One sealed field as the recording dealer keeps it: never exported in a public bundle. */
export interface SealedField {
  name: SealedFieldName;
  /** 128 random bits, 32 lower-case hex digits; fresh for every field. */
  salt: string;
  value: unknown;
  /** {@link sealedFieldCommitment} of name, salt and value. */
  commitment: string;
}

/** The sealed fields of one entry and the root that goes in its header. */
export interface SealedSet {
  root: string;
  fields: SealedField[];
}

/**
 * Proof that one sealed field of an entry held a value, without revealing the others: the
 * field itself and the commitments of every field of that entry.
 */
export interface SealedDisclosure {
  name: SealedFieldName;
  salt: string;
  value: unknown;
  commitments: Record<string, string>;
}

/**
 * Commitment to one sealed field:
 * SHA-256("beadroll/v1/sealed-field" || 0x00 || canonical {"name","salt","value"}), hex.
 * Preconditions: `salt` is 32 hex digits; `value` is ledger-canonicalisable.
 */
export function sealedFieldCommitment(name: string, salt: string, value: unknown): string {
  return domainHash('sealedField', canonicalise({ name, salt, value }));
}

/**
 * Root of an entry's sealed fields:
 * SHA-256("beadroll/v1/sealed-root" || 0x00 || canonical {name: commitment, ...}), hex.
 * Precondition: at least one field; every commitment is 64 hex digits.
 */
export function sealedRoot(commitments: Record<string, string>): string {
  return domainHash('sealedRoot', canonicalise(commitments));
}

/**
 * Seals private values for one entry: validates each against its field type, draws a fresh
 * 128-bit salt per field from `random`, and returns the fields and their root. Throws
 * {@link ValidationError} (code `bad-sealed`) for unknown names, bad values or an empty set.
 */
export function sealFields(values: SealedValues, random: RandomSource = secureRandom): SealedSet {
  const names = Object.keys(values).sort() as SealedFieldName[];
  const issues = names.flatMap((n) => sealedValueIssues(n, values[n]));
  if (names.length === 0) issues.push({ path: 'sealed', message: 'must hold at least one field' });
  if (issues.length > 0) throw new ValidationError(issues, 'bad-sealed');
  const fields = names.map((name) => {
    const salt = bytesToHex(random(16));
    const value = values[name];
    return { name, salt, value, commitment: sealedFieldCommitment(name, salt, value) };
  });
  return { root: sealedRoot(Object.fromEntries(fields.map((f) => [f.name, f.commitment]))), fields };
}

/**
 * Builds the disclosure of one field from an entry's sealed set. Throws
 * {@link ValidationError} when the set has no such field.
 */
export function discloseSealedField(set: SealedSet, name: SealedFieldName): SealedDisclosure {
  const f = set.fields.find((x) => x.name === name);
  if (!f)
    throw new ValidationError([{ path: `sealed.${name}`, message: 'is not in this entry' }], 'bad-sealed');
  return {
    name,
    salt: f.salt,
    value: f.value,
    commitments: Object.fromEntries(set.fields.map((x) => [x.name, x.commitment])),
  };
}

/**
 * Checks a disclosure against the `sealed` root of a verified header: the field's commitment
 * is recomputed and must appear under its name, and the commitments must hash to the root.
 * Returns false on any mismatch or malformed input; never throws.
 */
export function verifySealedDisclosure(d: SealedDisclosure, headerSealedRoot: string): boolean {
  try {
    if (!isHex64(headerSealedRoot) || typeof d.salt !== 'string' || !/^[0-9a-f]{32}$/.test(d.salt))
      return false;
    if (d.commitments[d.name] !== sealedFieldCommitment(d.name, d.salt, d.value)) return false;
    if (!Object.values(d.commitments).every(isHex64)) return false;
    return sealedRoot(d.commitments) === headerSealedRoot;
  } catch {
    return false;
  }
}

/**
 * Opens a stored sealed set: recomputes every commitment and the root, and compares with the
 * header's root. Returns false on any mismatch; never throws.
 */
export function openSealedFields(set: SealedSet, headerSealedRoot: string): boolean {
  try {
    for (const f of set.fields)
      if (sealedFieldCommitment(f.name, f.salt, f.value) !== f.commitment) return false;
    return sealedRoot(Object.fromEntries(set.fields.map((f) => [f.name, f.commitment]))) === headerSealedRoot;
  } catch {
    return false;
  }
}
