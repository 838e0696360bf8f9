import { factsMatchBody } from './facts.js';
import { decodeHeader, isHeaderProblem, type ReasonCode, type StoredEntry } from './entry.js';
import { BundleError } from './errors.js';
import { entryHash } from './hash.js';
import { decodeStoredBody } from './stored-body.js';
import { isCanonicalLotCode } from './lotcode.js';
import type { RollState } from './rules.js';
import type { CombinedBody, EntryHeader, RegisteredBody, SplitBody } from './types.js';
import { INHERITED_SCOPE, verifyInheritedRoll } from './inherited.js';
import { bodyBoundIssues } from './bounds.js';
import { bodyIssues, isHex64 } from './validate.js';
import type { BundleCheckpoint } from './log.js';
import { verifyRoll, type UncheckedRule, type VerifiedEntry, type VerifyFailure } from './verify.js';

// The WHATWG decoder that Node and every browser provide (core's build names no DOM types).
declare const TextDecoder: new (
  label: string,
  options: { fatal: boolean; ignoreBOM: boolean },
) => { decode(bytes: Uint8Array): string };

/** Value of a bundle's `format` member. */
export const BUNDLE_FORMAT = 'beadroll-bundle';
/** Bundle layout version written by {@link createBundle}. */
export const BUNDLE_VERSION = 2;

/** Every bundle version a verifier reads. */
export const BUNDLE_VERSIONS = [1, 2] as const;
/** Default largest bundle a verifier reads: 256 MiB. */
export const DEFAULT_MAX_BUNDLE_BYTES = 256 * 1024 * 1024;

/** One entry in a bundle. `logIndex` is reserved for the global log and is not hashed. */
export interface BundleEntry extends StoredEntry {
  logIndex: number | null;
}

/**
 * Scope of a roll in a bundle: `full` = every entry from seq 0; `link` = only the
 * `split`/`combined` entries another roll in the bundle links to (an unlisted ancestor), with
 * their bodies; `inherited` = an unlisted ancestor's link entries with the entries that travel
 * to its descendants (see {@link verifyInheritedRoll}).
 */
export type BundleScope = 'full' | 'link' | typeof INHERITED_SCOPE;

/** One roll in a bundle (see {@link BundleScope}). */
export interface BundleRoll {
  lot: string;
  scope: BundleScope;
  entries: BundleEntry[];
}

/** An export bundle. `checkpoints` holds signed checkpoints with inclusion proofs (format §14.5). */
export interface Bundle {
  format: typeof BUNDLE_FORMAT;
  version: (typeof BUNDLE_VERSIONS)[number];
  rolls: BundleRoll[];
  checkpoints: unknown[];
}

/**
 * Checks a decoded JSON value has the top-level shape of a bundle and returns it typed: an
 * object with exactly `format`, `version` (1 or 2), `rolls` (a list) and `checkpoints` (a
 * list). What is inside the rolls is checked by {@link verifyBundle}, which reports a bad roll
 * as a broken roll, not as an unreadable bundle. Throws {@link BundleError}: `not-a-bundle` or
 * `unknown-version`.
 */
export function parseBundle(value: unknown): Bundle {
  const bad = (m: string): never => {
    throw new BundleError('not-a-bundle', m);
  };
  if (value === null || typeof value !== 'object' || Array.isArray(value)) bad('a bundle is a JSON object');
  const b = value as Record<string, unknown>;
  if (b.format !== BUNDLE_FORMAT) bad(`format is not "${BUNDLE_FORMAT}"`);
  if (!(BUNDLE_VERSIONS as readonly unknown[]).includes(b.version))
    throw new BundleError('unknown-version', `bundle version ${JSON.stringify(b.version)} is not 1 or 2`);
  for (const k of Object.keys(b))
    if (!['format', 'version', 'rolls', 'checkpoints'].includes(k)) bad(`unknown member ${k}`);
  if (!Array.isArray(b.rolls)) bad('rolls is not a list');
  if (!Array.isArray(b.checkpoints)) bad('checkpoints is not a list');
  return value as Bundle;
}

/** The first problem with the shape of one roll of a bundle, or null when it is well formed. */
function rollShapeProblem(r: unknown): { reason: ReasonCode; seq: number; message: string } | null {
  if (r === null || typeof r !== 'object' || Array.isArray(r))
    return { reason: 'bad-roll', seq: 0, message: 'a roll is an object' };
  const o = r as Record<string, unknown>;
  if (Object.keys(o).sort().join(',') !== 'entries,lot,scope')
    return { reason: 'bad-roll', seq: 0, message: 'a roll has exactly lot, scope, entries' };
  if (!isCanonicalLotCode(o.lot))
    return { reason: 'bad-lot-code', seq: 0, message: 'lot is not a canonical lot code' };
  if (o.scope !== 'full' && o.scope !== 'link' && o.scope !== INHERITED_SCOPE)
    return { reason: 'bad-roll', seq: 0, message: 'scope is not full, link or inherited' };
  if (!Array.isArray(o.entries)) return { reason: 'bad-roll', seq: 0, message: 'entries is not a list' };
  for (let j = 0; j < o.entries.length; j++) {
    const e: unknown = o.entries[j];
    const at = `entries[${j}]`;
    if (e === null || typeof e !== 'object' || Array.isArray(e))
      return { reason: 'bad-entry', seq: j, message: `${at} is not an object` };
    const x = e as Record<string, unknown>;
    if (Object.keys(x).sort().join(',') !== 'body,hash,header,logIndex')
      return { reason: 'bad-entry', seq: j, message: `${at} has exactly hash, header, body, logIndex` };
    if (typeof x.hash !== 'string')
      return { reason: 'bad-entry', seq: j, message: `${at}.hash is not a string` };
    if (typeof x.header !== 'string')
      return { reason: 'bad-entry', seq: j, message: `${at}.header is not a string` };
    if (x.body !== null && typeof x.body !== 'string')
      return { reason: 'bad-entry', seq: j, message: `${at}.body is not a string or null` };
    if (x.logIndex !== null && !(Number.isSafeInteger(x.logIndex) && (x.logIndex as number) >= 0))
      return {
        reason: 'bad-log-index',
        seq: j,
        message: `${at}.logIndex is not null or a non-negative integer`,
      };
  }
  return null;
}

/**
 * Reads a bundle from text: size limit first, then JSON, then shape. Throws
 * {@link BundleError} (`too-large`, `not-json`, `not-a-bundle`, `unknown-version`).
 * The size counts UTF-16 code units, a lower bound of the UTF-8 size; callers reading files
 * should check the byte size before reading.
 */
export function parseBundleText(text: string, maxBytes = DEFAULT_MAX_BUNDLE_BYTES): Bundle {
  if (typeof text !== 'string') throw new BundleError('not-json', 'a bundle is text');
  if (text.length > maxBytes) throw new BundleError('too-large', `bundle is over ${maxBytes} bytes`);
  let v: unknown;
  try {
    v = JSON.parse(text);
  } catch (e) {
    throw new BundleError('not-json', `malformed JSON: ${(e as Error).message}`);
  }
  return parseBundle(v);
}

/**
 * Reads a bundle from the bytes of a file: UTF-8 (strict: a malformed byte sequence is
 * `not-utf8`; so is a leading byte-order mark, which JSON texts do not carry), then as
 * {@link parseBundleText}. Throws {@link BundleError}.
 */
export function parseBundleBytes(bytes: Uint8Array, maxBytes = DEFAULT_MAX_BUNDLE_BYTES): Bundle {
  if (bytes.length > maxBytes) throw new BundleError('too-large', `bundle is over ${maxBytes} bytes`);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(bytes);
  } catch {
    throw new BundleError('not-utf8', 'the file is not UTF-8 text');
  }
  if (text.startsWith('\uFEFF')) throw new BundleError('not-utf8', 'the file starts with a byte-order mark');
  return parseBundleText(text, maxBytes);
}

/**
 * Result for one roll of a bundle. `lot` is null when the roll does not name a canonical lot
 * code; `unchecked` lists the rules a version-1 roll could not be checked against after a
 * removal (empty when fully checked).
 */
export interface BundleRollResult {
  lot: string | null;
  scope: BundleScope;
  entries: number;
  ok: boolean;
  failure: VerifyFailure | null;
  state: RollState | null;
  unchecked: UncheckedRule[];
}

/** Outcome of {@link verifyBundle}. `failures` lists the first failure of each broken roll. */
export interface BundleVerification {
  ok: boolean;
  rolls: BundleRollResult[];
  entries: number;
  links: number;
  failures: VerifyFailure[];
}

interface LinkEntry {
  header: EntryHeader;
  hash: string;
  body: SplitBody | CombinedBody;
}

function verifyLinkRoll(r: BundleRoll): { failure: VerifyFailure | null; entries: LinkEntry[] } {
  const out: LinkEntry[] = [];
  const fail = (seq: number, reason: ReasonCode, message: string) => ({
    failure: { ok: false as const, lot: r.lot, seq, reason, message },
    entries: out,
  });
  let lastSeq = -1;
  for (const e of r.entries) {
    const h = decodeHeader(e.header);
    if (isHeaderProblem(h)) return fail(lastSeq + 1, h.reason, h.message);
    if (!isHex64(e.hash) || entryHash(e.header) !== e.hash)
      return fail(h.seq, 'bad-hash', 'the entry hash does not match its header');
    if (h.lot !== r.lot) return fail(h.seq, 'bad-header', `entry belongs to lot ${h.lot}`);
    if (h.seq <= lastSeq) return fail(h.seq, 'bad-seq', 'link entries must be in increasing seq order');
    lastSeq = h.seq;
    if (h.kind !== 'split' && h.kind !== 'combined')
      return fail(h.seq, 'bad-header', 'a link roll holds only split and combined entries');
    if (e.body === null) return fail(h.seq, 'missing-body', 'a link entry needs its body');
    const stored = decodeStoredBody(e.body, h.body);
    if ('reason' in stored) return fail(h.seq, stored.reason, stored.message);
    const body = stored.body;
    const issues = bodyIssues(h.kind, body, h.v);
    if (issues.length === 0 && h.v >= 2)
      issues.push(...bodyBoundIssues(h.kind, body as SplitBody | CombinedBody, h.time));
    if (issues.length > 0) return fail(h.seq, 'bad-body', `${issues[0]!.path}: ${issues[0]!.message}`);
    if (h.facts && !factsMatchBody(h.kind, body as SplitBody, h.facts))
      return fail(h.seq, 'bad-facts', 'the header facts differ from the body');
    out.push({ header: h, hash: e.hash, body: body as SplitBody | CombinedBody });
  }
  return { failure: null, entries: out };
}

/**
 * Verifies every roll of a bundle and every cross-lot link in both directions: each child's
 * `registered` parents must be in the bundle as `split`/`combined` entries with that hash,
 * naming the child (a split child's count must equal its registered count, and from format
 * version 2 of the child's entry its estimated flag too), not later than the child; each
 * `split`/`combined` entry naming a child that is in the bundle must be among that child's
 * parents; and every entry of a link-scope roll must be named by a child in the bundle. A roll
 * whose shape is wrong (not an object, a bad lot code, a lot twice, a malformed entry or log
 * index) is a broken roll. Never throws. Precondition: `bundle` came from {@link parseBundle}
 * or {@link parseBundleText}.
 */
export function verifyBundle(bundle: Bundle): BundleVerification {
  const rolls: BundleRollResult[] = [];
  const failures: VerifyFailure[] = [];
  const linkEntries = new Map<string, LinkEntry>(); // "lot/seq" of verified split/combined entries
  const linkScoped = new Map<string, LinkEntry>(); // the same, for link-scope rolls only
  const firstEntries = new Map<string, VerifiedEntry>(); // child lot -> verified registered entry
  const raw = bundle.rolls as unknown[];
  const lotCount = new Map<unknown, number>();
  for (const r of raw) {
    const lot = r && typeof r === 'object' ? (r as Record<string, unknown>).lot : undefined;
    if (isCanonicalLotCode(lot)) lotCount.set(lot, (lotCount.get(lot) ?? 0) + 1);
  }
  let entries = 0;
  for (const item of raw) {
    const shape = rollShapeProblem(item);
    const o = (item ?? {}) as Record<string, unknown>;
    const lot = isCanonicalLotCode(o.lot) ? o.lot : null;
    const scope: BundleScope = o.scope === 'link' || o.scope === INHERITED_SCOPE ? o.scope : 'full';
    const n = Array.isArray(o.entries) ? o.entries.length : 0;
    entries += n;
    const broken = (failure: VerifyFailure): void => {
      rolls.push({ lot, scope, entries: n, ok: false, failure, state: null, unchecked: [] });
      failures.push(failure);
    };
    // A link or inherited roll that checks: its entries verify, its state is its descendants'.
    const checkedWithoutState = (): void => {
      rolls.push({ lot, scope, entries: n, ok: true, failure: null, state: null, unchecked: [] });
    };
    if (shape) {
      broken({ ok: false, lot, ...shape });
      continue;
    }
    if ((lotCount.get(lot) ?? 0) > 1) {
      broken({
        ok: false,
        lot,
        seq: 0,
        reason: 'duplicate-lot',
        message: 'the bundle holds this lot more than once',
      });
      continue;
    }
    const r = item as BundleRoll;
    if (r.scope === INHERITED_SCOPE) {
      const { failure, entries: ie } = verifyInheritedRoll(r);
      if (failure) {
        broken(failure);
        continue;
      }
      for (const e of ie) {
        if (e.header.kind === 'split' || e.header.kind === 'combined') {
          linkEntries.set(`${r.lot}/${e.header.seq}`, e as LinkEntry);
          linkScoped.set(`${r.lot}/${e.header.seq}`, e as LinkEntry);
        } else if (e.header.kind === 'registered') firstEntries.set(r.lot, e);
      }
      checkedWithoutState();
      continue;
    }
    if (r.scope === 'link') {
      const { failure, entries: le } = verifyLinkRoll(r);
      if (failure) {
        broken(failure);
        continue;
      }
      for (const e of le) {
        linkEntries.set(`${r.lot}/${e.header.seq}`, e);
        linkScoped.set(`${r.lot}/${e.header.seq}`, e);
      }
      checkedWithoutState();
      continue;
    }
    const res = verifyRoll(r.entries, { lot: r.lot });
    if (!res.ok) {
      const { verified: _v, ...failure } = res;
      broken(failure);
      continue;
    }
    for (const e of res.verified) {
      if ((e.header.kind === 'split' || e.header.kind === 'combined') && e.body) {
        linkEntries.set(`${r.lot}/${e.header.seq}`, {
          header: e.header,
          hash: e.hash,
          body: e.body as SplitBody | CombinedBody,
        });
      }
    }
    firstEntries.set(r.lot, res.verified[0]!);
    rolls.push({
      lot: r.lot,
      scope: 'full',
      entries: res.entries,
      ok: true,
      failure: null,
      state: res.state,
      unchecked: res.unchecked,
    });
  }
  const markBroken = (lot: string, seq: number, message: string, reason: ReasonCode = 'bad-parent'): void => {
    const f: VerifyFailure = { ok: false, lot, seq, reason, message };
    const roll = rolls.find((x) => x.lot === lot && x.ok);
    if (roll) {
      roll.ok = false;
      roll.failure = f;
      roll.state = null;
      roll.unchecked = [];
      failures.push(f);
    }
  };
  let links = 0;
  const named = new Set<string>(); // "lot/seq" of link entries some child names
  // Child to parent.
  for (const [child, reg] of firstEntries) {
    const parents = reg.header.parents ?? [];
    const kinds = new Set<string>();
    for (const p of parents) {
      links++;
      named.add(`${p.lot}/${p.seq}`);
      const le = linkEntries.get(`${p.lot}/${p.seq}`);
      if (!le) {
        markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} is not in the bundle (or is broken)`);
        continue;
      }
      kinds.add(le.header.kind);
      if (le.hash !== p.hash) markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} has another hash`);
      else if (le.header.time > reg.header.time)
        markBroken(child, 0, `registered before its parent entry ${p.lot} seq ${p.seq}`);
      else if (le.header.kind === 'split') {
        const c = (le.body as SplitBody).children.find((x) => x.lot === child);
        // An inherited-scope registered entry may come without its body: its header facts say the count.
        const count =
          (reg.body as RegisteredBody | null)?.description.count ??
          (reg.header.facts as { count?: RegisteredBody['description']['count'] } | undefined)?.count;
        if (!c) markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} does not name this lot`);
        else if (!count) continue;
        else if (c.count.value !== count.value)
          markBroken(child, 0, `split gave ${c.count.value} beads, registered ${count.value}`);
        else if (reg.header.v >= 2 && c.count.estimated !== count.estimated)
          markBroken(child, 0, 'the split and the registered count differ in being estimated');
      } else if ((le.body as CombinedBody).child !== child) {
        markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} does not name this lot`);
      }
    }
    if (kinds.has('split') && (parents.length !== 1 || kinds.size > 1))
      markBroken(child, 0, 'a split child has exactly one parent');
  }
  // Parent to child.
  for (const [key, le] of linkEntries) {
    const kids =
      le.header.kind === 'split'
        ? (le.body as SplitBody).children.map((c) => c.lot)
        : [(le.body as CombinedBody).child];
    for (const child of kids) {
      const reg = firstEntries.get(child);
      if (!reg) continue;
      const back = (reg.header.parents ?? []).some(
        (p) => p.lot === le.header.lot && p.seq === le.header.seq && p.hash === le.hash,
      );
      if (!back) markBroken(le.header.lot, le.header.seq, `child ${child} does not name entry ${key}`);
    }
  }
  // A link-scope or inherited-scope roll holds only link entries a child in the bundle names.
  for (const [key, le] of linkScoped) {
    if (!named.has(key))
      markBroken(
        le.header.lot,
        le.header.seq,
        'no child in the bundle names this link entry',
        'unnamed-link',
      );
  }
  return { ok: failures.length === 0, rolls, entries, links, failures };
}

/**
 * Assembles a bundle from stored rolls (entries in seq order). `logIndex` defaults to null;
 * `scope` to `full`. Redacted or withheld bodies are passed as null. Does not verify: run
 * {@link verifyBundle} on the result when in doubt.
 */
export function createBundle(
  rolls: ReadonlyArray<{
    lot: string;
    scope?: BundleScope;
    entries: ReadonlyArray<StoredEntry & { logIndex?: number | null }>;
  }>,
  checkpoints: readonly BundleCheckpoint[] = [],
): Bundle {
  return {
    format: BUNDLE_FORMAT,
    version: BUNDLE_VERSION,
    rolls: rolls.map((r) => ({
      lot: r.lot,
      scope: r.scope ?? 'full',
      entries: r.entries.map((e) => ({
        hash: e.hash,
        header: e.header,
        body: e.body,
        logIndex: e.logIndex ?? null,
      })),
    })),
    checkpoints: [...checkpoints],
  };
}
