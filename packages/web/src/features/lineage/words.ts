import type { BeadCount, OpinionBody } from '@beadroll/core';
import { ORIGIN_WORDS as PUBLIC_ORIGIN_WORDS } from '../public-lot/words';

// The public page's words for origins, with "or" where it writes a slash: this line is prose.
const ORIGIN_WORDS: Record<OpinionBody['origin'], string> = {
  ...PUBLIC_ORIGIN_WORDS,
  'venice-murano': 'Venice or Murano',
  'bohemia-czech': 'Bohemia or Czech lands',
};

/** "about 40 beads" / "1 bead". */
export function beadsText(c: BeadCount): string {
  return `${c.estimated ? 'about ' : ''}${c.value} ${c.value === 1 ? 'bead' : 'beads'}`;
}

/** A one-line summary of an opinion: origin, years, confidence. */
export function opinionText(o: OpinionBody): string {
  const years = o.period.from === o.period.to ? `${o.period.from}` : `${o.period.from}–${o.period.to}`;
  return `${ORIGIN_WORDS[o.origin]}, ${o.period.approximate ? 'about ' : ''}${years} (${o.confidence} confidence)`;
}
