import { bytesToHex, hexToBytes } from '@noble/hashes/utils.js';
import { merkleLeafHash, verifyConsistency, verifyInclusion } from './merkle.js';
import { base64Decode, openCheckpoint, type VerifiedCheckpoint, type VerifierKey } from './note.js';
import { NoteError } from './errors.js';

/** The log path appended to the public host to make the log's origin (and key name). */
export const LOG_ORIGIN_SUFFIX = '/log';

/**
 * The origin of the ledger-wide log for a public base address: its host, with the port when
 * the address names one, then `/log`. Precondition: an absolute http(s) URL.
 */
export function logOrigin(publicBaseUrl: string): string {
  const m = /^(https?):\/\/(?:[^/?#@]*@)?([^/?#]+)/i.exec(publicBaseUrl.trim());
  if (!m) throw new NoteError('bad-checkpoint', 'the public address is not an http(s) URL');
  const scheme = m[1]!.toLowerCase();
  const host = m[2]!.toLowerCase().replace(scheme === 'https' ? /:443$/ : /:80$/, '');
  return `${host}${LOG_ORIGIN_SUFFIX}`;
}

/** The log leaf of an entry: RFC 9162 leaf hash of the 32 bytes of its entry hash (64 hex). */
export function entryLeafHash(entryHashHex: string): Uint8Array {
  return merkleLeafHash(hexToBytes(entryHashHex));
}

/** The inclusion proof of one entry (a roll's head) in the checkpoint it travels with. */
export interface LogInclusion {
  lot: string;
  seq: number;
  logIndex: number;
  /** Proof hashes, base64, leaf side first (RFC 9162 §2.1.3). */
  proof: string[];
}

/** One member of a bundle's `checkpoints` list: a signed checkpoint and inclusion proofs against it. */
export interface BundleCheckpoint {
  /** The signed checkpoint note (log signature and any witness cosignatures). */
  note: string;
  inclusions: LogInclusion[];
}

/** Decodes a list of base64 proof hashes; null when any is not base64 of 32 bytes. */
export function decodeProof(proof: unknown): Uint8Array[] | null {
  if (!Array.isArray(proof)) return null;
  const out: Uint8Array[] = [];
  for (const p of proof) {
    const b = typeof p === 'string' ? base64Decode(p) : null;
    if (!b || b.length !== 32) return null;
    out.push(b);
  }
  return out;
}

/** Result of checking an entry's inclusion in a signed checkpoint. */
export type InclusionCheck =
  | { ok: true; checkpoint: VerifiedCheckpoint }
  | { ok: false; reason: 'bad-checkpoint' | 'bad-signature' | 'not-covered' | 'bad-proof'; message: string };

/**
 * Verifies that the entry with hash `entryHashHex` is leaf `inclusion.logIndex` of the tree
 * the checkpoint `note` signs (RFC 9162 §2.1.3.2), after checking the note's signature with
 * `logKey`. Never throws.
 */
export function checkInclusion(
  note: string,
  entryHashHex: string,
  inclusion: Pick<LogInclusion, 'logIndex' | 'proof'>,
  logKey: VerifierKey,
  witnessKeys: readonly VerifierKey[] = [],
): InclusionCheck {
  let cp: VerifiedCheckpoint;
  try {
    cp = openCheckpoint(note, logKey, witnessKeys);
  } catch (e) {
    const code = e instanceof NoteError && e.code === 'bad-signature' ? 'bad-signature' : 'bad-checkpoint';
    return { ok: false, reason: code, message: e instanceof Error ? e.message : String(e) };
  }
  if (!Number.isSafeInteger(inclusion.logIndex) || inclusion.logIndex < 0 || inclusion.logIndex >= cp.size)
    return {
      ok: false,
      reason: 'not-covered',
      message: `log index ${inclusion.logIndex} is not in a checkpoint of ${cp.size}`,
    };
  const proof = decodeProof(inclusion.proof);
  if (!proof || !/^[0-9a-f]{64}$/.test(entryHashHex))
    return { ok: false, reason: 'bad-proof', message: 'the inclusion proof is malformed' };
  if (!verifyInclusion(entryLeafHash(entryHashHex), inclusion.logIndex, cp.size, proof, cp.root))
    return { ok: false, reason: 'bad-proof', message: 'the entry is not in the log at that index' };
  return { ok: true, checkpoint: cp };
}

/**
 * True when the checkpoint (size1, root1) is a prefix of (size2, root2) by the consistency
 * proof given as base64 hashes (RFC 9162 §2.1.4.2). Never throws.
 */
export function checkConsistency(
  size1: number,
  root1: Uint8Array,
  size2: number,
  root2: Uint8Array,
  proof: unknown,
): boolean {
  const p = decodeProof(proof);
  return p !== null && verifyConsistency(size1, size2, p, root1, root2);
}

/** Hex of a hash, for display and storage. */
export function hashHex(hash: Uint8Array): string {
  return bytesToHex(hash);
}

/** The outcome of checking one inclusion of a bundle checkpoint (§14.5 of the format). */
export interface BundleInclusionResult {
  lot: string;
  seq: number;
  logIndex: number;
  ok: boolean;
  message?: string;
}

/** The outcome of checking a bundle checkpoint. */
export interface BundleCheckpointResult {
  ok: boolean;
  /** Present when the note verified. */
  checkpoint?: VerifiedCheckpoint;
  message?: string;
  inclusions: BundleInclusionResult[];
}

/**
 * Checks one member of a bundle's `checkpoints` (§14.5): the note's log signature, and each
 * inclusion against the entry of that lot and seq among `rolls`. Never throws.
 */
export function verifyBundleCheckpoint(
  member: unknown,
  rolls: ReadonlyArray<{
    lot: string;
    entries: ReadonlyArray<{ hash: string; header: string; logIndex: number | null }>;
  }>,
  logKey: VerifierKey,
  witnessKeys: readonly VerifierKey[] = [],
): BundleCheckpointResult {
  const m = member as Partial<BundleCheckpoint> | null;
  if (!m || typeof m !== 'object' || typeof m.note !== 'string' || !Array.isArray(m.inclusions))
    return { ok: false, message: 'a checkpoint is an object with note and inclusions', inclusions: [] };
  let cp: VerifiedCheckpoint;
  try {
    cp = openCheckpoint(m.note, logKey, witnessKeys);
  } catch (e) {
    return { ok: false, message: e instanceof Error ? e.message : String(e), inclusions: [] };
  }
  const inclusions = m.inclusions.map((x): BundleInclusionResult => {
    const inc = x as Partial<LogInclusion>;
    const base = { lot: String(inc.lot), seq: Number(inc.seq), logIndex: Number(inc.logIndex) };
    const roll = rolls.find((r) => r.lot === inc.lot);
    const entry = roll?.entries.find((e) => (JSON.parse(e.header) as { seq: number }).seq === inc.seq);
    if (!entry) return { ...base, ok: false, message: 'no such entry in the bundle' };
    if (entry.logIndex !== inc.logIndex)
      return { ...base, ok: false, message: 'the entry has another log index' };
    const r = checkInclusion(
      m.note!,
      entry.hash,
      { logIndex: base.logIndex, proof: inc.proof ?? [] },
      logKey,
    );
    return r.ok ? { ...base, ok: true } : { ...base, ok: false, message: r.message };
  });
  return { ok: inclusions.every((i) => i.ok), checkpoint: cp, inclusions };
}
