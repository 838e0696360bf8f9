// Plain words for the attribution on record and where an inherited entry was recorded.
import {
  formatLotCode,
  type AttributionOnRecord,
  type InheritedEntry,
  type WeighedOpinion,
} from '@beadroll/core';
import type { DealerCard } from './public-lot.api';
import { nameOf } from './timeline';
import { dateWords } from './words';

/** An author's name with their role when they are an assessor (or the registrar). */
export function authorWords(cards: Record<string, DealerCard>, id: string): string {
  const role = cards[id]?.role;
  const name = nameOf(cards, id);
  return role === 'assessor'
    ? `${name}, independent assessor`
    : role === 'registrar'
      ? `${name}, registrar`
      : name;
}

/** "before it was split on 3 March 2025" for an ancestor's link entry. */
export function leftWords(left: InheritedEntry['left'], before: boolean): string {
  const how = left.kind === 'split' ? 'split' : 'combined into another lot';
  return `${before ? 'before' : 'after'} it was ${how} on ${dateWords(left.time)}`;
}

/** Where an opinion was recorded, for a lot page: "on this lot" or "on lot X, before it was split on …". */
export function whereWords(o: WeighedOpinion, inherited: readonly InheritedEntry[]): string {
  if (o.depth === 0) return 'on this lot';
  const i = inherited.find((x) => x.lot === o.lot && x.seq === o.seq);
  const rel = o.depth === 1 ? 'the lot these beads came from' : 'a lot further back';
  return `on lot ${formatLotCode(o.lot)} (${rel})${i ? `, ${leftWords(i.left, i.before)}` : ''}`;
}

/** Who stands behind the attribution on record, in words. */
export function recordWhoWords(
  r: AttributionOnRecord,
  cards: Record<string, DealerCard>,
  inherited: readonly InheritedEntry[],
): string {
  if (!r.record) return '';
  const who = authorWords(cards, r.record.author);
  const when = dateWords(r.record.time);
  if (r.source === 'holder') {
    const adopted = r.adopted
      ? `, adopting the attribution ${r.adopted.depth === 0 ? 'of the previous holder' : 'recorded on an earlier lot'}, ${authorWords(cards, r.adopted.author)}`
      : '';
    return `attributed by the holder, ${who}, on ${when}${adopted}`;
  }
  if (r.source === 'earlier-holder') return `attributed by the previous holder, ${who}, on ${when}`;
  const o = r.record;
  const i = inherited.find((x) => x.lot === o.lot && x.seq === o.seq);
  const rel = o.depth === 1 ? 'the lot these beads came from' : 'a lot further back';
  return `attributed by ${who} on ${when}, as holder of lot ${formatLotCode(o.lot)}, ${rel}${i ? `, ${leftWords(i.left, i.before)}` : ''}`;
}
