import { parseCanonical } from './canonical.js';
import { factsMatchBody } from './facts.js';
import { decodeHeader, isHeaderProblem, NEVER_REDACTED, type ReasonCode, type StoredEntry } from './entry.js';
import { bodyDigest, entryHash } from './hash.js';
import { checkTransition, reduceEntryInPlace, type RollHead, type RollState } from './rules.js';
import { GENESIS_PREV, type AnyBody, type EntryHeader } from './types.js';
import { bodyBoundIssues } from './bounds.js';
import { bodyIssues } from './validate.js';

/** The first entry at which a roll breaks. */
export interface VerifyFailure {
  ok: false;
  lot: string | null;
  seq: number;
  reason: ReasonCode;
  message: string;
}

/** A rule a version-1 entry could not be checked against, because a removed body held its fact. */
export interface UncheckedRule {
  seq: number;
  message: string;
}

/**
 * An unbroken roll and its derived state. `unchecked` is empty for a roll that is fully
 * checked; otherwise the roll is "not fully checkable after a removal" (version 1 only) and
 * each item names an entry and the rule that could not be applied to it.
 */
export interface VerifySuccess {
  ok: true;
  lot: string;
  entries: number;
  head: RollHead;
  state: RollState;
  unchecked: UncheckedRule[];
}

/** Outcome of verifying a roll. */
export type RollVerification = VerifySuccess | VerifyFailure;

/** One verified entry, decoded, for pages that render only what was verified. */
export interface VerifiedEntry {
  hash: string;
  header: EntryHeader;
  /** null when the body is absent (redacted). */
  body: AnyBody | null;
}

/**
 * Verifies a roll one entry at a time (for streams and very long rolls). It keeps only the
 * chain head, the derived state and the seqs of bodies still waiting for their `redacted`
 * entry — never the entries themselves. After the first failure every call returns it.
 */
export class RollVerifier {
  private lot: string | null;
  private state: RollState | null = null;
  private failure: VerifyFailure | null = null;
  private pending = new Set<number>();
  private unchecked: UncheckedRule[] = [];
  private count = 0;
  /** The last entry accepted, decoded; valid until the next `push`. */
  last: VerifiedEntry | null = null;

  /** `lot`: the canonical code the roll must belong to; when omitted, seq 0 decides. */
  constructor(lot?: string) {
    this.lot = lot ?? null;
  }

  private fail(seq: number, reason: ReasonCode, message: string): VerifyFailure {
    this.failure = { ok: false, lot: this.lot, seq, reason, message };
    return this.failure;
  }

  /**
   * Checks the next entry and folds it into the state. Returns null when it is good so far,
   * or the failure. Never throws, whatever the input's types.
   */
  push(entry: StoredEntry): VerifyFailure | null {
    if (this.failure) return this.failure;
    const expectSeq = this.count;
    try {
      return this.pushUnsafe(entry, expectSeq);
    } catch (e) {
      return this.fail(expectSeq, 'bad-header', `unexpected input: ${(e as Error).message}`);
    }
  }

  private pushUnsafe(entry: StoredEntry, expectSeq: number): VerifyFailure | null {
    if (entry === null || typeof entry !== 'object')
      return this.fail(expectSeq, 'bad-header', 'an entry is an object');
    // The body's digest is needed below; computed first, it also stands for the header's
    // `body` in the header's check when the two are equal.
    const digest = typeof entry.body === 'string' ? bodyDigest(entry.body) : undefined;
    const h = decodeHeader(entry.header, this.state?.head.hash, digest);
    if (isHeaderProblem(h)) return this.fail(expectSeq, h.reason, h.message);
    // A hash equal to the one computed here is 64 lower-case hex digits.
    if (typeof entry.hash !== 'string' || entryHash(entry.header) !== entry.hash) {
      return this.fail(expectSeq, 'bad-hash', 'the entry hash does not match its header');
    }
    if (this.lot === null) this.lot = h.lot;
    if (h.lot !== this.lot) return this.fail(expectSeq, 'bad-header', `entry belongs to lot ${h.lot}`);
    if (h.seq !== expectSeq)
      return this.fail(expectSeq, 'bad-seq', `expected seq ${expectSeq}, found ${h.seq}`);
    const prev = this.state ? this.state.head : null;
    if (h.prev !== (prev ? prev.hash : GENESIS_PREV))
      return this.fail(h.seq, 'bad-prev', 'prev does not name the previous entry');
    if (prev && h.time < prev.time)
      return this.fail(h.seq, 'bad-time', 'time is earlier than the previous entry');
    if (this.state && h.v < (this.state.version ?? 1))
      return this.fail(h.seq, 'bad-header', `version ${h.v} after an entry of version ${this.state.version}`);
    if (h.parents) {
      if (h.seq !== 0 || h.kind !== 'registered')
        return this.fail(h.seq, 'bad-parent', 'only a registered entry names parents');
      if (h.parents.some((p) => p.lot === h.lot))
        return this.fail(h.seq, 'bad-parent', 'a lot is not its own parent');
    }
    let body: AnyBody | null = null;
    if (entry.body === null || entry.body === undefined) {
      if (NEVER_REDACTED.includes(h.kind))
        return this.fail(h.seq, 'missing-body', `a ${h.kind} body is never redacted`);
      this.pending.add(h.seq);
    } else {
      try {
        if (typeof entry.body !== 'string') throw new Error('the body is not a string');
        body = parseCanonical(entry.body) as AnyBody;
      } catch (e) {
        return this.fail(h.seq, 'non-canonical', `body: ${(e as Error).message}`);
      }
      if (digest !== h.body) return this.fail(h.seq, 'bad-body-digest', 'the body does not match its digest');
      let issues = bodyIssues(h.kind, body, h.v);
      // The plausibility bounds are rules of format version 2; version 1 entries keep the looser ones.
      if (issues.length === 0 && h.v >= 2) issues = bodyBoundIssues(h.kind, body, h.time);
      if (issues.length > 0) return this.fail(h.seq, 'bad-body', `${issues[0]!.path}: ${issues[0]!.message}`);
      if (h.facts && !factsMatchBody(h.kind, body, h.facts))
        return this.fail(h.seq, 'bad-facts', 'the header facts differ from the body');
      if ('sealedOnly' in body && h.sealed === undefined)
        return this.fail(h.seq, 'bad-body', 'a sealed-only exhibit needs the header to commit sealed fields');
    }
    if (h.facts?.sealedOnly && h.sealed === undefined)
      return this.fail(h.seq, 'bad-facts', 'a sealed-only exhibit needs the header to commit sealed fields');
    const t = checkTransition(this.state, {
      kind: h.kind,
      actor: h.actor,
      body,
      facts: h.facts,
      parents: h.parents,
      version: h.v,
      time: h.time,
    });
    if (!t.ok) return this.fail(h.seq, t.code, t.message);
    if (t.unchecked) for (const message of t.unchecked) this.unchecked.push({ seq: h.seq, message });
    if (h.kind === 'redacted')
      this.pending.delete(h.facts ? h.facts.target! : (body as { target: number }).target);
    // The verifier built this state from seq 0 and lends it to no one, so it grows in place.
    const verified: VerifiedEntry = { hash: entry.hash, header: h, body };
    this.state = reduceEntryInPlace(this.state, verified);
    this.last = verified;
    this.count++;
    return null;
  }

  /** Ends the roll: fails on an empty roll or a body missing without a `redacted` entry. */
  finish(): RollVerification {
    if (this.failure) return this.failure;
    if (!this.state) return this.fail(0, 'bad-seq', 'a roll has at least one entry');
    if (this.pending.size > 0) {
      const seq = Math.min(...this.pending);
      return this.fail(seq, 'missing-body', 'the body is missing and no redacted entry names it');
    }
    return {
      ok: true,
      lot: this.state.lot,
      entries: this.count,
      head: this.state.head,
      state: snapshot(this.state),
      unchecked: [...this.unchecked],
    };
  }
}

/** A copy of a state the verifier keeps growing, with its own lists, for the caller to keep. */
function snapshot(state: RollState): RollState {
  const copy = { ...state };
  for (const [key, value] of Object.entries(copy))
    if (Array.isArray(value)) (copy as Record<string, unknown>)[key] = [...(value as unknown[])];
  return copy;
}

/** Starts an incremental verifier; see {@link RollVerifier}. */
export function createRollVerifier(lot?: string): RollVerifier {
  return new RollVerifier(lot);
}

/** A whole-roll verification with the decoded entries, for pages. */
export type RollVerificationWithEntries =
  | (VerifySuccess & { verified: VerifiedEntry[]; redacted: number[] })
  | (VerifyFailure & { verified: VerifiedEntry[] });

/**
 * Verifies a whole roll, given in seq order, and derives its state. Never throws. Returns the
 * state and the decoded entries, or the first failing seq with its reason (the entries before
 * it are returned too, but a page must not present a broken roll as verified).
 * Precondition: `lot`, when given, is the canonical code the roll must belong to.
 */
export function verifyRoll(
  entries: Iterable<StoredEntry>,
  options: { lot?: string } = {},
): RollVerificationWithEntries {
  const v = new RollVerifier(options.lot);
  const verified: VerifiedEntry[] = [];
  try {
    for (const e of entries) {
      const f = v.push(e);
      if (f) return { ...f, verified };
      verified.push(v.last!);
    }
  } catch (e) {
    return {
      ok: false,
      lot: options.lot ?? null,
      seq: verified.length,
      reason: 'bad-header',
      message: String(e),
      verified,
    };
  }
  const r = v.finish();
  if (!r.ok) return { ...r, verified };
  return { ...r, verified, redacted: [...r.state.redactedSeqs] };
}
