import type { ActorRule, LotStatus, RollState } from './rules.js';
import { checkTransition, isReservedActor, requestFor, TRANSITION_RULES } from './rules.js';
import type { EntryKind, RuleFacts } from './types.js';

/**
 * Whether an account may append a kind to a roll now. When not, `why` says what stands in the
 * way (`actor`: it is another account's to write; `status`: not in the lot's status; `rule`:
 * another rule of the kind, such as the 24 hours to void a sale) and `reason` says it in words
 * a dealer reads.
 */
export type Permission =
  { allowed: true } | { allowed: false; why: 'actor' | 'status' | 'rule'; reason: string };

/** What the rules may need beyond the roll and the account. */
export interface PermissionContext {
  /** Time of the would-be entry (RFC 3339 UTC); without it, time rules (voiding a sale) are not checked. */
  now?: string;
}

/**
 * The target a kind's entry would name when the roll already says which it is: the open offer,
 * the current sale, the account's own newest standing opinion, the open request that asks the
 * account (an opinion or evidence on an unlisted lot). Kinds not listed here are decided
 * by their row of {@link TRANSITION_RULES} alone.
 */
const IMPLIED_FACTS: Partial<Record<EntryKind, (s: RollState, account: string) => RuleFacts>> = {
  'transfer-accepted': (s) => ({ offerSeq: s.openOffer!.seq }),
  'transfer-declined': (s) => ({ offerSeq: s.openOffer!.seq }),
  'transfer-withdrawn': (s) => ({ offerSeq: s.openOffer!.seq }),
  'transfer-lapsed': (s) => ({ offerSeq: s.openOffer!.seq }),
  'sale-voided': (s) => ({ saleSeq: s.soldSeq ?? -1 }),
  // Version 3: an asked assessor's opinion or evidence names the open request that asks them.
  opinion: (s, account) => {
    const request = requestFor(s, account);
    return request === undefined ? { exhibits: [] } : { exhibits: [], request };
  },
  'exhibit-added': (s, account) => {
    const request = requestFor(s, account);
    return request === undefined ? {} : { request };
  },
  'opinion-withdrawn': (s, account) => ({
    opinionSeq: [...s.opinions].reverse().find((o) => o.author === account)?.seq ?? -1,
  }),
};

/** What the lot's status rules out, as a dealer reads it. */
function statusWords(s: RollState): string {
  const words: Record<LotStatus, string> = {
    held: 'This lot is held, with no open offer and no sale to act on.',
    offered: 'This lot has an open offer: wait for the other dealer’s answer or withdraw the offer first.',
    sold: `This lot was sold${s.soldOn ? ` on ${s.soldOn}` : ''}.`,
    split: 'This lot was split up: no beads are left in it.',
    combined: 'This lot went into another lot: no beads are left in it.',
    retired: 'This lot was retired from trade.',
  };
  return words[s.status] ?? `This lot is ${s.status}.`;
}

/** Who may write a kind, as a dealer reads it. */
const ACTOR_WORDS: Record<ActorRule, string> = {
  anyone: 'A reserved account does not write on a roll.',
  holder: 'Only the dealer who holds this lot can do this.',
  'holder-or-anyone-if-listed': 'This lot is unlisted: only the dealer who holds it can do this.',
  'offer-recipient': 'Only the dealer this lot is offered to can answer the offer.',
  offerer: 'Only the dealer who made the offer can withdraw it.',
  system: 'Only Beadroll itself writes this, when an offer runs out.',
  'opinion-author': 'Only its author can withdraw an opinion.',
};

/** Other rules of a kind, as a dealer reads them (else the rule's own message is shown). */
const RULE_WORDS: Partial<Record<EntryKind, string>> = {
  'opinion-withdrawn': 'You have no standing opinion on this lot to withdraw.',
  'sale-voided': 'A sale can be voided only within 24 hours of it.',
};

function sentence(message: string): string {
  const m = message.charAt(0).toUpperCase() + message.slice(1);
  return m.endsWith('.') ? m : `${m}.`;
}

/**
 * Whether `account` may append an entry of `kind` to the roll in `state` (null = no roll yet)
 * now, decided by {@link checkTransition} and the kind's row of {@link TRANSITION_RULES}: who
 * writes it, in which statuses, and the rules whose target the roll already names (the open
 * offer, the current sale, the account's own opinion; the sale's 24 hours when `context.now` is
 * given). Rules that depend on what the entry would say (counts, redaction targets, cited
 * exhibits) are left to the write itself. Pure. Precondition: `account` is an account id.
 * Server policy on roles (registrar, verified accounts) is not part of it.
 */
export function mayAppend(
  state: RollState | null,
  kind: EntryKind,
  account: string,
  context: PermissionContext = {},
): Permission {
  const rule = TRANSITION_RULES[kind];
  const inStatus = state !== null && rule.statuses.includes(state.status);
  const implied = inStatus ? IMPLIED_FACTS[kind] : undefined;
  const facts = implied ? implied(state!, account) : undefined;
  const result = checkTransition(state, {
    kind,
    actor: account,
    body: null,
    ...(facts && (kind !== 'sale-voided' || context.now !== undefined) ? { facts } : {}),
    ...(context.now !== undefined ? { time: context.now } : {}),
  });
  if (result.ok) return { allowed: true };
  if (isReservedActor(account)) return { allowed: false, why: 'actor', reason: ACTOR_WORDS.anyone };
  if (state === null) return { allowed: false, why: 'status', reason: 'A roll opens with its registration.' };
  if (!inStatus) {
    const reason = kind === 'registered' ? 'This lot is already registered.' : statusWords(state);
    return { allowed: false, why: 'status', reason };
  }
  if (result.code === 'bad-actor')
    return { allowed: false, why: 'actor', reason: ACTOR_WORDS[rule.actor] ?? sentence(result.message) };
  return { allowed: false, why: 'rule', reason: RULE_WORDS[kind] ?? sentence(result.message) };
}

/**
 * What `account` may append to the roll in `state` now: one {@link Permission} per kind of the
 * rule table (a kind added to {@link TRANSITION_RULES} appears here with no other change). See
 * {@link mayAppend} for what is and is not decided.
 */
export function allowedActions(
  state: RollState | null,
  account: string,
  context: PermissionContext = {},
): Record<EntryKind, Permission> {
  const out = {} as Record<EntryKind, Permission>;
  for (const kind of Object.keys(TRANSITION_RULES) as EntryKind[])
    out[kind] = mayAppend(state, kind, account, context);
  return out;
}
