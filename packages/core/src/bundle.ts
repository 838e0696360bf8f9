import { parseCanonical } from './canonical.js';
import { decodeHeader, isHeaderProblem, type ReasonCode, type StoredEntry } from './entry.js';
import { BundleError } from './errors.js';
import { bodyDigest, entryHash } from './hash.js';
import { isCanonicalLotCode } from './lotcode.js';
import type { RollState } from './rules.js';
import type { CombinedBody, EntryHeader, RegisteredBody, SplitBody } from './types.js';
import { bodyBoundIssues } from './bounds.js';
import { bodyIssues, isHex64 } from './validate.js';
import { verifyRoll, type VerifiedEntry, type VerifyFailure } from './verify.js';

/** Value of a bundle's `format` member. */
export const BUNDLE_FORMAT = 'beadroll-bundle';
/** Bundle layout version. */
export const BUNDLE_VERSION = 1;
/** Default largest bundle a verifier reads: 256 MiB. */
export const DEFAULT_MAX_BUNDLE_BYTES = 256 * 1024 * 1024;

/** One entry in a bundle. `logIndex` is reserved for the global log and is not hashed. */
export interface BundleEntry extends StoredEntry {
  logIndex: number | null;
}

/**
 * One roll in a bundle: `full` = every entry from seq 0; `link` = only the `split`/`combined`
 * entries another roll in the bundle links to (an unlisted ancestor), with their bodies.
 */
export interface BundleRoll {
  lot: string;
  scope: 'full' | 'link';
  entries: BundleEntry[];
}

/** An export bundle. `checkpoints` is reserved for signed checkpoints and is empty in version 1. */
export interface Bundle {
  format: typeof BUNDLE_FORMAT;
  version: typeof BUNDLE_VERSION;
  rolls: BundleRoll[];
  checkpoints: unknown[];
}

/**
 * Checks a decoded JSON value has the shape of a bundle and returns it typed. Throws
 * {@link BundleError}: `not-a-bundle` (wrong shape, types, a lot twice) or `unknown-version`.
 */
export function parseBundle(value: unknown): Bundle {
  const bad = (m: string): never => {
    throw new BundleError('not-a-bundle', m);
  };
  if (value === null || typeof value !== 'object' || Array.isArray(value)) bad('a bundle is a JSON object');
  const b = value as Record<string, unknown>;
  if (b.format !== BUNDLE_FORMAT) bad(`format is not "${BUNDLE_FORMAT}"`);
  if (b.version !== BUNDLE_VERSION)
    throw new BundleError('unknown-version', `bundle version ${JSON.stringify(b.version)} is not 1`);
  for (const k of Object.keys(b))
    if (!['format', 'version', 'rolls', 'checkpoints'].includes(k)) bad(`unknown member ${k}`);
  if (!Array.isArray(b.rolls)) bad('rolls is not a list');
  if (!Array.isArray(b.checkpoints)) bad('checkpoints is not a list');
  const seen = new Set<string>();
  (b.rolls as unknown[]).forEach((r, i) => {
    const at = `rolls[${i}]`;
    if (r === null || typeof r !== 'object' || Array.isArray(r)) bad(`${at} is not an object`);
    const o = r as Record<string, unknown>;
    if (Object.keys(o).sort().join(',') !== 'entries,lot,scope')
      bad(`${at} must have exactly lot, scope, entries`);
    if (!isCanonicalLotCode(o.lot)) bad(`${at}.lot is not a canonical lot code`);
    if (seen.has(o.lot as string)) bad(`lot ${o.lot as string} appears twice`);
    seen.add(o.lot as string);
    if (o.scope !== 'full' && o.scope !== 'link') bad(`${at}.scope is not full or link`);
    if (!Array.isArray(o.entries)) bad(`${at}.entries is not a list`);
    (o.entries as unknown[]).forEach((e, j) => {
      const eat = `${at}.entries[${j}]`;
      if (e === null || typeof e !== 'object' || Array.isArray(e)) bad(`${eat} is not an object`);
      const x = e as Record<string, unknown>;
      if (Object.keys(x).sort().join(',') !== 'body,hash,header,logIndex')
        bad(`${eat} must have exactly hash, header, body, logIndex`);
      if (typeof x.hash !== 'string') bad(`${eat}.hash is not a string`);
      if (typeof x.header !== 'string') bad(`${eat}.header is not a string`);
      if (x.body !== null && typeof x.body !== 'string') bad(`${eat}.body is not a string or null`);
      if (x.logIndex !== null && !(Number.isSafeInteger(x.logIndex) && (x.logIndex as number) >= 0)) {
        bad(`${eat}.logIndex is not null or a non-negative integer`);
      }
    });
  });
  return value as Bundle;
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

/** Result for one roll of a bundle. */
export interface BundleRollResult {
  lot: string;
  scope: 'full' | 'link';
  entries: number;
  ok: boolean;
  failure: VerifyFailure | null;
  state: RollState | null;
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
    let body: unknown;
    try {
      body = parseCanonical(e.body);
    } catch (x) {
      return fail(h.seq, 'non-canonical', `body: ${(x as Error).message}`);
    }
    if (bodyDigest(e.body) !== h.body)
      return fail(h.seq, 'bad-body-digest', 'the body does not match its digest');
    const issues = bodyIssues(h.kind, body);
    if (issues.length === 0 && (h.v as number) >= 2)
      issues.push(...bodyBoundIssues(h.kind, body as SplitBody | CombinedBody, h.time));
    if (issues.length > 0) return fail(h.seq, 'bad-body', `${issues[0]!.path}: ${issues[0]!.message}`);
    out.push({ header: h, hash: e.hash, body: body as SplitBody | CombinedBody });
  }
  return { failure: null, entries: out };
}

/**
 * Verifies every roll of a bundle and every cross-lot link in both directions: each child's
 * `registered` parents must be in the bundle as `split`/`combined` entries with that hash,
 * naming the child (a split child's count must equal its registered count), not later than
 * the child; and each `split`/`combined` entry naming a child that is in the bundle must be
 * among that child's parents. Never throws. Precondition: `bundle` came from
 * {@link parseBundle} or {@link parseBundleText}.
 */
export function verifyBundle(bundle: Bundle): BundleVerification {
  const rolls: BundleRollResult[] = [];
  const failures: VerifyFailure[] = [];
  const linkEntries = new Map<string, LinkEntry>(); // "lot/seq" of verified split/combined entries
  const firstEntries = new Map<string, VerifiedEntry>(); // child lot -> verified registered entry
  let entries = 0;
  for (const r of bundle.rolls) {
    entries += r.entries.length;
    if (r.scope === 'link') {
      const { failure, entries: le } = verifyLinkRoll(r);
      for (const e of le) linkEntries.set(`${r.lot}/${e.header.seq}`, e);
      rolls.push({
        lot: r.lot,
        scope: 'link',
        entries: r.entries.length,
        ok: !failure,
        failure,
        state: null,
      });
      if (failure) failures.push(failure);
      continue;
    }
    const res = verifyRoll(r.entries, { lot: r.lot });
    if (res.ok) {
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
      });
    } else {
      const { verified: _v, ...failure } = res;
      rolls.push({ lot: r.lot, scope: 'full', entries: r.entries.length, ok: false, failure, state: null });
      failures.push(failure);
    }
  }
  const markBroken = (lot: string, seq: number, message: string): void => {
    const f: VerifyFailure = { ok: false, lot, seq, reason: 'bad-parent', message };
    const roll = rolls.find((x) => x.lot === lot)!;
    if (roll.ok) {
      roll.ok = false;
      roll.failure = f;
      roll.state = null;
      failures.push(f);
    }
  };
  let links = 0;
  // Child to parent.
  for (const [child, reg] of firstEntries) {
    const parents = reg.header.parents ?? [];
    const kinds = new Set<string>();
    for (const p of parents) {
      links++;
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
        const count = (reg.body as RegisteredBody).description.count;
        if (!c) markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} does not name this lot`);
        else if (c.count.value !== count.value)
          markBroken(child, 0, `split gave ${c.count.value} beads, registered ${count.value}`);
      } else if ((le.body as CombinedBody).child !== child) {
        markBroken(child, 0, `parent entry ${p.lot} seq ${p.seq} does not name this lot`);
      }
    }
    if (kinds.has('split') && (parents.length !== 1 || kinds.size > 1))
      markBroken(child, 0, 'a split child has exactly one parent');
  }
  // Parent to child.
  for (const [key, le] of linkEntries) {
    const named =
      le.header.kind === 'split'
        ? (le.body as SplitBody).children.map((c) => c.lot)
        : [(le.body as CombinedBody).child];
    for (const child of named) {
      const reg = firstEntries.get(child);
      if (!reg) continue;
      const back = (reg.header.parents ?? []).some(
        (p) => p.lot === le.header.lot && p.seq === le.header.seq && p.hash === le.hash,
      );
      if (!back) markBroken(le.header.lot, le.header.seq, `child ${child} does not name entry ${key}`);
    }
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
    scope?: 'full' | 'link';
    entries: ReadonlyArray<StoredEntry & { logIndex?: number | null }>;
  }>,
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
    checkpoints: [],
  };
}
