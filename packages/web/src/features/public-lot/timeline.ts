// The roll as plain-language events, one per verified entry, oldest first.
import {
  formatLotCode,
  SYSTEM_ACTOR,
  type AnyBody,
  type CombinedBody,
  type DescribedBody,
  type ExhibitAddedBody,
  type NoteBody,
  type ObservedBody,
  type OpinionBody,
  type OpinionRequestClosedBody,
  type OpinionRequestedBody,
  type OpinionWithdrawnBody,
  type RedactedBody,
  type SaleVoidedBody,
  type SoldBody,
  type SplitBody,
  type TransferAnswerBody,
  type TransferOfferedBody,
  type VerifiedEntry,
} from '@beadroll/core';
import type { DealerCard } from './public-lot.api';
import {
  countWords,
  dateWords,
  EXHIBIT_WORDS,
  observationPhrases,
  ORIGIN_WORDS,
  periodWords,
  REDACTION_WORDS,
} from './words';

/** A name for an account id: its dealer card's name, or a neutral phrase. */
export function nameOf(cards: Record<string, DealerCard>, actor: string | null | undefined): string {
  if (!actor) return 'an account whose name was removed';
  if (actor === SYSTEM_ACTOR) return 'Beadroll (automatically)';
  const c = cards[actor];
  if (c)
    return c.business && c.business !== c.displayName ? `${c.displayName} (${c.business})` : c.displayName;
  return 'an account without a registry card';
}

export interface LotLink {
  lot: string;
  label: string;
}

export interface TimelineItem {
  seq: number;
  time: string;
  kind: VerifiedEntry['header']['kind'];
  /** One plain sentence. */
  text: string;
  /** Quoted free text from the entry (a note, a transfer note), if any. */
  quote?: string;
  links?: LotLink[];
  /** Set when the registrar removed this entry's contents. */
  removed?: { on: string; reason: string };
  /** The entry carries sealed private details (committed on the roll, not public). */
  sealed: boolean;
  /** The earlier entry this one corrects, and why. */
  corrects?: { seq: number; reason: string };
}

/** Builds the timeline. Preconditions: `entries` verified, in seq order. */
export function buildTimeline(entries: VerifiedEntry[], cards: Record<string, DealerCard>): TimelineItem[] {
  const removedBy = new Map<number, VerifiedEntry>();
  for (const e of entries)
    if (e.header.kind === 'redacted' && e.body) removedBy.set((e.body as RedactedBody).target, e);
  const offers = new Map<number, { offerer: string; recipient: string | null }>();
  let holder: string | null = null;
  let listed: boolean | null = null;
  return entries.map((e) => {
    const h = e.header;
    const who = nameOf(cards, h.actor);
    const body = e.body as AnyBody | null;
    const item: TimelineItem = {
      seq: h.seq,
      time: h.time,
      kind: h.kind,
      text: '',
      sealed: h.sealed !== undefined,
    };
    const r = removedBy.get(h.seq);
    if (r) {
      item.removed = {
        on: dateWords(r.header.time),
        reason: REDACTION_WORDS[(r.body as RedactedBody).reason],
      };
    }
    switch (h.kind) {
      case 'registered': {
        holder = h.actor;
        listed = (body as { description?: { listed: boolean } } | null)?.description?.listed ?? null;
        item.text = h.parents?.length
          ? `Registered by ${who}, made from ${h.parents.length === 1 ? 'another lot' : `${h.parents.length} other lots`}.`
          : `Registered by ${who}.`;
        if (h.parents)
          item.links = h.parents.map((p) => ({ lot: p.lot, label: `lot ${formatLotCode(p.lot)}` }));
        break;
      }
      case 'described': {
        const d = (body as DescribedBody | null)?.description;
        const c = (body as DescribedBody | null)?.corrects;
        if (c) item.corrects = c;
        const change = d && listed !== null && d.listed !== listed ? d.listed : null;
        if (c)
          item.text = `Description corrected by ${who}${d ? `: “${d.title}”, ${countWords(d.count)}` : ''}.`;
        else if (change === true)
          item.text = `Listed publicly by ${who}: “${d!.title}”, ${countWords(d!.count)}.`;
        else if (change === false) item.text = `Made private by ${who}: the lot no longer has a public page.`;
        else
          item.text = d
            ? `Description updated by ${who}: “${d.title}”, ${countWords(d.count)}.`
            : `Description updated by ${who}.`;
        listed = d ? d.listed : null;
        break;
      }
      case 'observed': {
        const o = (body as ObservedBody | null)?.observations;
        const c = (body as ObservedBody | null)?.corrects;
        if (c) item.corrects = c;
        const phrases = o ? observationPhrases(o) : [];
        item.text = phrases.length
          ? `Observations ${c ? 'corrected' : ''} by ${who}: ${phrases.join(', ')}.`.replace('  ', ' ')
          : `Observations recorded by ${who}.`;
        if (o?.note) item.quote = o.note;
        break;
      }
      case 'exhibit-added': {
        const b = body as ExhibitAddedBody | null;
        if (b && 'exhibit' in b) {
          item.text = `A ${EXHIBIT_WORDS[b.exhibit.kind]} added by ${who}${b.exhibit.caption ? `: “${b.exhibit.caption}”` : ''}.`;
        } else if (b) {
          item.text = `A private exhibit sealed by ${who} (kept by its dealer, not shown).`;
        } else item.text = `An exhibit added by ${who}.`;
        if (b?.request !== undefined)
          item.text = item.text.replace(/\.$/, `, in answer to the request of entry ${b.request}.`);
        break;
      }
      case 'opinion': {
        const o = body as OpinionBody | null;
        item.text = o
          ? `Opinion by ${who}: ${ORIGIN_WORDS[o.origin]}, ${periodWords(o.period)}.`
          : `Opinion recorded by ${who}.`;
        if (o?.request !== undefined)
          item.text = item.text.replace(/\.$/, ` (asked for at entry ${o.request}).`);
        break;
      }
      case 'opinion-requested': {
        const b = body as OpinionRequestedBody | null;
        item.text = b?.assessor
          ? `Opinion asked of an assessor, ${nameOf(cards, b.assessor)}, by ${who}.`
          : b
            ? `Opinion asked of an assessor by ${who}: any verified assessor may answer.`
            : `Opinion asked of an assessor by ${who}.`;
        break;
      }
      case 'opinion-request-closed': {
        const b = body as OpinionRequestClosedBody | null;
        item.text = `Request withdrawn by ${who}${b ? ` (the request for an opinion at entry ${b.request})` : ''}.`;
        break;
      }
      case 'opinion-withdrawn': {
        const b = body as OpinionWithdrawnBody | null;
        item.text = b
          ? `${who} withdrew the opinion of entry ${b.opinionSeq}.`
          : `${who} withdrew an opinion.`;
        if (b?.note) item.quote = b.note;
        break;
      }
      case 'transfer-offered': {
        const b = body as TransferOfferedBody | null;
        offers.set(h.seq, { offerer: h.actor, recipient: b?.recipient ?? null });
        item.text = b
          ? `${who} offered the lot to ${nameOf(cards, b.recipient)}.`
          : `${who} offered the lot to another dealer.`;
        if (b?.note) item.quote = b.note;
        break;
      }
      case 'transfer-accepted': {
        const b = body as TransferAnswerBody | null;
        const offer = b ? offers.get(b.offerSeq) : undefined;
        const from = offer?.offerer ?? holder;
        item.text = `Passed from ${nameOf(cards, from)} to ${who}, who accepted the transfer.`;
        holder = h.actor;
        if (b?.note) item.quote = b.note;
        break;
      }
      case 'transfer-declined': {
        const b = body as TransferAnswerBody | null;
        const offer = b ? offers.get(b.offerSeq) : undefined;
        item.text = `${who} declined the offer${offer ? ` from ${nameOf(cards, offer.offerer)}` : ''}.`;
        if (b?.note) item.quote = b.note;
        break;
      }
      case 'transfer-withdrawn': {
        const b = body as TransferAnswerBody | null;
        const offer = b ? offers.get(b.offerSeq) : undefined;
        item.text = `${who} withdrew the offer${offer?.recipient ? ` to ${nameOf(cards, offer.recipient)}` : ''}.`;
        if (b?.note) item.quote = b.note;
        break;
      }
      case 'transfer-lapsed':
        item.text = 'The offer lapsed without an answer.';
        break;
      case 'split': {
        const b = body as SplitBody;
        item.text = `${who} split the lot into ${b.children.length} ${b.children.length === 1 ? 'lot' : 'lots'}.`;
        item.links = b.children.map((c) => ({
          lot: c.lot,
          label: `lot ${formatLotCode(c.lot)} (${countWords(c.count)})`,
        }));
        break;
      }
      case 'combined': {
        const b = body as CombinedBody;
        item.text = `${who} combined ${countWords(b.count)} from this lot into a new lot.`;
        item.links = [{ lot: b.child, label: `lot ${formatLotCode(b.child)}` }];
        break;
      }
      case 'sold': {
        const b = body as SoldBody | null;
        item.text = b
          ? `Sold by ${who} to a private buyer on ${dateWords(b.date)}.`
          : `Sold by ${who} to a private buyer.`;
        break;
      }
      case 'sale-voided': {
        const b = body as SaleVoidedBody | null;
        item.text = `${who} voided the sale${b ? ` of entry ${b.saleSeq}` : ''}: it was recorded by mistake, and the lot is held again.`;
        if (b?.reason) item.quote = b.reason;
        break;
      }
      case 'retired':
        item.text = `Taken out of trade by ${who}.`;
        if (body && 'note' in body && body.note) item.quote = body.note;
        break;
      case 'redacted': {
        const b = body as RedactedBody;
        item.text = `The registrar removed the contents of entry ${b.target} (${REDACTION_WORDS[b.reason]}); its fingerprint stays on the roll.`;
        break;
      }
      case 'note': {
        const b = body as NoteBody | null;
        item.text = b?.ref !== undefined ? `Note by ${who} on entry ${b.ref}.` : `Note by ${who}.`;
        if (b) item.quote = b.text;
        break;
      }
    }
    if (item.removed) item.quote = undefined;
    return item;
  });
}
