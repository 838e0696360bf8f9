import type { AnyBody, BodyByKind, EntryKind, LotDescription, VerifiedEntry } from '@beadroll/core';
import { formatLotCode } from '@beadroll/core';
import { describeObservations, DECORATION_LABEL, formatCount, FORM_LABEL, ORIGIN_LABEL } from './labels';

/** One line of the timeline, in plain words. */
export interface TimelineLine {
  seq: number;
  kind: EntryKind;
  actor: string;
  time: string;
  hash: string;
  /** What happened, after the actor's name: "registered the lot". */
  what: string;
  /** Details, when the entry carries any. */
  detail?: string;
  /** The earlier entry this one corrects, and why. */
  corrects?: { seq: number; reason: string };
}

function code(c: string): string {
  try {
    return formatLotCode(c);
  } catch {
    return c;
  }
}

function descriptionDetail(d: LotDescription): string {
  const parts = [d.title, FORM_LABEL[d.form], `${formatCount(d.count)} beads`];
  if (d.decoration.length) parts.push(d.decoration.map((x) => DECORATION_LABEL[x]).join(', '));
  return parts.join(' · ');
}

function body<K extends EntryKind>(b: AnyBody | null, _k: K): BodyByKind[K] | null {
  return b as BodyByKind[K] | null;
}

/**
 * Turns verified entries into plain sentences. `name` gives a person's name for an account id
 * (used for the other party of an offer).
 */
export function timelineOf(entries: readonly VerifiedEntry[], name: (id: string) => string): TimelineLine[] {
  let previous: LotDescription | null = null;
  return entries.map((e) => {
    const h = e.header;
    const base = { seq: h.seq, kind: h.kind, actor: h.actor, time: h.time, hash: e.hash };
    const removed = e.body === null;
    const line = (what: string, detail?: string): TimelineLine => ({
      ...base,
      what,
      detail: removed ? 'The text of this entry was removed; its hash still holds the chain.' : detail,
    });
    switch (h.kind) {
      case 'registered': {
        const b = body(e.body, 'registered');
        previous = b?.description ?? null;
        return line('registered the lot', b ? descriptionDetail(b.description) : undefined);
      }
      case 'described': {
        const b = body(e.body, 'described');
        const d = b?.description ?? null;
        const before = previous;
        previous = d;
        if (b?.corrects)
          return {
            ...line('corrected the description', d ? descriptionDetail(d) : undefined),
            corrects: b.corrects,
          };
        if (d && before && before.listed !== d.listed && sameApartFromListing(before, d))
          return line(d.listed ? 'listed the lot (it now has a public page)' : 'unlisted the lot');
        return line('wrote a new description', d ? descriptionDetail(d) : undefined);
      }
      case 'observed': {
        const b = body(e.body, 'observed');
        if (b?.corrects)
          return {
            ...line('corrected observations', describeObservations(b.observations)),
            corrects: b.corrects,
          };
        return line('recorded observations', b ? describeObservations(b.observations) : undefined);
      }
      case 'exhibit-added': {
        const b = body(e.body, 'exhibit-added');
        if (b && 'sealedOnly' in b) return line('added a private exhibit');
        return line(
          'added an exhibit',
          b && 'exhibit' in b ? (b.exhibit.caption ?? b.exhibit.kind) : undefined,
        );
      }
      case 'opinion': {
        const b = body(e.body, 'opinion');
        const detail = b
          ? `${ORIGIN_LABEL[b.origin]}, ${b.period.approximate ? 'about ' : ''}${b.period.from}–${b.period.to}, ${b.confidence} confidence`
          : undefined;
        return line(
          b?.request !== undefined
            ? `recorded an opinion asked for at entry ${b.request}`
            : 'recorded an opinion',
          detail,
        );
      }
      case 'opinion-requested': {
        const b = body(e.body, 'opinion-requested');
        return line(
          b?.assessor
            ? `asked ${name(b.assessor)} for an opinion`
            : 'asked any verified assessor for an opinion',
        );
      }
      case 'opinion-request-closed': {
        const b = body(e.body, 'opinion-request-closed');
        return line(
          b
            ? `withdrew the request for an opinion of entry ${b.request}`
            : 'withdrew a request for an opinion',
        );
      }
      case 'opinion-withdrawn': {
        const b = body(e.body, 'opinion-withdrawn');
        return line(b ? `withdrew the opinion of entry ${b.opinionSeq}` : 'withdrew an opinion', b?.note);
      }
      case 'transfer-offered': {
        const b = body(e.body, 'transfer-offered');
        return line(
          b ? `offered the lot to ${name(b.recipient)}` : 'offered the lot to another dealer',
          b?.note,
        );
      }
      case 'transfer-accepted':
        return line('accepted the transfer and now holds the lot', body(e.body, 'transfer-accepted')?.note);
      case 'transfer-declined':
        return line('declined the transfer', body(e.body, 'transfer-declined')?.note);
      case 'transfer-withdrawn':
        return line('withdrew the offer', body(e.body, 'transfer-withdrawn')?.note);
      case 'transfer-lapsed':
        return line('let the offer lapse (no answer in time)');
      case 'split': {
        const b = body(e.body, 'split');
        return line(
          b ? `split off ${b.children.length} new lot${b.children.length === 1 ? '' : 's'}` : 'split the lot',
          b?.children.map((c) => `${code(c.lot)}: ${formatCount(c.count)} beads`).join('; '),
        );
      }
      case 'combined': {
        const b = body(e.body, 'combined');
        return line(
          'put beads into another lot',
          b ? `${formatCount(b.count)} beads into ${code(b.child)}` : undefined,
        );
      }
      case 'sold': {
        const b = body(e.body, 'sold');
        return line('sold the lot to a private buyer', b ? `on ${b.date}` : undefined);
      }
      case 'sale-voided': {
        const b = body(e.body, 'sale-voided');
        return line(
          b ? `voided the sale of entry ${b.saleSeq} (recorded by mistake)` : 'voided the sale',
          b?.reason,
        );
      }
      case 'retired':
        return line('took the lot out of trade', body(e.body, 'retired')?.note);
      case 'redacted': {
        const b = body(e.body, 'redacted');
        return line(
          b ? `removed the text of entry ${b.target}` : 'removed the text of an entry',
          b ? `reason: ${b.reason.replace(/-/g, ' ')}` : undefined,
        );
      }
      case 'note':
        return line('added a note', body(e.body, 'note')?.text);
      default:
        return line(`wrote a ${String(h.kind)} entry`);
    }
  });
}

function sameApartFromListing(a: LotDescription, b: LotDescription): boolean {
  return JSON.stringify({ ...a, listed: false }) === JSON.stringify({ ...b, listed: false });
}
