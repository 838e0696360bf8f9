import type {
  AnyBody,
  BeadCount,
  CombinedBody,
  EntryHeader,
  EntryKind,
  LotDescription,
  OpinionBody,
  OpinionWithdrawnBody,
  ParentRef,
  RedactedBody,
  RegisteredBody,
  SaleVoidedBody,
  SoldBody,
  Correction,
  SplitBody,
  TransferAnswerBody,
  TransferOfferedBody,
  NoteBody,
} from './types.js';
import { SYSTEM_ACTOR } from './types.js';

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
  /** Beads still in this lot (after splits and combinations). */
  remaining: BeadCount;
  openOffer: OpenOffer | null;
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

/** An entry about to be appended, as the rules see it. `body` null = not available (redacted). */
export interface TransitionDraft {
  kind: EntryKind;
  actor: string;
  body: AnyBody | Omit<AnyBody, 'nonce'> | null;
  parents?: ParentRef[];
  /** The entry's time (RFC 3339 UTC); rules that depend on time (voiding a sale) need it. */
  time?: string;
}

/** How long after a sale its seller may void it: 24 hours, in milliseconds. */
export const VOID_WINDOW_MS = 24 * 60 * 60 * 1000;

/** Outcome of {@link checkTransition}. */
export type TransitionResult =
  { ok: true } | { ok: false; code: 'bad-actor' | 'bad-transition'; message: string };

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
  summary: string;
}

const ALL: readonly LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];
const ACTIVE: readonly LotStatus[] = ['held', 'offered'];

/**
 * The rules of a roll, one row per kind: who may append it and in which statuses. The checks
 * that need more than this table (counts, offer seqs, redaction targets) are written in
 * {@link checkTransition} and in the format document. The server calls `checkTransition`
 * before every write; verifiers call it on read.
 */
export const TRANSITION_RULES: Readonly<Record<EntryKind, TransitionRule>> = {
  registered: { actor: 'anyone', statuses: [], summary: 'seq 0 only; the actor becomes the holder' },
  described: {
    actor: 'holder',
    statuses: ALL,
    summary: 'full new description; in a final status the count no longer changes',
  },
  observed: { actor: 'holder', statuses: ACTIVE, summary: 'physical observations' },
  'exhibit-added': {
    actor: 'holder-or-anyone-if-listed',
    statuses: ALL,
    summary: 'the holder while held or offered; anyone else (evidence for an opinion) only on a listed lot',
  },
  opinion: {
    actor: 'holder-or-anyone-if-listed',
    statuses: ALL,
    summary: 'the holder, or anyone on a listed lot',
  },
  'opinion-withdrawn': {
    actor: 'opinion-author',
    statuses: ALL,
    summary: 'names a standing opinion by the same actor',
  },
  'transfer-offered': {
    actor: 'holder',
    statuses: ['held'],
    summary: 'one open offer; the recipient is not the holder',
  },
  'transfer-accepted': {
    actor: 'offer-recipient',
    statuses: ['offered'],
    summary: 'names the open offer; the actor becomes the holder',
  },
  'transfer-declined': { actor: 'offer-recipient', statuses: ['offered'], summary: 'names the open offer' },
  'transfer-withdrawn': { actor: 'offerer', statuses: ['offered'], summary: 'names the open offer' },
  'transfer-lapsed': {
    actor: 'system',
    statuses: ['offered'],
    summary: `names the open offer; actor ${SYSTEM_ACTOR}`,
  },
  split: { actor: 'holder', statuses: ['held'], summary: 'children counts do not exceed an exact count' },
  combined: { actor: 'holder', statuses: ['held'], summary: 'count taken does not exceed an exact count' },
  sold: { actor: 'holder', statuses: ['held'], summary: 'sale to a private buyer' },
  'sale-voided': {
    actor: 'holder',
    statuses: ['sold'],
    summary: 'the seller, within 24 hours of the sale it names (the current sale); the lot is held again',
  },
  retired: { actor: 'holder', statuses: ['held'], summary: 'taken out of trade' },
  redacted: {
    actor: 'anyone',
    statuses: ALL,
    summary:
      'the server admits only the registrar; target is an earlier entry that is not seq 0, a link, a redaction, already redacted, or the open offer',
  },
  note: { actor: 'holder-or-anyone-if-listed', statuses: ALL, summary: 'optional ref to an earlier entry' },
};

function bad(code: 'bad-actor' | 'bad-transition', message: string): TransitionResult {
  return { ok: false, code, message };
}

/**
 * Decides whether `draft` may be appended to a roll in `state` (null = the roll is empty).
 * Pure; never throws. Preconditions: `draft.body`, when given, already has the shape of its
 * kind (see `bodyIssues`); the actor is an account id. Returns `bad-actor` when the wrong
 * account writes, `bad-transition` when the kind is not allowed now.
 */
export function checkTransition(state: RollState | null, draft: TransitionDraft): TransitionResult {
  const { kind, actor } = draft;
  if (state === null) {
    if (kind !== 'registered') return bad('bad-transition', 'a roll opens with a registered entry');
    if (actor === SYSTEM_ACTOR) return bad('bad-actor', 'the system account holds no lots');
    return { ok: true };
  }
  if (kind === 'registered') return bad('bad-transition', 'registered only opens a roll');
  if (draft.parents && draft.parents.length > 0)
    return bad('bad-transition', 'only a registered entry names parents');
  const rule = TRANSITION_RULES[kind];
  if (!rule.statuses.includes(state.status)) {
    return bad('bad-transition', `${kind} is not allowed while the lot is ${state.status}`);
  }
  const body = draft.body as Record<string, unknown> | null;
  const isHolder = actor === state.holder;
  switch (rule.actor) {
    case 'holder':
      if (!isHolder) return bad('bad-actor', `only the holder may write ${kind}`);
      break;
    case 'holder-or-anyone-if-listed':
      if (!isHolder && !state.listed && state.listedKnown)
        return bad('bad-actor', `only the holder may write ${kind} on an unlisted lot`);
      if (actor === SYSTEM_ACTOR) return bad('bad-actor', `the system account does not write ${kind}`);
      break;
    case 'offer-recipient': {
      const offer = state.openOffer!;
      if (offer.recipient !== null ? actor !== offer.recipient : actor === offer.offerer) {
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
  if (body === null) return { ok: true };
  const head = state.head.seq;
  switch (kind) {
    case 'described':
    case 'observed': {
      const c = (body as { corrects?: Correction }).corrects;
      if (c === undefined) break;
      const seqs = kind === 'described' ? state.descriptionSeqs : state.observationSeqs;
      if (!seqs.includes(c.seq))
        return bad(
          'bad-transition',
          kind === 'described'
            ? `seq ${c.seq} is not an earlier description`
            : `seq ${c.seq} is not an earlier observation`,
        );
      break;
    }
    case 'sale-voided': {
      const seq = (body as unknown as SaleVoidedBody).saleSeq;
      if (seq !== state.soldSeq) return bad('bad-transition', `the sale is seq ${state.soldSeq}`);
      if (draft.time === undefined || state.soldTime === null)
        return bad('bad-transition', 'a void needs the time of the sale and of the void');
      if (Date.parse(draft.time) - Date.parse(state.soldTime) > VOID_WINDOW_MS)
        return bad('bad-transition', 'a sale can be voided only within 24 hours of it');
      break;
    }
    case 'opinion-withdrawn': {
      const seq = (body as unknown as OpinionWithdrawnBody).opinionSeq;
      const op = state.opinions.find((o) => o.seq === seq);
      if (!op) return bad('bad-transition', `seq ${seq} is not a standing opinion`);
      if (op.author !== actor) return bad('bad-actor', 'only its author may withdraw an opinion');
      break;
    }
    case 'transfer-offered': {
      const r = (body as unknown as TransferOfferedBody).recipient;
      if (r === state.holder) return bad('bad-transition', 'an offer goes to another account');
      if (r === SYSTEM_ACTOR) return bad('bad-transition', 'the system account takes no offers');
      break;
    }
    case 'transfer-accepted':
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed':
      if ((body as unknown as TransferAnswerBody).offerSeq !== state.openOffer!.seq) {
        return bad('bad-transition', `the open offer is seq ${state.openOffer!.seq}`);
      }
      break;
    case 'split': {
      const b = body as unknown as SplitBody;
      if (b.children.some((c) => c.lot === state.lot))
        return bad('bad-transition', 'a lot is not its own child');
      const sum = b.children.reduce((s, c) => s + c.count.value, 0);
      if (!state.remaining.estimated && sum > state.remaining.value) {
        return bad('bad-transition', `children hold ${sum} beads but the lot has ${state.remaining.value}`);
      }
      break;
    }
    case 'combined': {
      const b = body as unknown as CombinedBody;
      if (b.child === state.lot) return bad('bad-transition', 'a lot is not its own child');
      if (!state.remaining.estimated && b.count.value > state.remaining.value) {
        return bad('bad-transition', `takes ${b.count.value} beads but the lot has ${state.remaining.value}`);
      }
      break;
    }
    case 'redacted': {
      const t = (body as unknown as RedactedBody).target;
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
      const ref = (body as unknown as NoteBody).ref;
      if (ref !== undefined && ref > head) return bad('bad-transition', `seq ${ref} is not an earlier entry`);
      break;
    }
    default:
      break;
  }
  return { ok: true };
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
 * body were verified. A missing body (redacted) has the effect the format defines: a
 * description becomes null and the lot unlisted, an opinion stops counting, an offer's
 * recipient becomes unknown, a sale date unknown.
 */
export function reduceEntry(state: RollState | null, entry: ReducibleEntry): RollState {
  const { header: h, body } = entry;
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
      remaining: d.count,
      openOffer: null,
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
  const s: RollState = { ...state, head };
  switch (h.kind) {
    case 'described': {
      const d = body ? (body as RegisteredBody).description : null;
      s.description = d;
      s.descriptionSeq = h.seq;
      s.descriptionSeqs = [...s.descriptionSeqs, h.seq];
      s.listed = d ? d.listed : false;
      s.listedKnown = d !== null;
      if (ACTIVE.includes(s.status))
        s.remaining = d ? d.count : { value: s.remaining.value, estimated: true };
      break;
    }
    case 'opinion':
      s.opinions = [
        ...s.opinions,
        { seq: h.seq, author: h.actor, time: h.time, body: body as OpinionBody | null },
      ];
      break;
    case 'opinion-withdrawn':
      if (body) s.opinions = s.opinions.filter((o) => o.seq !== (body as OpinionWithdrawnBody).opinionSeq);
      break;
    case 'transfer-offered':
      s.status = 'offered';
      s.openOffer = {
        seq: h.seq,
        offerer: h.actor,
        recipient: body ? (body as TransferOfferedBody).recipient : null,
        time: h.time,
      };
      break;
    case 'transfer-accepted':
      s.status = 'held';
      s.holder = h.actor;
      s.openOffer = null;
      break;
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed':
      s.status = 'held';
      s.openOffer = null;
      break;
    case 'split': {
      const b = body as SplitBody;
      const sum = b.children.reduce((a, c) => a + c.count.value, 0);
      const estimated = s.remaining.estimated || b.children.some((c) => c.count.estimated);
      const left = Math.max(0, s.remaining.value - sum);
      s.remaining = { value: left, estimated: left === 0 ? false : estimated };
      s.children = [...s.children, ...b.children.map((c) => ({ lot: c.lot, seq: h.seq, count: c.count }))];
      s.linkSeqs = [...s.linkSeqs, h.seq];
      if (left === 0) s.status = 'split';
      break;
    }
    case 'combined': {
      const b = body as CombinedBody;
      const left = Math.max(0, s.remaining.value - b.count.value);
      s.remaining = {
        value: left,
        estimated: left === 0 ? false : s.remaining.estimated || b.count.estimated,
      };
      s.children = [...s.children, { lot: b.child, seq: h.seq, count: b.count }];
      s.linkSeqs = [...s.linkSeqs, h.seq];
      if (left === 0) s.status = 'combined';
      break;
    }
    case 'observed':
      s.observationSeqs = [...s.observationSeqs, h.seq];
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
      const t = (body as RedactedBody).target;
      s.redactionSeqs = [...s.redactionSeqs, h.seq];
      s.redactedSeqs = [...s.redactedSeqs, t];
      if (s.opinions.some((o) => o.seq === t))
        s.opinions = s.opinions.map((o) => (o.seq === t ? { ...o, body: null } : o));
      // The same effect as reading the target without its body, so a state never depends on
      // whether the removed body was still at hand.
      if (t === s.soldSeq) s.soldOn = null;
      break;
    }
    default:
      break;
  }
  return ATTRIBUTION_KINDS.has(h.kind) ? deriveAttribution(s) : s;
}

/**
 * Derives the state of a whole roll from entries already verified in order (seq 0 first).
 * Precondition: the list is non-empty and verified (use `verifyRoll` for untrusted input).
 */
export function reduceRoll(entries: readonly ReducibleEntry[]): RollState {
  let s: RollState | null = null;
  for (const e of entries) s = reduceEntry(s, e);
  if (s === null) throw new RangeError('a roll has at least one entry');
  return s;
}
