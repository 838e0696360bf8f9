// Plain-English words for what a roll records. Only wording lives here; every value comes from
// verified entries.
import type {
  BaseGlass,
  BeadCount,
  Confidence,
  Decoration,
  ExhibitKind,
  LotForm,
  LotStatus,
  Observations,
  Origin,
  Qualifier,
  ReasonCode,
  RedactionReason,
  Technique,
} from '@beadroll/core';

export const ORIGIN_WORDS: Record<Origin, string> = {
  'venice-murano': 'Venice / Murano',
  'bohemia-czech': 'Bohemia / Czech lands',
  india: 'India',
  china: 'China',
  japan: 'Japan',
  'other-european': 'elsewhere in Europe',
  unknown: 'origin unknown',
  other: 'another origin',
};

export const TECHNIQUE_WORDS: Record<Technique, string> = {
  'wound-lampwork': 'wound at the lamp',
  drawn: 'drawn',
  'pressed-moulded': 'pressed or moulded',
  'furnace-wound': 'furnace-wound',
  other: 'another technique',
};

export const QUALIFIER_WORDS: Record<Qualifier, string> = {
  by: 'made there',
  'attributed-to': 'attributed',
  'in-the-style-of': 'in the style of',
  'later-copy': 'a later copy',
};

export const CONFIDENCE_WORDS: Record<Confidence, string> = {
  low: 'low confidence',
  medium: 'medium confidence',
  high: 'high confidence',
};

export const FORM_WORDS: Record<LotForm, string> = {
  loose: 'loose beads',
  strand: 'strand',
  necklace: 'necklace',
  piece: 'finished piece',
  mixed: 'mixed lot',
};

export const BASE_GLASS_WORDS: Record<BaseGlass, string> = {
  opaque: 'opaque',
  transparent: 'transparent',
  satin: 'satin',
  other: 'other',
};

export const DECORATION_WORDS: Record<Decoration, string> = {
  roses: 'roses',
  'forget-me-nots': 'forget-me-nots',
  'other-flowers': 'other flowers',
  trailing: 'trailing',
  'gold-foil': 'gold foil',
  'silver-foil': 'silver foil',
  aventurine: 'aventurine',
  other: 'other decoration',
};

export const STATUS_WORDS: Record<LotStatus, string> = {
  held: 'held by a dealer',
  offered: 'offered to another dealer',
  sold: 'sold',
  split: 'split into other lots',
  combined: 'combined into another lot',
  retired: 'taken out of trade',
};

export const EXHIBIT_WORDS: Record<ExhibitKind, string> = {
  'whole-lot': 'photo of the whole lot',
  'close-up': 'close-up',
  hole: 'photo of a bead hole',
  'uv-a': 'photo under UV-A light',
  'reference-page': 'reference page',
  receipt: 'receipt',
  other: 'file',
};

export const REDACTION_WORDS: Record<RedactionReason, string> = {
  'personal-data': 'personal data',
  'unlawful-content': 'unlawful content',
  abuse: 'abuse',
  'holder-request': "at the holder's request",
};

/** Why an entry fails, in words a buyer can follow (the reason code is shown beside it). */
export const BREAK_WORDS: Record<ReasonCode, string> = {
  'non-canonical': 'its stored text is not in the exact form that was fingerprinted',
  'unknown-version': 'it is written in a format version this page does not know',
  'bad-header': 'its header is damaged or belongs to another lot',
  'bad-seq': 'an entry is missing or out of order',
  'bad-time': 'its time is earlier than the entry before it',
  'bad-actor': 'it was written by an account that may not write it',
  'bad-prev': 'it does not link to the entry before it',
  'bad-body-digest': 'its contents do not match the fingerprint recorded in its header',
  'bad-parent': 'its link to a parent or child lot does not match the other side',
  'bad-hash': 'its header does not match its fingerprint',
  'missing-body': 'its contents are missing and no removal by the registrar is on record',
  'bad-body': 'its contents are not a valid entry of its kind',
  'bad-transition': 'the rules of a roll do not allow it at that point',
  'bad-facts': 'the facts its header commits to do not match its contents',
  'bad-roll': 'the data served for this lot is not shaped like a roll',
  'bad-entry': 'an entry in the data served is not shaped like an entry',
  'bad-lot-code': 'the data served names a lot code that is not valid',
  'duplicate-lot': 'the data served holds this lot more than once',
  'bad-log-index': 'an entry carries a log position that is not a whole number',
  'unnamed-link': 'the data served includes an entry of another lot that no lot here was made from',
};

const OBSERVATION_WORDS: { [K in keyof Observations]-?: (v: NonNullable<Observations[K]>) => string } = {
  hole: (v) =>
    ({
      clean: 'clean hole',
      powder: 'powder in the hole',
      'green-traces': 'green traces in the hole',
      'not-seen': 'hole not seen',
    })[v],
  holeShape: (v) => (v === 'irregular' ? 'irregular hole' : 'regular hole'),
  windingMarks: (v) => (v === 'seen' ? 'winding marks seen' : 'no winding marks seen'),
  beadShape: (v) => (v === 'irregular' ? 'irregular shapes' : 'uniform shapes'),
  mouldSeam: (v) => (v === 'seen' ? 'mould seam seen' : 'no mould seam seen'),
  surface: (v) => `${v} surface`,
  foil: (v) => ({ none: 'no foil', intact: 'foil intact', worn: 'foil worn' })[v],
  uvA: (v) =>
    ({
      'not-tested': 'not tested under UV-A',
      none: 'no response under UV-A',
      'green-glow': 'green glow under UV-A',
      other: 'a response under UV-A',
    })[v],
  note: (v) => v,
};

/** The recorded physical clues as a list of short phrases. */
export function observationPhrases(o: Observations): string[] {
  const out: string[] = [];
  const keys = [
    'hole',
    'holeShape',
    'windingMarks',
    'beadShape',
    'mouldSeam',
    'surface',
    'foil',
    'uvA',
  ] as const;
  for (const key of keys) {
    const v = o[key];
    if (v !== undefined) out.push((OBSERVATION_WORDS[key] as (x: typeof v) => string)(v));
  }
  return out;
}

/** Years and periods in words come from core, so e-mails and pages say the same. */
export { periodWords, yearWords } from '@beadroll/core';

/** "40 beads", "about 25 beads". */
export function countWords(c: BeadCount): string {
  const n = `${c.value.toLocaleString('en')} ${c.value === 1 ? 'bead' : 'beads'}`;
  return c.estimated ? `about ${n}` : n;
}

/** Millimetres per inch, exactly (international inch of 1959). */
export const MM_PER_INCH = 25.4;

/** "406.4 mm (16 in)" */
export function lengthWords(mm: number): string {
  const inches = Math.round((mm / MM_PER_INCH) * 10) / 10;
  return `${mm} mm (${inches} in)`;
}

/** "7–9.5 mm" */
export function diameterWords(d: { min: number; max: number }): string {
  return d.min === d.max ? `${d.min} mm` : `${d.min}–${d.max} mm`;
}

/** A UTC time shown as a date in the viewer's locale. */
export function dateWords(iso: string, locale?: string): string {
  const d = /^\d{4}-\d{2}-\d{2}$/.test(iso) ? new Date(`${iso}T12:00:00Z`) : new Date(iso);
  return new Intl.DateTimeFormat(locale, {
    dateStyle: 'medium',
    timeZone: /T/.test(iso) ? undefined : 'UTC',
  }).format(d);
}
