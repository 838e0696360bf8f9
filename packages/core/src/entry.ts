import { bytesToHex } from '@noble/hashes/utils.js';
import { canonicalise, parseCanonical } from './canonical.js';
import { CanonicalError, ValidationError, type FieldIssue } from './errors.js';
import { factsOf } from './facts.js';
import { bodyDigest, entryHash } from './hash.js';
import { isCanonicalLotCode } from './lotcode.js';
import { secureRandom, type RandomSource } from './random.js';
import type { RollHead } from './rules.js';
import { sealFields, type SealedSet } from './sealed.js';
import {
  ENTRY_KINDS,
  FORMAT_VERSION,
  FORMAT_VERSIONS,
  GENESIS_PREV,
  type AnyBody,
  type BodyFields,
  type EntryHeader,
  type EntryKind,
  type FormatVersion,
  type ParentRef,
  type SealedValues,
} from './types.js';
import { bodyBoundIssues, sealedBoundIssues } from './bounds.js';
import { bodyIssues, factsIssues, isActorId, isEntryTime, isHex64 } from './validate.js';

/** An entry as stored and exported: the exact canonical strings and the claimed entry hash. */
export interface StoredEntry {
  hash: string;
  header: string;
  /** The canonical body string, or null when it was redacted (or withheld from a link-only roll). */
  body: string | null;
}

/** What a caller supplies to append an entry. The nonce, salts, seq, prev and digests are added. */
export interface EntryDraft<K extends EntryKind = EntryKind> {
  /** Required for seq 0 (no head); otherwise must equal the head's lot when given. */
  lot?: string;
  kind: K;
  time: string;
  actor: string;
  body: BodyFields<K>;
  parents?: ParentRef[];
  sealed?: SealedValues;
}

/** A built entry: what to store (strings, hash) and the decoded parts. */
export interface BuiltEntry {
  stored: StoredEntry;
  header: EntryHeader;
  body: AnyBody;
  /** Sealed fields with their salts (keep private), or null. */
  sealed: SealedSet | null;
}

/** Every key a version-1 header may have. */
const HEADER_KEYS_V1 = [
  'v',
  'lot',
  'seq',
  'kind',
  'time',
  'actor',
  'prev',
  'parents',
  'body',
  'sealed',
] as const;

/** Every key a header may have, by format version (version 2 adds the required `facts`; version 3 keeps them). */
export const HEADER_KEYS: Readonly<Record<FormatVersion, readonly string[]>> = {
  1: HEADER_KEYS_V1,
  2: [...HEADER_KEYS_V1, 'facts'],
  3: [...HEADER_KEYS_V1, 'facts'],
};

/** Kinds that format version 2 added: a version-1 header naming one is `bad-header`. */
export const VERSION_2_KINDS: readonly EntryKind[] = ['sale-voided'];

/** Kinds that format version 3 added: a version-1 or version-2 header naming one is `bad-header`. */
export const VERSION_3_KINDS: readonly EntryKind[] = ['opinion-requested', 'opinion-request-closed'];

/** The first format version that has `kind` (1 for the kinds every version has). */
export function kindSince(kind: EntryKind): FormatVersion {
  if (VERSION_3_KINDS.includes(kind)) return 3;
  if (VERSION_2_KINDS.includes(kind)) return 2;
  return 1;
}

/** Kinds whose bodies can never be redacted, so a missing one always breaks the roll. */
export const NEVER_REDACTED: readonly EntryKind[] = ['registered', 'split', 'combined', 'redacted'];

function parentIssues(parents: unknown, path: string): FieldIssue[] {
  if (!Array.isArray(parents) || parents.length === 0) return [{ path, message: 'must be a non-empty list' }];
  const out: FieldIssue[] = [];
  parents.forEach((p, i) => {
    const o = p as Record<string, unknown>;
    const keys = p && typeof p === 'object' && !Array.isArray(p) ? Object.keys(o).sort().join(',') : '';
    if (
      keys !== 'hash,lot,seq' ||
      !isCanonicalLotCode(o.lot) ||
      !Number.isSafeInteger(o.seq) ||
      (o.seq as number) < 0 ||
      !isHex64(o.hash)
    ) {
      out.push({ path: `${path}[${i}]`, message: 'must be {lot, seq, hash} naming an entry of another lot' });
    }
  });
  const lots = parents.map((p) => (p as Record<string, unknown> | null)?.lot);
  if (out.length === 0 && new Set(lots).size !== lots.length)
    out.push({ path, message: 'must not name the same lot twice' });
  return out;
}

/**
 * Builds the next entry of a roll, in format version {@link FORMAT_VERSION} unless
 * `options.version` names another (tests and fixtures write version 1). `head` is the newest
 * entry (null for a new roll, whose `draft.lot` must then be a canonical lot code). Version 2
 * writes the body's rule facts (`factsOf`) in the header. Draws a 128-bit body nonce and then one
 * 128-bit salt per sealed field (in field-name order) from `random`. Preconditions: the caller
 * has checked the transition (`checkTransition`). Throws {@link ValidationError} listing every
 * bad field (time not after the head's, unknown body fields, bad sealed values, ...).
 */
export function buildEntry<K extends EntryKind>(
  head: RollHead | null,
  draft: EntryDraft<K>,
  options: { random?: RandomSource; version?: FormatVersion } = {},
): BuiltEntry {
  const version = options.version ?? FORMAT_VERSION;
  const random = options.random ?? secureRandom;
  const issues: FieldIssue[] = [];
  const lot = head ? head.lot : draft.lot;
  if (!isCanonicalLotCode(lot)) issues.push({ path: 'lot', message: 'must be a canonical lot code' });
  if (head && draft.lot !== undefined && draft.lot !== head.lot)
    issues.push({ path: 'lot', message: 'differs from the roll' });
  if (!ENTRY_KINDS.includes(draft.kind)) issues.push({ path: 'kind', message: 'is not a known kind' });
  else if (version < kindSince(draft.kind))
    issues.push({ path: 'kind', message: `is not a kind of format version ${version}` });
  if (!isEntryTime(draft.time)) issues.push({ path: 'time', message: 'must be YYYY-MM-DDTHH:MM:SS.sssZ' });
  else if (head && draft.time < head.time)
    issues.push({ path: 'time', message: 'must not be earlier than the previous entry' });
  if (!isActorId(draft.actor)) issues.push({ path: 'actor', message: 'must be an account id' });
  if (draft.parents !== undefined) issues.push(...parentIssues(draft.parents, 'parents'));
  if (issues.length > 0) throw new ValidationError(issues, 'bad-draft');

  const body = { ...(draft.body as object), nonce: bytesToHex(random(16)) } as AnyBody;
  let bIssues = bodyIssues(draft.kind, body, version);
  // New entries meet the plausibility bounds too (rules of format version 2 and later).
  if (bIssues.length === 0) bIssues = bodyBoundIssues(draft.kind, body, draft.time);
  const sIssues = draft.sealed && bIssues.length === 0 ? sealedBoundIssues(draft.sealed, draft.time) : [];
  if (bIssues.length > 0 || sIssues.length > 0)
    throw new ValidationError(
      [...bIssues.map((i) => ({ ...i, path: i.path ? `body.${i.path}` : 'body' })), ...sIssues],
      'bad-body',
    );
  let bodyText: string;
  try {
    bodyText = canonicalise(body);
  } catch (e) {
    throw new ValidationError([{ path: 'body', message: (e as CanonicalError).message }], 'bad-body');
  }
  const sealed =
    draft.sealed && Object.keys(draft.sealed).length > 0 ? sealFields(draft.sealed, random) : null;
  const header: EntryHeader = {
    v: version,
    lot: lot as string,
    seq: head ? head.seq + 1 : 0,
    kind: draft.kind,
    time: draft.time,
    actor: draft.actor,
    prev: head ? head.hash : GENESIS_PREV,
    ...(draft.parents ? { parents: draft.parents } : {}),
    body: bodyDigest(bodyText),
    ...(sealed ? { sealed: sealed.root } : {}),
    ...(version >= 2 ? { facts: factsOf(draft.kind, body) } : {}),
  };
  const headerText = canonicalise(header);
  return {
    stored: { hash: entryHash(headerText), header: headerText, body: bodyText },
    header,
    body,
    sealed,
  };
}

/** The head of a built or verified entry, for building the next one. */
export function headOf(entry: { stored: StoredEntry; header: EntryHeader }): RollHead {
  return { lot: entry.header.lot, seq: entry.header.seq, hash: entry.stored.hash, time: entry.header.time };
}

/** Reason codes a verifier reports for the first failing entry. */
export type ReasonCode =
  | 'bad-prev'
  | 'bad-hash'
  | 'bad-body-digest'
  | 'missing-body'
  | 'bad-seq'
  | 'bad-time'
  | 'bad-parent'
  | 'bad-actor'
  | 'bad-transition'
  | 'non-canonical'
  | 'unknown-version'
  | 'bad-header'
  | 'bad-body'
  | 'bad-facts'
  | 'bad-roll'
  | 'bad-entry'
  | 'bad-lot-code'
  | 'duplicate-lot'
  | 'bad-log-index'
  | 'unnamed-link';

/** Every reason code: first the entry checks in the order they run, then the bundle's. */
export const REASON_CODES: readonly ReasonCode[] = [
  'non-canonical',
  'unknown-version',
  'bad-header',
  'bad-seq',
  'bad-time',
  'bad-actor',
  'bad-prev',
  'bad-body-digest',
  'bad-parent',
  'bad-hash',
  'missing-body',
  'bad-body',
  'bad-facts',
  'bad-transition',
  'bad-roll',
  'bad-entry',
  'bad-lot-code',
  'duplicate-lot',
  'bad-log-index',
  'unnamed-link',
];

/** A header that failed to decode: the reason and a message. */
export interface HeaderProblem {
  reason: ReasonCode;
  message: string;
}

/**
 * Decodes a stored header string: canonical form, then version, then field types. Never
 * throws; returns the header or the first problem (`non-canonical`, `unknown-version`,
 * `bad-header`, `bad-seq`, `bad-time`, `bad-actor`, `bad-prev`, `bad-body-digest`, `bad-parent`).
 * `knownHash`, when given, is a value already known to be 64 lower-case hex digits (the previous
 * entry's hash, which `prev` usually repeats), and `knownDigest` likewise (the digest of the
 * entry's body, which `body` usually repeats), so those checks are not made twice.
 */
export function decodeHeader(
  text: unknown,
  knownHash?: string,
  knownDigest?: string,
): EntryHeader | HeaderProblem {
  // The usual header is read straight from its text. Whatever is unusual about it, or any
  // check it fails, is left to the full reading, which also words the problem.
  if (typeof text === 'string') {
    const usual = readUsual === null ? null : readUsual(text, lastActor, lastLot);
    if (usual !== null && headerProblem(usual, knownHash, knownDigest, true) === null)
      return usual as unknown as EntryHeader;
  }
  return decodeHeaderFully(text, knownHash, knownDigest);
}

/**
 * {@link decodeHeader} by the full reading alone (parseCanonical, then the checks), the same
 * answer for every input; kept apart so tests can hold the direct reading to it.
 */
export function decodeHeaderFully(
  text: unknown,
  knownHash?: string,
  knownDigest?: string,
): EntryHeader | HeaderProblem {
  if (typeof text !== 'string') return { reason: 'non-canonical', message: 'the header is not a string' };
  let v: unknown;
  try {
    v = parseCanonical(text);
  } catch (e) {
    return { reason: 'non-canonical', message: `header: ${(e as Error).message}` };
  }
  if (v === null || typeof v !== 'object' || Array.isArray(v))
    return { reason: 'bad-header', message: 'the header is not an object' };
  const o = v as Record<string, unknown>;
  return headerProblem(o, knownHash, knownDigest, false) ?? (o as unknown as EntryHeader);
}

/**
 * The first problem of a parsed header object (see {@link decodeHeader}), or null. `usual`: the
 * object came from the direct reading of `usual-header.ts`, so its keys are among those of version 2 and later,
 * and only `facts` in a version-1 header can be unknown.
 */
function headerProblem(
  o: Record<string, unknown>,
  knownHash: string | undefined,
  knownDigest: string | undefined,
  usual: boolean,
): HeaderProblem | null {
  if (!(FORMAT_VERSIONS as readonly unknown[]).includes(o.v))
    return {
      reason: 'unknown-version',
      message: `format version ${JSON.stringify(o.v)} is not ${FORMAT_VERSIONS.join(', ')}`,
    };
  if (usual) {
    if (o.v === 1 && 'facts' in o) return { reason: 'bad-header', message: 'unknown header field facts' };
  } else {
    const keys = HEADER_KEYS[o.v as FormatVersion];
    for (const k in o) {
      if (!keys.includes(k)) return { reason: 'bad-header', message: `unknown header field ${k}` };
    }
  }
  if (o.lot !== lastLot && !isCanonicalLotCode(o.lot))
    return { reason: 'bad-header', message: 'lot is not a canonical lot code' };
  const since = typeof o.kind === 'string' ? KIND_SINCE.get(o.kind) : undefined;
  if (since === undefined) return { reason: 'bad-header', message: 'kind is not a known kind' };
  if ((o.v as FormatVersion) < since)
    return {
      reason: 'bad-header',
      message: `${o.kind as string} is not a kind of format version ${o.v as number}`,
    };
  if (!Number.isSafeInteger(o.seq) || (o.seq as number) < 0)
    return { reason: 'bad-seq', message: 'seq is not a non-negative integer' };
  if (!isEntryTime(o.time)) return { reason: 'bad-time', message: 'time is not YYYY-MM-DDTHH:MM:SS.sssZ' };
  if (o.actor !== lastActor && !isActorId(o.actor))
    return { reason: 'bad-actor', message: 'actor is not an account id' };
  lastLot = o.lot as string;
  lastActor = o.actor as string;
  // A value equal to a known one is replaced by that very string (the object is this call's
  // own), so the verifier's comparisons with it later take no time.
  if (o.prev === knownHash) o.prev = knownHash;
  else if (!isHex64(o.prev)) return { reason: 'bad-prev', message: 'prev is not 64 hex digits' };
  if (o.body === knownDigest) o.body = knownDigest;
  else if (!isHex64(o.body)) return { reason: 'bad-body-digest', message: 'body is not 64 hex digits' };
  if ('sealed' in o && !isHex64(o.sealed))
    return { reason: 'bad-header', message: 'sealed is not 64 hex digits' };
  if ('parents' in o) {
    const issues = parentIssues(o.parents, 'parents');
    if (issues.length > 0) return { reason: 'bad-parent', message: issues[0]!.message };
  }
  if (o.v !== 1) {
    if (!('facts' in o))
      return { reason: 'bad-facts', message: `a version ${o.v as number} header needs facts` };
    const issues = factsIssues(o.kind as EntryKind, o.facts, o.v as FormatVersion);
    if (issues.length > 0)
      return { reason: 'bad-facts', message: `${issues[0]!.path}: ${issues[0]!.message}` };
  }
  return null;
}

/**
 * Reads a header written the usual way straight from its text, or returns null (see
 * `usual-header.ts`). `actor` and `lot` are the values checked last, which it may hand back.
 * Its object is trusted only when {@link headerProblem} then finds nothing.
 */
export type UsualHeaderReader = (
  text: string,
  actor: unknown,
  lot: unknown,
) => Record<string, unknown> | null;

let readUsual: UsualHeaderReader | null = null;

/**
 * Installs the direct reading of usual headers. `usual-header.ts` calls it when it is loaded,
 * which Node does through the package's index; a bundle for browsers, where rolls are short and
 * bytes count, leaves that module out (the package has no side effects to keep) and every header
 * takes the full reading.
 */
export function useUsualHeaderReader(reader: UsualHeaderReader): void {
  readUsual = reader;
}

// The lot code and actor checked last: a roll repeats them from header to header, so each is
// validated once.
let lastLot: unknown = null;
let lastActor: unknown = null;

/** Each kind and the format version that added it. */
const KIND_SINCE: ReadonlyMap<string, FormatVersion> = new Map(ENTRY_KINDS.map((k) => [k, kindSince(k)]));

/** True when {@link decodeHeader} returned a problem rather than a header. */
export function isHeaderProblem(x: EntryHeader | HeaderProblem): x is HeaderProblem {
  return 'reason' in x && 'message' in x && !('v' in x);
}

/** Re-exported for callers that build headers by hand (tests, other tools). */
export function encodeHeader(header: EntryHeader): string {
  return canonicalise(header);
}
