import { factsMatchBody } from './facts.js';
import { decodeHeader, isHeaderProblem, type ReasonCode } from './entry.js';
import { entryHash } from './hash.js';
import { decodeStoredBody } from './stored-body.js';
import { opinionsDisagree, type RollState } from './rules.js';
import type { AnyBody, EntryKind, ExhibitAddedBody, ObservedBody, OpinionBody, ParentRef } from './types.js';
import { bodyIssues, isHex64 } from './validate.js';
import { verifyRoll, type VerifiedEntry, type VerifyFailure } from './verify.js';

/**
 * Bundle scope of an unlisted ancestor: the entries that travel to its descendants' public
 * pages and nothing else (ledger format §11).
 */
export const INHERITED_SCOPE = 'inherited';

/** Kinds an `inherited` roll may hold. */
export const INHERITED_SCOPE_KINDS: readonly EntryKind[] = [
  'registered',
  'split',
  'combined',
  'opinion',
  'exhibit-added',
];

/** The rows of a bundle roll as {@link verifyInheritedRoll} reads them. */
export interface InheritedRollInput {
  lot: string;
  entries: ReadonlyArray<{ hash: string; header: string; body: string | null }>;
}

/**
 * Checks an `inherited` roll entry by entry, not as a chain: each header canonical, of version
 * 1, of this lot, in increasing seq order and of an allowed kind; each hash recomputed; each
 * body present (only a `registered` body may be withheld), canonical, matching its digest and of
 * its kind's shape; exhibits public (not sealed) and cited by an opinion of the same roll.
 * Returns the decoded entries, or the first failure. Never throws.
 */
export function verifyInheritedRoll(r: InheritedRollInput): {
  failure: VerifyFailure | null;
  entries: VerifiedEntry[];
} {
  const out: VerifiedEntry[] = [];
  const fail = (seq: number, reason: ReasonCode, message: string) => ({
    failure: { ok: false as const, lot: r.lot, seq, reason, message },
    entries: out,
  });
  let lastSeq = -1;
  try {
    for (const e of r.entries) {
      const h = decodeHeader(e.header);
      if (isHeaderProblem(h)) return fail(lastSeq + 1, h.reason, h.message);
      if (!isHex64(e.hash) || entryHash(e.header) !== e.hash)
        return fail(h.seq, 'bad-hash', 'the entry hash does not match its header');
      if (h.lot !== r.lot) return fail(h.seq, 'bad-header', `entry belongs to lot ${h.lot}`);
      if (h.seq <= lastSeq)
        return fail(h.seq, 'bad-seq', 'inherited entries must be in increasing seq order');
      lastSeq = h.seq;
      if (!INHERITED_SCOPE_KINDS.includes(h.kind))
        return fail(h.seq, 'bad-header', `an inherited roll does not hold ${h.kind} entries`);
      if (h.kind === 'registered' && h.seq !== 0) return fail(h.seq, 'bad-seq', 'registered is seq 0');
      if (h.parents && h.kind !== 'registered')
        return fail(h.seq, 'bad-parent', 'only a registered entry names parents');
      if (e.body === null) {
        if (h.kind !== 'registered') return fail(h.seq, 'missing-body', 'an inherited entry needs its body');
        out.push({ hash: e.hash, header: h, body: null });
        continue;
      }
      const stored = decodeStoredBody(e.body, h.body);
      if ('reason' in stored) return fail(h.seq, stored.reason, stored.message);
      const body = stored.body;
      const issues = bodyIssues(h.kind, body, h.v);
      if (issues.length > 0) return fail(h.seq, 'bad-body', `${issues[0]!.path}: ${issues[0]!.message}`);
      if (h.facts && !factsMatchBody(h.kind, body as AnyBody, h.facts))
        return fail(h.seq, 'bad-facts', 'the header facts differ from the body');
      if (h.kind === 'exhibit-added' && !('exhibit' in (body as ExhibitAddedBody)))
        return fail(h.seq, 'bad-body', 'an inherited exhibit is a public one');
      out.push({ hash: e.hash, header: h, body: body as AnyBody });
    }
  } catch (x) {
    return fail(lastSeq + 1, 'bad-header', `unexpected input: ${(x as Error).message}`);
  }
  const cited = new Set<string>();
  for (const e of out)
    if (e.header.kind === 'opinion') for (const s of (e.body as OpinionBody).exhibits) cited.add(s);
  for (const e of out) {
    if (e.header.kind !== 'exhibit-added') continue;
    const sha = (e.body as Extract<ExhibitAddedBody, { exhibit: unknown }>).exhibit.original.sha256;
    if (!cited.has(sha))
      return fail(e.header.seq, 'bad-header', 'an inherited exhibit is one an opinion cites');
  }
  return { failure: null, entries: out };
}

/** How the beads left an ancestor on their way to the lot: the ancestor's link entry. */
export interface LeftBy {
  kind: 'split' | 'combined';
  seq: number;
  time: string;
  /** The holder who wrote the link entry. */
  actor: string;
  /** The lot the link entry names on the path (a child of the ancestor). */
  child: string;
}

/** An opinion, observation or exhibit recorded on an ancestor of the lot. */
export interface InheritedEntry {
  /** The ancestor lot it is recorded on. */
  lot: string;
  seq: number;
  hash: string;
  kind: 'opinion' | 'observed' | 'exhibit-added';
  time: string;
  actor: string;
  body: OpinionBody | ObservedBody | ExhibitAddedBody;
  /** Generation of the ancestor: 1 = parent, 2 = grandparent, … */
  depth: number;
  /** The link entry by which the beads left that ancestor (the first found, nearest first). */
  left: LeftBy;
  /** Recorded before the beads left the ancestor. */
  before: boolean;
  /**
   * The author held the ancestor when recording it. On a listed ancestor (full roll) this is
   * read from the chain; on an unlisted one (inherited scope) it means the author is the holder
   * who wrote the link entry and recorded it before that entry.
   */
  byHolder: boolean;
  /** true: the ancestor's full roll is in the bundle (a listed lot). */
  listed: boolean;
}

/** The bundle rolls {@link inheritedRecord} reads. */
export interface InheritedBundleInput {
  rolls: ReadonlyArray<{
    lot: string;
    scope: string;
    entries: ReadonlyArray<{ hash: string; header: string; body: string | null }>;
  }>;
}

interface AncestorRoll {
  listed: boolean;
  entries: VerifiedEntry[];
  /** holder at each seq (full rolls only) */
  holders: Map<number, string> | null;
  parents: ParentRef[];
  opinions: Set<number> | null;
}

/** The holder of a roll just after each of its verified entries (seq → account id). */
export function holdersBySeq(entries: readonly VerifiedEntry[]): Map<number, string> {
  const out = new Map<number, string>();
  let holder = '';
  for (const e of entries) {
    if (e.header.kind === 'registered' || e.header.kind === 'transfer-accepted') holder = e.header.actor;
    out.set(e.header.seq, holder);
  }
  return out;
}

function readAncestor(r: InheritedBundleInput['rolls'][number]): AncestorRoll | null {
  if (r.scope === 'full') {
    const v = verifyRoll(r.entries, { lot: r.lot });
    if (!v.ok) return null;
    const standing = new Set(v.state.opinions.map((o) => o.seq));
    return {
      listed: true,
      entries: v.verified,
      holders: holdersBySeq(v.verified),
      parents: v.state.parents,
      opinions: standing,
    };
  }
  if (r.scope === 'link' || r.scope === INHERITED_SCOPE) {
    const v = verifyInheritedRoll(r);
    if (v.failure) return null;
    const first = v.entries.find((e) => e.header.kind === 'registered');
    return {
      listed: false,
      entries: v.entries,
      holders: null,
      parents: first?.header.parents ?? [],
      opinions: null,
    };
  }
  return null;
}

/**
 * The inherited record of `code`: every opinion (standing, with its body), observation and
 * public exhibit recorded on any ancestor in the bundle, up the split and combine graph,
 * nearest ancestors first, then by time. An unlisted ancestor (inherited scope) contributes
 * only the opinions and cited exhibits the bundle carries. Precondition: the bundle verified
 * with `verifyBundle` and its first roll is the full roll of `code`; rolls that do not verify
 * are skipped. Never throws.
 */
export function inheritedRecord(bundle: InheritedBundleInput, code: string): InheritedEntry[] {
  const raw = new Map(bundle.rolls.map((r) => [r.lot, r]));
  const cache = new Map<string, AncestorRoll | null>();
  const ancestor = (lot: string): AncestorRoll | null => {
    if (!cache.has(lot)) {
      const r = raw.get(lot);
      cache.set(lot, r ? readAncestor(r) : null);
    }
    return cache.get(lot)!;
  };
  const own = raw.get(code);
  if (!own) return [];
  const ownRead = verifyRoll(own.entries, { lot: code });
  if (!ownRead.ok) return [];
  const out: InheritedEntry[] = [];
  const seen = new Set<string>([code]);
  let frontier: { lot: string; parents: ParentRef[] }[] = [{ lot: code, parents: ownRead.state.parents }];
  for (let depth = 1; frontier.length > 0 && depth <= 64; depth++) {
    const next: typeof frontier = [];
    for (const { lot: child, parents } of frontier) {
      for (const p of parents) {
        if (seen.has(p.lot)) continue;
        seen.add(p.lot);
        const a = ancestor(p.lot);
        if (!a) continue;
        const link = a.entries.find((e) => e.header.seq === p.seq && e.hash === p.hash);
        if (!link || (link.header.kind !== 'split' && link.header.kind !== 'combined')) continue;
        const left: LeftBy = {
          kind: link.header.kind,
          seq: link.header.seq,
          time: link.header.time,
          actor: link.header.actor,
          child,
        };
        for (const e of a.entries) {
          const k = e.header.kind;
          if (!e.body || (k !== 'opinion' && k !== 'observed' && k !== 'exhibit-added')) continue;
          if (k === 'exhibit-added' && !('exhibit' in (e.body as ExhibitAddedBody))) continue;
          if (k === 'opinion' && a.opinions && !a.opinions.has(e.header.seq)) continue;
          const before = e.header.seq < left.seq;
          const byHolder = a.holders
            ? a.holders.get(e.header.seq) === e.header.actor
            : before && e.header.actor === left.actor;
          out.push({
            lot: p.lot,
            seq: e.header.seq,
            hash: e.hash,
            kind: k,
            time: e.header.time,
            actor: e.header.actor,
            body: e.body as InheritedEntry['body'],
            depth,
            left,
            before,
            byHolder,
            listed: a.listed,
          });
        }
        next.push({ lot: p.lot, parents: a.parents });
      }
    }
    frontier = next;
  }
  return out;
}

/** An opinion as the attribution on record weighs it, on this lot or inherited. */
export interface WeighedOpinion {
  lot: string;
  seq: number;
  hash: string;
  author: string;
  time: string;
  body: OpinionBody;
  /** 0 = recorded on this lot; 1 = on a parent; … */
  depth: number;
  /** The author held that lot when recording it. */
  byHolder: boolean;
}

/** Where the attribution on record comes from. */
export type RecordSource = 'holder' | 'earlier-holder' | 'ancestor';

/** The attribution on record of a lot and the opinions that agree or dissent with it. */
export interface AttributionOnRecord {
  /** null: no holder of this lot or of any ancestor has recorded an attribution. */
  record: WeighedOpinion | null;
  source: RecordSource | null;
  /** The opinion `record` adopts, when it names one that is on this lot or inherited. */
  adopted: WeighedOpinion | null;
  /** Other authors' opinions that agree with the record (none disagree). */
  agree: WeighedOpinion[];
  /** Other authors' opinions that disagree with it (different known origin, or periods apart). */
  dissent: WeighedOpinion[];
  /** Every standing opinion weighed, this lot's first, then inherited. */
  opinions: WeighedOpinion[];
}

/**
 * The attribution on record of a lot: the current holder's newest standing opinion; else the
 * latest opinion recorded by a holder of this lot while they held it (an earlier holder); else
 * the latest recorded by a holder of an ancestor. Every other standing opinion with a body, on
 * this lot or inherited, counts as agreeing or dissenting ({@link opinionsDisagree}), except
 * those by the record's own author and the one the record adopts. Preconditions: `entries` and
 * `state` come from one verified roll; `inherited` from {@link inheritedRecord}. Never throws.
 */
export function attributionOnRecord(
  entries: readonly VerifiedEntry[],
  state: RollState,
  inherited: readonly InheritedEntry[],
): AttributionOnRecord {
  const holders = holdersBySeq(entries);
  const bySeq = new Map(entries.map((e) => [e.header.seq, e]));
  const opinions: WeighedOpinion[] = [];
  for (const o of state.opinions) {
    const e = bySeq.get(o.seq);
    if (!o.body || !e) continue;
    opinions.push({
      lot: state.lot,
      seq: o.seq,
      hash: e.hash,
      author: o.author,
      time: o.time,
      body: o.body,
      depth: 0,
      byHolder: holders.get(o.seq) === o.author,
    });
  }
  for (const i of inherited) {
    if (i.kind !== 'opinion') continue;
    opinions.push({
      lot: i.lot,
      seq: i.seq,
      hash: i.hash,
      author: i.actor,
      time: i.time,
      body: i.body as OpinionBody,
      depth: i.depth,
      byHolder: i.byHolder,
    });
  }
  let record: WeighedOpinion | null = null;
  let source: RecordSource | null = null;
  if (state.attribution) {
    record = opinions.find((o) => o.depth === 0 && o.seq === state.attribution!.seq) ?? null;
    source = record ? 'holder' : null;
  }
  if (!record) {
    const latest = (list: WeighedOpinion[]) =>
      list.reduce<WeighedOpinion | null>((best, o) => (!best || o.time >= best.time ? o : best), null);
    const earlier = latest(opinions.filter((o) => o.depth === 0 && o.byHolder));
    const ancestral = latest(opinions.filter((o) => o.depth > 0 && o.byHolder));
    if (earlier && (!ancestral || earlier.time >= ancestral.time)) {
      record = earlier;
      source = 'earlier-holder';
    } else if (ancestral) {
      record = ancestral;
      source = 'ancestor';
    }
  }
  const ref = record?.body.adopts;
  const adopted = ref
    ? (opinions.find((o) => o.lot === ref.lot && o.seq === ref.seq && o.hash === ref.hash) ?? null)
    : null;
  const agree: WeighedOpinion[] = [];
  const dissent: WeighedOpinion[] = [];
  if (record) {
    for (const o of opinions) {
      if (o === record || o === adopted || o.author === record.author) continue;
      (opinionsDisagree(o.body, record.body) ? dissent : agree).push(o);
    }
  }
  return { record, source, adopted, agree, dissent, opinions };
}
