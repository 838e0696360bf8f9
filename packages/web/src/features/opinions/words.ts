import type { Confidence, Origin, Qualifier, Technique } from '@beadroll/core';

// Years and periods read the same here as on the public page.
export { periodWords as periodLabel } from '../public-lot/words';

/** Plain-English labels for the attribution vocabulary. */
export const ORIGIN_LABELS: Record<Origin, string> = {
  'venice-murano': 'Venice / Murano',
  'bohemia-czech': 'Bohemia / Czech lands',
  india: 'India',
  china: 'China',
  japan: 'Japan',
  'other-european': 'Other European',
  unknown: 'Unknown',
  other: 'Other (say which)',
};

export const TECHNIQUE_LABELS: Record<Technique, string> = {
  'wound-lampwork': 'Wound / lampwork',
  drawn: 'Drawn',
  'pressed-moulded': 'Pressed or moulded',
  'furnace-wound': 'Furnace-wound',
  other: 'Other',
};

export const QUALIFIER_LABELS: Record<Qualifier, string> = {
  by: 'By (certain)',
  'attributed-to': 'Attributed to',
  'in-the-style-of': 'In the style of',
  'later-copy': 'Later copy',
};

export const CONFIDENCE_LABELS: Record<Confidence, string> = {
  low: 'Low confidence',
  medium: 'Medium confidence',
  high: 'High confidence',
};

export function originLabel(origin: Origin, note?: string): string {
  if (origin === 'other') return note ? `Other: ${note}` : 'Other';
  return note ? `${ORIGIN_LABELS[origin]} (${note})` : ORIGIN_LABELS[origin];
}
