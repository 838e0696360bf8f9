import { factsOf } from './facts.js';
import type {
  AnyBody,
  BeadCount,
  EntryHeader,
  EntryKind,
  FormatVersion,
  LotDescription,
  OpinionBody,
  ParentRef,
  RegisteredBody,
  RuleFacts,
  SoldBody,
} from './types.js';
import { FORMAT_VERSION, RESERVED_ACTOR_PREFIX, SYSTEM_ACTOR, TRANSFER_KINDS } from './types.js';

/** Where a lot stands. `sold`, `split`, `combined` and `retired` are final. */
export type LotStatus = 'held' | 'offered' | 'sold' | 'split' | 'combined' | 'retired';

/** Final statuses: after them a roll takes only opinions, their withdrawal, exhibits, notes, descriptions and redactions. */
export const FINAL_STATUSES: readonly LotStatus[] = ['sold', 'split', 'combined', 'retired'];

/** The newest entry of a roll: what the next entry links to. */
export interface RollHead {
  lot: string;
  seq: number;
  hash: string;
  time: string;
}

/** An opinion still standing (not withdrawn). `body` is null when it was redacted. */
export interface OpinionRecord {
  seq: number;
  author: string;
  time: string;
  body: OpinionBody | null;
}

/** An offer waiting for an answer. `recipient` is null only when the offer's body was redacted. */
export interface OpenOffer {
  seq: number;
  offerer: string;
  recipient: string | null;
  time: string;
}

/**
 * An opinion request still open (format version 3): the `opinion-requested` entry at `seq` asks
 * `assessor`, or any account but the holder when `assessor` is null.
 */
export interface OpenRequest {
  seq: number;
  assessor: string | null;
  time: string;
}

/** A lot made from this one by a `split` or `combined` entry at `seq`. */
export interface ChildLink {
  lot: string;
  seq: number;
  count: BeadCount;
}

/**
 * The state of a lot derived from its verified entries only. Its size grows with opinions,
 * links and redactions, never with the number of entries.
 */
export interface RollState {
  lot: string;
  head: RollHead;
  status: LotStatus;
  holder: string;
  listed: boolean;
  /**
   * false between a `described` entry whose body is absent (redacted) and the next
   * description: `listed` and `remaining` are then not known, and rules that depend on them
   * are checked permissively.
   */
  listedKnown: boolean;
  /** The newest description; null when that description's body was redacted. */
  description: LotDescription | null;
  /** seq of the entry that wrote `description`. */
  descriptionSeq: number;
  /**
   * The newest description's count (from its rule facts); null only when a version-1
   * description body was removed. Optional in states stored before it existed.
   */
  count?: BeadCount | null;
  /** Beads taken out by every `split` and `combined` entry so far (estimated if any was). */
  taken?: BeadCount;
  /** Beads still in this lot: `count` less `taken` (never below 0). */
  remaining: BeadCount;
  /** Public exhibits on the roll whose entries are not redacted: what an opinion may cite. */
  exhibits?: Array<{ seq: number; sha256: string }>;
  /** The highest format version on the roll so far; a later entry never has a lower one. */
  version?: FormatVersion;
  openOffer: OpenOffer | null;
  /** Open opinion requests, oldest first (format version 3; absent in states stored before it). */
  openRequests?: OpenRequest[];
  /** Standing opinions, oldest first. */
  opinions: OpinionRecord[];
  /** The holder's newest standing opinion with a body, or null ("no attribution by the holder yet"). */
  attribution: OpinionRecord | null;
  /** Other authors' standing opinions that disagree with `attribution`. */
  dissents: OpinionRecord[];
  soldOn: string | null;
  /** seq of the `sold` entry, or null. */
  soldSeq: number | null;
  /** time of the `sold` entry, or null (a sale may be voided within {@link VOID_WINDOW_MS} of it). */
  soldTime: string | null;
  /** seqs of the entries holding a description (`registered` and `described`), oldest first. */
  descriptionSeqs: number[];
  /** seqs of the `observed` entries, oldest first. */
  observationSeqs: number[];
  parents: ParentRef[];
  children: ChildLink[];
  /** seqs of `split`/`combined` entries (never redactable). */
  linkSeqs: number[];
  /** seqs of `redacted` entries. */
  redactionSeqs: number[];
  /** seqs whose bodies a `redacted` entry removed. */
  redactedSeqs: number[];
}

/**
 * An entry about to be appended, as the rules see it. `body` null = not available (redacted);
 * `facts`, when given, are the header's rule facts (format version 2) and take precedence.
 */
export interface TransitionDraft {
  kind: EntryKind;
  actor: string;
  body: AnyBody | Omit<AnyBody, 'nonce'> | null;
  facts?: RuleFacts;
  parents?: ParentRef[];
  /** Format version of the entry; default {@link FORMAT_VERSION}. */
  version?: FormatVersion;
  /** The entry's time (RFC 3339 UTC); rules that depend on time (voiding a sale) need it. */
  time?: string;
}

/** How long after a sale its seller may void it: 24 hours, in milliseconds. */
export const VOID_WINDOW_MS = 24 * 60 * 60 * 1000;

/**
 * Outcome of {@link checkTransition}. `unchecked` (version 1 only) lists what the rules could
 * not check because a removed body held the fact they need.
 */
export type TransitionResult =
  { ok: true; unchecked?: string[] } | { ok: false; code: 'bad-actor' | 'bad-transition'; message: string };

/** Who may append a kind. */
export type ActorRule =
  | 'anyone'
  | 'holder'
  | 'holder-or-anyone-if-listed'
  | 'offer-recipient'
  | 'offerer'
  | 'system'
  | 'opinion-author';

/** One row of the rule table. */
export interface TransitionRule {
  actor: ActorRule;
  /** Statuses in which the kind may be appended; `registered` only opens a roll. */
  statuses: readonly LotStatus[];
}

const ALL: readonly LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];
const ACTIVE: readonly LotStatus[] = ['held', 'offered'];

/**
 * The rules of a roll, one row per kind: who may append it and in which statuses (each row's
 * comment sums up its rule; the comments are not shipped, as this table goes to browsers). The checks
 * that need more than this table (counts, offer seqs, redaction targets) are written in
 * {@link checkTransition} and in the format document. The server calls `checkTransition`
 * before every write; verifiers call it on read.
 */
export const TRANSITION_RULES: Readonly<Record<EntryKind, TransitionRule>> = {
  // seq 0 only; the actor becomes the holder
  registered: { actor: 'anyone', statuses: [] },
  // full new description; in a final status the count no longer changes
  described: { actor: 'holder', statuses: ALL },
  // physical observations
  observed: { actor: 'holder', statuses: ACTIVE },
  // the holder; anyone else (evidence for an opinion) on a listed lot, or (version 3) on an unlisted lot by naming an open request that asks them
  'exhibit-added': { actor: 'holder-or-anyone-if-listed', statuses: ALL },
  // the holder, or anyone on a listed lot, or (version 3) anyone an open request asks, naming it; that opinion closes the request
  opinion: { actor: 'holder-or-anyone-if-listed', statuses: ALL },
  // names a standing opinion by the same actor
  'opinion-withdrawn': { actor: 'opinion-author', statuses: ALL },
  // one open offer; the recipient is not the holder
  'transfer-offered': { actor: 'holder', statuses: ['held'] },
  // names the open offer; the actor becomes the holder
  'transfer-accepted': { actor: 'offer-recipient', statuses: ['offered'] },
  // names the open offer
  'transfer-declined': { actor: 'offer-recipient', statuses: ['offered'] },
  // names the open offer
  'transfer-withdrawn': { actor: 'offerer', statuses: ['offered'] },
  // names the open offer; actor beadroll:system
  'transfer-lapsed': { actor: 'system', statuses: ['offered'] },
  // children counts do not exceed an exact count
  split: { actor: 'holder', statuses: ['held'] },
  // count taken does not exceed an exact count
  combined: { actor: 'holder', statuses: ['held'] },
  // sale to a private buyer
  sold: { actor: 'holder', statuses: ['held'] },
  // the seller, within 24 hours of the sale it names (the current sale); the lot is held again
  'sale-voided': { actor: 'holder', statuses: ['sold'] },
  // taken out of trade
  retired: { actor: 'holder', statuses: ['held'] },
  // the server admits only the registrar; target is an earlier entry that is not seq 0, a link, a redaction, already redacted, or the open offer
  redacted: { actor: 'anyone', statuses: ALL },
  // optional ref to an earlier entry
  note: { actor: 'holder-or-anyone-if-listed', statuses: ALL },
  // asks a named assessor (not the holder, not a reserved id), or with null any assessor; the server admits only verified assessors
  'opinion-requested': { actor: 'holder', statuses: ACTIVE },
  // names an open opinion request and closes it
  'opinion-request-closed': { actor: 'holder', statuses: ACTIVE },
};

function bad(code: 'bad-actor' | 'bad-transition', message: string): TransitionResult {
  return { ok: false, code, message };
}

/** True for an account id in the reserved `beadroll:` range. */
export function isReservedActor(actor: string): boolean {
  return actor.startsWith(RESERVED_ACTOR_PREFIX);
}

/**
 * Kinds with a version-1 rule that reads the entry's own body and whose body can be removed
 * (split, combined and redacted bodies never are; a version-1 opinion has no such rule).
 */
const FACT_RULE_KINDS = new Set<EntryKind>([
  'described',
  'opinion-withdrawn',
  ...TRANSFER_KINDS,
  'note',
  'sale-voided',
]);

function sameCount(a: BeadCount, b: BeadCount): boolean {
  return a.value === b.value && a.estimated === b.estimated;
}

/** Beads still free to take, when that is known exactly; null when estimated or not known. */
function exactRemaining(state: RollState): number | null {
  return state.remaining.estimated ? null : state.remaining.value;
}

/**
 * Decides whether `draft` may be appended to a roll in `state` (null = the roll is empty).
 * Pure; never throws. The rules read the draft's rule facts: `draft.facts` when given (a
 * version-2 header), else those of `draft.body`; with neither (a version-1 entry whose body was
 * removed) the rules that need them are not applied and the result says so in `unchecked`, as
 * they are when the state lacks a fact a removed version-1 body held. `draft.version` (default
 * {@link FORMAT_VERSION}) selects the rules of that format version. Preconditions: `draft.body`,
 * when given, already has the shape of its kind (see `bodyIssues`); the actor is an account id.
 * Returns `bad-actor` when the wrong account writes, `bad-transition` when the kind is not
 * allowed now.
 */
export function checkTransition(state: RollState | null, draft: TransitionDraft): TransitionResult {
  const { kind, actor } = draft;
  const version = draft.version ?? FORMAT_VERSION;
  if (isReservedActor(actor) && !(actor === SYSTEM_ACTOR && kind === 'transfer-lapsed'))
    return bad('bad-actor', `the reserved account ${actor} does not write ${kind}`);
  if (state === null) {
    if (kind !== 'registered') return bad('bad-transition', 'a roll opens with a registered entry');
    return { ok: true };
  }
  if (kind === 'registered') return bad('bad-transition', 'registered only opens a roll');
  if (draft.parents && draft.parents.length > 0)
    return bad('bad-transition', 'only a registered entry names parents');
  const rule = TRANSITION_RULES[kind];
  if (!rule.statuses.includes(state.status)) {
    return bad('bad-transition', `${kind} is not allowed while the lot is ${state.status}`);
  }
  const unchecked: string[] = [];
  const isHolder = actor === state.holder;
  switch (rule.actor) {
    case 'holder':
      if (!isHolder) return bad('bad-actor', `only the holder may write ${kind}`);
      break;
    case 'holder-or-anyone-if-listed':
      // Version 3: on an unlisted lot, an opinion or its evidence may name the open request
      // that asks its author; the further rules below check that request.
      if (!isHolder && !state.listed && !(kind !== 'note' && requestOf(draft) !== undefined)) {
        if (state.listedKnown)
          return bad('bad-actor', `only the holder may write ${kind} on an unlisted lot`);
        unchecked.push('whether the lot was listed (its description was removed)');
      }
      break;
    case 'offer-recipient': {
      const offer = state.openOffer!;
      if (offer.recipient === null) {
        if (actor === offer.offerer) return bad('bad-actor', `only the offer's recipient may write ${kind}`);
        unchecked.push("the offer's recipient (the offer was removed)");
      } else if (actor !== offer.recipient) {
        return bad('bad-actor', `only the offer's recipient may write ${kind}`);
      }
      break;
    }
    case 'offerer':
      if (actor !== state.openOffer!.offerer)
        return bad('bad-actor', 'only the offerer may withdraw an offer');
      break;
    case 'system':
      if (actor !== SYSTEM_ACTOR) return bad('bad-actor', `only ${SYSTEM_ACTOR} writes ${kind}`);
      break;
    case 'opinion-author':
    case 'anyone':
      break;
  }
  const facts: RuleFacts | null = draft.facts ?? (draft.body ? factsOf(kind, draft.body as AnyBody) : null);
  if (facts === null) {
    if (FACT_RULE_KINDS.has(kind)) unchecked.push(`the rules of ${kind} (its body was removed)`);
    return done(unchecked);
  }
  const head = state.head.seq;
  switch (kind) {
    case 'observed':
      if (facts.corrects !== undefined && !state.observationSeqs.includes(facts.corrects))
        return bad('bad-transition', `seq ${facts.corrects} is not an earlier observation`);
      break;
    case 'sale-voided': {
      if (facts.saleSeq !== state.soldSeq) return bad('bad-transition', `the sale is seq ${state.soldSeq}`);
      if (draft.time === undefined || state.soldTime === null)
        return bad('bad-transition', 'a void needs the time of the sale and of the void');
      if (Date.parse(draft.time) - Date.parse(state.soldTime) > VOID_WINDOW_MS)
        return bad('bad-transition', 'a sale can be voided only within 24 hours of it');
      break;
    }
    case 'described': {
      if (facts.corrects !== undefined && !state.descriptionSeqs.includes(facts.corrects))
        return bad('bad-transition', `seq ${facts.corrects} is not an earlier description`);
      const count = countOf(state);
      const next = facts.count!;
      if (FINAL_STATUSES.includes(state.status)) {
        if (count === null) unchecked.push('the count before this description (it was removed)');
        else if (!sameCount(count, next))
          return bad('bad-transition', `in a final status the count stays ${countText(count)}`);
      } else {
        const taken = takenOf(state);
        if (!next.estimated && !taken.estimated && next.value < taken.value)
          return bad('bad-transition', `${taken.value} beads have already been taken from this lot`);
      }
      break;
    }
    case 'opinion': {
      if (version >= 2) {
        const known = new Set((state.exhibits ?? []).map((e) => e.sha256));
        const missing = facts.exhibits!.find((x) => !known.has(x));
        if (missing) return bad('bad-transition', `exhibit ${missing} is not on this roll`);
      }
      const r = checkRequest(state, actor, facts.request);
      if (r) return r;
      break;
    }
    case 'exhibit-added': {
      const r = checkRequest(state, actor, facts.request);
      if (r) return r;
      break;
    }
    case 'opinion-requested': {
      const a = facts.assessor!;
      if (a === state.holder) return bad('bad-transition', 'the holder does not ask themselves');
      if (a !== null && isReservedActor(a))
        return bad('bad-transition', 'a reserved account gives no opinions');
      break;
    }
    case 'opinion-request-closed':
      if (!(state.openRequests ?? []).some((q) => q.seq === facts.request))
        return bad('bad-transition', `seq ${facts.request} is not an open opinion request`);
      break;
    case 'opinion-withdrawn': {
      const seq = facts.opinionSeq!;
      const op = state.opinions.find((o) => o.seq === seq);
      if (!op) return bad('bad-transition', `seq ${seq} is not a standing opinion`);
      if (op.author !== actor) return bad('bad-actor', 'only its author may withdraw an opinion');
      break;
    }
    case 'transfer-offered': {
      const r = facts.recipient!;
      if (r === state.holder) return bad('bad-transition', 'an offer goes to another account');
      if (isReservedActor(r)) return bad('bad-transition', 'a reserved account takes no offers');
      break;
    }
    case 'transfer-accepted':
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed':
      if (facts.offerSeq !== state.openOffer!.seq) {
        return bad('bad-transition', `the open offer is seq ${state.openOffer!.seq}`);
      }
      break;
    case 'split':
    case 'combined': {
      const kids = kind === 'split' ? facts.children! : [{ lot: facts.child!, count: facts.count! }];
      if (kids.some((c) => c.lot === state.lot)) return bad('bad-transition', 'a lot is not its own child');
      const sum = kids.reduce((a, c) => a + c.count.value, 0);
      const free = exactRemaining(state);
      if (free !== null && sum > free)
        return bad('bad-transition', `takes ${sum} beads but ${free} are left in the lot`);
      if (free === null && countOf(state) === null && kids.every((c) => !c.count.estimated))
        unchecked.push('the count of the lot (its description was removed)');
      break;
    }
    case 'redacted': {
      const t = facts.target!;
      if (t > head) return bad('bad-transition', `seq ${t} is not an earlier entry`);
      if (t === 0) return bad('bad-transition', 'the registered entry cannot be redacted');
      if (state.linkSeqs.includes(t))
        return bad('bad-transition', 'split and combined entries cannot be redacted');
      if (state.redactionSeqs.includes(t)) return bad('bad-transition', 'a redaction cannot be redacted');
      if (state.redactedSeqs.includes(t)) return bad('bad-transition', `seq ${t} is already redacted`);
      if (state.openOffer?.seq === t) return bad('bad-transition', 'an open offer cannot be redacted');
      if (state.descriptionSeq === t) {
        return bad(
          'bad-transition',
          'the current description can be redacted only after a newer description replaces it',
        );
      }
      break;
    }
    case 'note': {
      const ref = facts.ref;
      if (ref !== undefined && ref > head) return bad('bad-transition', `seq ${ref} is not an earlier entry`);
      break;
    }
    default:
      break;
  }
  return done(unchecked);
}

/**
 * The open request an opinion or evidence by `actor` would answer (format version 3): the oldest
 * open request naming `actor`, else the oldest open to any assessor; undefined when none asks
 * them, or `actor` is the holder. Pure. Whether `actor` really is an assessor (which a request
 * open to any requires) is the caller's to check.
 */
export function requestFor(state: RollState, actor: string): number | undefined {
  if (actor === state.holder) return undefined;
  const open = state.openRequests ?? [];
  return (open.find((q) => q.assessor === actor) ?? open.find((q) => q.assessor === null))?.seq;
}

/** The `request` rule fact of a draft, from its facts or its body; undefined when it has none. */
function requestOf(draft: TransitionDraft): number | undefined {
  if (draft.facts) return draft.facts.request;
  const b = draft.body as { request?: unknown } | null;
  return typeof b?.request === 'number' ? b.request : undefined;
}

/**
 * Version 3: a `request` fact names an open request (else `bad-transition`) that asks `actor`:
 * the named assessor, or any account but the holder when it names none (else `bad-actor`).
 */
function checkRequest(state: RollState, actor: string, request: number | undefined): TransitionResult | null {
  if (request === undefined) return null;
  const q = (state.openRequests ?? []).find((x) => x.seq === request);
  if (!q) return bad('bad-transition', `seq ${request} is not an open opinion request`);
  if (q.assessor === null ? actor === state.holder : actor !== q.assessor)
    return bad('bad-actor', `the opinion request at seq ${request} asks another account`);
  return null;
}

/** The one answer for an entry the rules allow outright (callers only read it). */
const ALLOWED: TransitionResult = Object.freeze({ ok: true });

function done(unchecked: string[]): TransitionResult {
  return unchecked.length ? { ok: true, unchecked } : ALLOWED;
}

function countText(c: BeadCount): string {
  return `${c.estimated ? 'about ' : ''}${c.value}`;
}

/** The newest description's count; null when a version-1 description body was removed. */
function countOf(state: RollState): BeadCount | null {
  if (state.count !== undefined) return state.count;
  // A state stored before `count` existed: its remaining count is the best it knows.
  return state.description ? state.description.count : null;
}

function takenOf(state: RollState): BeadCount {
  return state.taken ?? { value: 0, estimated: false };
}

/** True when two opinions disagree: different known origins, or periods that do not overlap. */
export function opinionsDisagree(a: OpinionBody, b: OpinionBody): boolean {
  const originsDiffer = a.origin !== b.origin && a.origin !== 'unknown' && b.origin !== 'unknown';
  const periodsApart = a.period.to < b.period.from || b.period.to < a.period.from;
  return originsDiffer || periodsApart;
}

const ATTRIBUTION_KINDS = new Set<EntryKind>([
  'opinion',
  'opinion-withdrawn',
  'transfer-accepted',
  'redacted',
]);

function deriveAttribution(state: RollState): RollState {
  let attribution: OpinionRecord | null = null;
  for (const o of state.opinions) if (o.author === state.holder && o.body) attribution = o;
  const dissents = attribution
    ? state.opinions.filter(
        (o) => o.author !== state.holder && o.body && opinionsDisagree(o.body, attribution!.body!),
      )
    : [];
  return { ...state, attribution, dissents };
}

/** A verified entry as the reducer takes it: decoded header, its hash, decoded body or null. */
export interface ReducibleEntry {
  header: EntryHeader;
  hash: string;
  body: AnyBody | null;
}

/**
 * Applies one entry to a state (null for the first entry) and returns the new state. Pure.
 * Preconditions: the entry passed {@link checkTransition} against `state` and its header and
 * body were verified. The entry's rule facts come from its header (version 2) or its body
 * (version 1). A missing version-1 body has the effect the format defines: a description's
 * count and listing become unknown, an offer's recipient unknown; in every version a removed
 * opinion stops counting and a sale date becomes unknown.
 */
export function reduceEntry(state: RollState | null, entry: ReducibleEntry): RollState {
  return applyEntry(state, entry, false);
}

/**
 * {@link reduceEntry} for a caller that owns `state` and every array in it (a verifier or a
 * whole-roll reduction that built the state itself from seq 0): the state is updated in place
 * and returned, so a long roll costs no copy of its growing lists per entry. The state passed
 * in must not be used by anyone else afterwards.
 */
export function reduceEntryInPlace(state: RollState | null, entry: ReducibleEntry): RollState {
  return applyEntry(state, entry, true);
}

function applyEntry(state: RollState | null, entry: ReducibleEntry, owned: boolean): RollState {
  const { header: h, body } = entry;
  const facts: RuleFacts | null = h.facts ?? (body ? factsOf(h.kind, body) : null);
  const head: RollHead = { lot: h.lot, seq: h.seq, hash: entry.hash, time: h.time };
  if (state === null) {
    const d = (body as RegisteredBody).description;
    return deriveAttribution({
      lot: h.lot,
      head,
      status: 'held',
      holder: h.actor,
      listed: d.listed,
      listedKnown: true,
      description: d,
      descriptionSeq: 0,
      count: d.count,
      taken: { value: 0, estimated: false },
      remaining: d.count,
      exhibits: [],
      version: h.v,
      openOffer: null,
      openRequests: [],
      opinions: [],
      attribution: null,
      dissents: [],
      soldOn: null,
      soldSeq: null,
      soldTime: null,
      descriptionSeqs: [0],
      observationSeqs: [],
      parents: h.parents ?? [],
      children: [],
      linkSeqs: [],
      redactionSeqs: [],
      redactedSeqs: [],
    });
  }
  const s: RollState = owned ? state : { ...state };
  s.head = head;
  s.version = Math.max(state.version ?? 1, h.v) as FormatVersion;
  switch (h.kind) {
    case 'described': {
      s.description = body ? (body as RegisteredBody).description : null;
      s.descriptionSeq = h.seq;
      s.descriptionSeqs = add(owned, s.descriptionSeqs, h.seq);
      s.listed = facts ? facts.listed! : false;
      s.listedKnown = facts !== null;
      if (ACTIVE.includes(s.status)) {
        s.count = facts ? facts.count! : null;
        s.remaining = remainingAfter(s, null);
      }
      break;
    }
    case 'exhibit-added':
      if (facts?.original) s.exhibits = add(owned, s.exhibits, { seq: h.seq, sha256: facts.original });
      break;
    case 'opinion':
      s.opinions = add(owned, s.opinions, {
        seq: h.seq,
        author: h.actor,
        time: h.time,
        body: body as OpinionBody | null,
      });
      if (facts?.request !== undefined) s.openRequests = closeRequest(s, facts.request);
      break;
    case 'opinion-requested':
      s.openRequests = add(owned, s.openRequests, {
        seq: h.seq,
        assessor: facts ? facts.assessor! : null,
        time: h.time,
      });
      break;
    case 'opinion-request-closed':
      if (facts) s.openRequests = closeRequest(s, facts.request!);
      break;
    case 'opinion-withdrawn':
      if (facts) s.opinions = s.opinions.filter((o) => o.seq !== facts.opinionSeq);
      break;
    case 'transfer-offered':
      s.status = 'offered';
      s.openOffer = {
        seq: h.seq,
        offerer: h.actor,
        recipient: facts ? facts.recipient! : null,
        time: h.time,
      };
      break;
    case 'transfer-accepted':
      s.status = 'held';
      s.holder = h.actor;
      s.openOffer = null;
      // A new holder does not inherit the requests of the one before.
      if (s.openRequests?.length) s.openRequests = [];
      break;
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed':
      s.status = 'held';
      s.openOffer = null;
      break;
    case 'split':
    case 'combined': {
      const kids = h.kind === 'split' ? facts!.children! : [{ lot: facts!.child!, count: facts!.count! }];
      const took: BeadCount = {
        value: kids.reduce((a, c) => a + c.count.value, 0),
        estimated: kids.some((c) => c.count.estimated),
      };
      const before = s.taken ?? { value: 0, estimated: false };
      s.taken = { value: before.value + took.value, estimated: before.estimated || took.estimated };
      s.remaining = remainingAfter(s, took);
      for (const c of kids) s.children = add(owned, s.children, { lot: c.lot, seq: h.seq, count: c.count });
      s.linkSeqs = add(owned, s.linkSeqs, h.seq);
      if (s.remaining.value === 0) s.status = h.kind;
      break;
    }
    case 'observed':
      s.observationSeqs = add(owned, s.observationSeqs, h.seq);
      break;
    case 'sold':
      s.status = 'sold';
      s.soldOn = body ? (body as SoldBody).date : null;
      s.soldSeq = h.seq;
      s.soldTime = h.time;
      break;
    case 'sale-voided':
      s.status = 'held';
      s.soldOn = null;
      s.soldSeq = null;
      s.soldTime = null;
      break;
    case 'retired':
      s.status = 'retired';
      break;
    case 'redacted': {
      const t = facts!.target!;
      s.redactionSeqs = add(owned, s.redactionSeqs, h.seq);
      s.redactedSeqs = add(owned, s.redactedSeqs, t);
      if (s.opinions.some((o) => o.seq === t))
        s.opinions = s.opinions.map((o) => (o.seq === t ? { ...o, body: null } : o));
      if (s.exhibits?.some((e) => e.seq === t)) s.exhibits = s.exhibits.filter((e) => e.seq !== t);
      // The same effect as reading the target without its body, so a state never depends on
      // whether the removed body was still at hand.
      if (t === s.soldSeq) s.soldOn = null;
      break;
    }
    default:
      break;
  }
  // A lot that reaches a final status closes every open request.
  if (s.openRequests?.length && FINAL_STATUSES.includes(s.status)) s.openRequests = [];
  return ATTRIBUTION_KINDS.has(h.kind) ? deriveAttribution(s) : s;
}

/** `list` with `item` added at the end: a new array, or the same one when the state is owned. */
function add<T>(owned: boolean, list: T[] | undefined, item: T): T[] {
  if (!owned || list === undefined) return [...(list ?? []), item];
  list.push(item);
  return list;
}

function closeRequest(s: RollState, seq: number): OpenRequest[] {
  return (s.openRequests ?? []).filter((q) => q.seq !== seq);
}

/**
 * Beads left after `took` more were taken (null: after a new description): the count less
 * everything taken, never below 0; estimated when either is. When the count is not known (a
 * removed version-1 description) the previous remainder is carried on, marked estimated.
 */
function remainingAfter(s: RollState, took: BeadCount | null): BeadCount {
  const count = countOf(s);
  if (count === null || s.count === undefined) {
    const value = Math.max(0, s.remaining.value - (took?.value ?? 0));
    return {
      value,
      estimated: value === 0 ? false : count === null || s.remaining.estimated || !!took?.estimated,
    };
  }
  const taken = takenOf(s);
  const value = Math.max(0, count.value - taken.value);
  return { value, estimated: value === 0 ? false : count.estimated || taken.estimated };
}

/**
 * Derives the state of a whole roll from entries already verified in order (seq 0 first).
 * Precondition: the list is non-empty and verified (use `verifyRoll` for untrusted input).
 */
export function reduceRoll(entries: readonly ReducibleEntry[]): RollState {
  let s: RollState | null = null;
  for (const e of entries) s = applyEntry(s, e, true);
  if (s === null) throw new RangeError('a roll has at least one entry');
  return s;
}
