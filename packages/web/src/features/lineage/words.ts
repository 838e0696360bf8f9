import type { BeadCount, OpinionBody } from '@beadroll/core';

const ORIGIN_WORDS: Record<OpinionBody['origin'], string> = {
  'venice-murano': 'Venice or Murano',
  'bohemia-czech': 'Bohemia or Czech lands',
  india: 'India',
  china: 'China',
  japan: 'Japan',
  'other-european': 'elsewhere in Europe',
  unknown: 'origin unknown',
  other: 'another origin',
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
