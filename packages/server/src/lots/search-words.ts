import type { Decoration, Origin, Period, Technique } from '@beadroll/core';
import type { AttributionRecord } from './attribution-record';

/** Words a dealer types for each origin (the place names and the adjectives of the trade). */
const ORIGIN_WORDS: Record<Origin, string> = {
  'venice-murano': 'Venice Murano Venetian Italy Italian',
  'bohemia-czech': 'Bohemia Bohemian Czech',
  india: 'India Indian',
  china: 'China Chinese',
  japan: 'Japan Japanese',
  'other-european': 'Europe European',
  unknown: 'unknown',
  other: 'other',
};

const TECHNIQUE_WORDS: Record<Technique, string> = {
  'wound-lampwork': 'wound lampwork lamp-wound',
  drawn: 'drawn cane',
  'pressed-moulded': 'pressed moulded molded',
  'furnace-wound': 'furnace wound',
  other: '',
};

const DECORATION_WORDS: Record<Decoration, string> = {
  roses: 'roses rose',
  'forget-me-nots': 'forget-me-nots forget-me-not',
  'other-flowers': 'flowers',
  trailing: 'trailing trailed',
  'gold-foil': 'gold foil',
  'silver-foil': 'silver foil',
  aventurine: 'aventurine goldstone',
  other: '',
};

/** "19th century" style words for each century a period touches (years 1 to 2100). */
function centuryWords(p: Period): string {
  const out: string[] = [];
  const from = Math.max(1, Math.min(p.from, p.to));
  const to = Math.min(2100, Math.max(p.from, p.to));
  for (let c = Math.floor((from - 1) / 100) + 1; c <= Math.floor((to - 1) / 100) + 1; c++) {
    const suffix = c % 100 >= 11 && c % 100 <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][c % 10] ?? 'th');
    out.push(`${c}${suffix}`);
  }
  return out.length ? `${out.join(' ')} century ${from} ${to}` : '';
}

/** Searchable words for an attribution: origin names, period years and centuries, technique, decoration. */
export function attributionWords(a: AttributionRecord | null): string {
  if (!a) return '';
  return [ORIGIN_WORDS[a.origin], centuryWords(a.period), TECHNIQUE_WORDS[a.technique], a.decoration]
    .filter(Boolean)
    .join(' ');
}

/** Searchable words for a description's decoration kinds. */
export function decorationWords(kinds: readonly Decoration[]): string {
  return kinds
    .map((k) => DECORATION_WORDS[k])
    .filter(Boolean)
    .join(' ');
}
