/** Format version written in every new entry header. */
export const FORMAT_VERSION = 3;

/** Every entry format version a verifier reads; each keeps its own rules. */
export const FORMAT_VERSIONS = [1, 2, 3] as const;

/** An entry format version. */
export type FormatVersion = (typeof FORMAT_VERSIONS)[number];

/** Every kind of entry, in the order the format lists them. */
export const ENTRY_KINDS = [
  'registered',
  'described',
  'observed',
  'exhibit-added',
  'opinion',
  'opinion-withdrawn',
  'transfer-offered',
  'transfer-accepted',
  'transfer-declined',
  'transfer-withdrawn',
  'transfer-lapsed',
  'split',
  'combined',
  'sold',
  'sale-voided',
  'retired',
  'redacted',
  'note',
  'opinion-requested',
  'opinion-request-closed',
] as const;

/** The kind of an entry. */
export type EntryKind = (typeof ENTRY_KINDS)[number];

/** The kinds of a transfer between dealers: the offer and each way it can end. */
export const TRANSFER_KINDS = [
  'transfer-offered',
  'transfer-accepted',
  'transfer-declined',
  'transfer-withdrawn',
  'transfer-lapsed',
] as const satisfies readonly EntryKind[];

/** Account id that writes `transfer-lapsed` entries; no person or business ever holds it. */
export const SYSTEM_ACTOR = 'beadroll:system';

/** Prefix of reserved account ids: never issued to a person or business. */
export const RESERVED_ACTOR_PREFIX = 'beadroll:';

/** `prev` of every seq-0 entry: 64 zero hex digits. */
export const GENESIS_PREV = '0'.repeat(64);

/** A link from a child's `registered` entry to a parent's `split` or `combined` entry. */
export interface ParentRef {
  lot: string;
  seq: number;
  hash: string;
}

/** Decoded entry header (its canonical JSON string is what the entry hash covers). */
export interface EntryHeader {
  v: FormatVersion;
  lot: string;
  seq: number;
  kind: EntryKind;
  time: string;
  actor: string;
  prev: string;
  parents?: ParentRef[];
  body: string;
  sealed?: string;
  /** Version 2 and later: the rule facts of the entry (see {@link RuleFacts}); absent in version 1. */
  facts?: RuleFacts;
}

/**
 * The facts the roll rules depend on, copied from the body under the same names and written in
 * the header from version 2 on, so that removing a body never changes what the rules can check.
 */
export interface RuleFacts {
  /** registered, described: the description's count. split/combined children carry their own. */
  count?: BeadCount;
  /** registered, described: the description's listing. */
  listed?: boolean;
  /** exhibit-added: SHA-256 of a public exhibit's original. */
  original?: string;
  /** exhibit-added: the exhibit is a sealed field. */
  sealedOnly?: true;
  /** opinion: the cited exhibits. */
  exhibits?: string[];
  /** opinion-withdrawn. */
  opinionSeq?: number;
  /** transfer-offered. */
  recipient?: string;
  /** transfer-accepted, -declined, -withdrawn, -lapsed. */
  offerSeq?: number;
  /** split. */
  children?: SplitChild[];
  /** combined. */
  child?: string;
  /** redacted. */
  target?: number;
  /** note. */
  ref?: number;
  /** described, observed: seq of the earlier entry the correction names. */
  corrects?: number;
  /** sale-voided: seq of the sale it voids. */
  saleSeq?: number;
  /**
   * opinion-requested (version 3): the assessor asked, or null for any assessor.
   */
  assessor?: string | null;
  /**
   * opinion, exhibit-added (version 3): the open request the entry answers;
   * opinion-request-closed: the request it closes.
   */
  request?: number;
}

/** A count of beads: exact, or an estimate marked as such. */
export interface BeadCount {
  value: number;
  estimated: boolean;
}

/** Physical form of a lot. */
export const LOT_FORMS = ['loose', 'strand', 'necklace', 'piece', 'mixed'] as const;
export type LotForm = (typeof LOT_FORMS)[number];
/** Base glass kinds. */
export const BASE_GLASS = ['opaque', 'transparent', 'satin', 'other'] as const;
export type BaseGlass = (typeof BASE_GLASS)[number];
/** Decoration kinds. */
export const DECORATIONS = [
  'roses',
  'forget-me-nots',
  'other-flowers',
  'trailing',
  'gold-foil',
  'silver-foil',
  'aventurine',
  'other',
] as const;
export type Decoration = (typeof DECORATIONS)[number];

/** The public description of a lot; each `registered` or `described` body holds a full one. */
export interface LotDescription {
  title: string;
  /** Free text, searchable with the title. */
  summary?: string;
  form: LotForm;
  count: BeadCount;
  /** Bead diameter range in millimetres (at most 0.1 mm resolution). */
  diameterMm?: { min: number; max: number };
  /** Strand length in millimetres (at most 0.1 mm resolution); shown in inches too. */
  strandLengthMm?: number;
  colours: string[];
  baseGlass: BaseGlass[];
  decoration: Decoration[];
  decorationNote?: string;
  condition?: string;
  /** true: the lot has a public page. */
  listed: boolean;
}

/** The physical clues recorded by an `observed` entry; absent = not recorded. */
export interface Observations {
  hole?: 'clean' | 'powder' | 'green-traces' | 'not-seen';
  holeShape?: 'irregular' | 'regular';
  windingMarks?: 'seen' | 'not-seen';
  beadShape?: 'irregular' | 'uniform';
  /** A seam line where the two halves of a mould met. */
  mouldSeam?: 'seen' | 'not-seen';
  surface?: 'glossy' | 'satin' | 'matte' | 'worn';
  foil?: 'none' | 'intact' | 'worn';
  uvA?: 'not-tested' | 'none' | 'green-glow' | 'other';
  note?: string;
}

/** One stored file of an exhibit (the original or a derivative shown on a page). */
export interface ExhibitFile {
  sha256: string;
  size: number;
  mediaType: string;
  width?: number;
  height?: number;
}

/** A derivative of an exhibit (thumbnail, web size, ...). */
export interface ExhibitDerivative extends ExhibitFile {
  role: string;
}

/** What an exhibit is. */
export const EXHIBIT_KINDS = [
  'whole-lot',
  'close-up',
  'hole',
  'uv-a',
  'reference-page',
  'receipt',
  'other',
] as const;
export type ExhibitKind = (typeof EXHIBIT_KINDS)[number];

/** A public exhibit; it is named by `original.sha256`. */
export interface ExhibitRef {
  kind: ExhibitKind;
  original: ExhibitFile;
  derivatives: ExhibitDerivative[];
  caption?: string;
}

/** Attribution regions. */
export const ORIGINS = [
  'venice-murano',
  'bohemia-czech',
  'india',
  'china',
  'japan',
  'other-european',
  'unknown',
  'other',
] as const;
export type Origin = (typeof ORIGINS)[number];
/** Techniques. */
export const TECHNIQUES = ['wound-lampwork', 'drawn', 'pressed-moulded', 'furnace-wound', 'other'] as const;
export type Technique = (typeof TECHNIQUES)[number];
/** Cataloguing certainty qualifiers, strongest first. */
export const QUALIFIERS = ['by', 'attributed-to', 'in-the-style-of', 'later-copy'] as const;
export type Qualifier = (typeof QUALIFIERS)[number];
/** Confidence levels. */
export const CONFIDENCES = ['low', 'medium', 'high'] as const;
export type Confidence = (typeof CONFIDENCES)[number];

/** A closed year range; `approximate` marks "about 1850–1900". */
export interface Period {
  from: number;
  to: number;
  approximate: boolean;
}

/** Reason categories of a redaction. */
export const REDACTION_REASONS = ['personal-data', 'unlawful-content', 'abuse', 'holder-request'] as const;
export type RedactionReason = (typeof REDACTION_REASONS)[number];

/** Every body carries a fresh 128-bit nonce (32 lower-case hex digits). */
export interface BodyBase {
  nonce: string;
}

export interface RegisteredBody extends BodyBase {
  description: LotDescription;
}
/** Names the earlier entry a `described` or `observed` entry corrects, and why. */
export interface Correction {
  /** seq of an earlier entry of the same kind (`registered` counts as a description). */
  seq: number;
  reason: string;
}
export interface DescribedBody extends BodyBase {
  description: LotDescription;
  corrects?: Correction;
}
export interface ObservedBody extends BodyBase {
  observations: Observations;
  corrects?: Correction;
}
/** `request` (format version 3): seq of the open opinion request this evidence answers. */
export type ExhibitAddedBody =
  | (BodyBase & { exhibit: ExhibitRef; request?: number })
  | (BodyBase & { sealedOnly: true; request?: number });
export interface OpinionBody extends BodyBase {
  origin: Origin;
  originNote?: string;
  period: Period;
  technique: Technique;
  decoration?: string;
  qualifier: Qualifier;
  confidence: Confidence;
  rationale: string;
  /** sha256 of each cited exhibit's original. */
  exhibits: string[];
  /** The earlier opinion (on this lot or an ancestor) whose attribution this one adopts. */
  adopts?: ParentRef;
  /** Format version 3: seq of the open opinion request this opinion answers (and closes). */
  request?: number;
}
export interface OpinionWithdrawnBody extends BodyBase {
  opinionSeq: number;
  note?: string;
}
export interface TransferOfferedBody extends BodyBase {
  recipient: string;
  note?: string;
}
export interface TransferAnswerBody extends BodyBase {
  offerSeq: number;
  note?: string;
}
export type TransferAcceptedBody = TransferAnswerBody;
export type TransferDeclinedBody = TransferAnswerBody;
export type TransferWithdrawnBody = TransferAnswerBody;
export interface TransferLapsedBody extends BodyBase {
  offerSeq: number;
}
export interface SplitChild {
  lot: string;
  count: BeadCount;
}
export interface SplitBody extends BodyBase {
  children: SplitChild[];
}
export interface CombinedBody extends BodyBase {
  child: string;
  count: BeadCount;
}
export interface SoldBody extends BodyBase {
  /** Calendar date of the sale, YYYY-MM-DD. */
  date: string;
}
/** Undoes a mistaken sale: written by the seller within 24 hours of the `sold` entry. */
export interface SaleVoidedBody extends BodyBase {
  /** seq of the `sold` entry it voids. */
  saleSeq: number;
  reason?: string;
}
export interface RetiredBody extends BodyBase {
  note?: string;
}
export interface RedactedBody extends BodyBase {
  target: number;
  reason: RedactionReason;
}
export interface NoteBody extends BodyBase {
  text: string;
  /** seq of the entry this note answers, if any. */
  ref?: number;
}

/** Format version 3: the holder asks an assessor (or, with null, any assessor) for an opinion. */
export interface OpinionRequestedBody extends BodyBase {
  /** Account id of the assessor asked, or null: open to any assessor. */
  assessor: string | null;
}
/** Format version 3: the holder closes an open opinion request. */
export interface OpinionRequestClosedBody extends BodyBase {
  /** seq of the `opinion-requested` entry it closes. */
  request: number;
}

/** Body type of each kind. */
export interface BodyByKind {
  registered: RegisteredBody;
  described: DescribedBody;
  observed: ObservedBody;
  'exhibit-added': ExhibitAddedBody;
  opinion: OpinionBody;
  'opinion-withdrawn': OpinionWithdrawnBody;
  'transfer-offered': TransferOfferedBody;
  'transfer-accepted': TransferAcceptedBody;
  'transfer-declined': TransferDeclinedBody;
  'transfer-withdrawn': TransferWithdrawnBody;
  'transfer-lapsed': TransferLapsedBody;
  split: SplitBody;
  combined: CombinedBody;
  sold: SoldBody;
  'sale-voided': SaleVoidedBody;
  retired: RetiredBody;
  redacted: RedactedBody;
  note: NoteBody;
  'opinion-requested': OpinionRequestedBody;
  'opinion-request-closed': OpinionRequestClosedBody;
}

/** A body without its nonce: what callers hand to `buildEntry`. */
export type BodyFields<K extends EntryKind> = BodyByKind[K] extends infer B
  ? B extends BodyBase
    ? Omit<B, 'nonce'>
    : never
  : never;

/** Any body. */
export type AnyBody = BodyByKind[EntryKind];

/** Money in integer minor units of an ISO 4217 currency. */
export interface Money {
  amount: number;
  currency: string;
}

/** The value type of each sealed field. Private facts live only here, never in bodies. */
export interface SealedValueByName {
  'storage-location': string;
  'acquisition-date': string;
  'acquisition-source': string;
  'acquisition-cost': Money;
  'transfer-price': Money;
  'sale-price': Money;
  'buyer-note': string;
  'private-note': string;
  'sealed-exhibit': ExhibitRef;
}

/** Names of sealed fields. */
export type SealedFieldName = keyof SealedValueByName;

/** Every sealed field name. */
export const SEALED_FIELD_NAMES: readonly SealedFieldName[] = [
  'storage-location',
  'acquisition-date',
  'acquisition-source',
  'acquisition-cost',
  'transfer-price',
  'sale-price',
  'buyer-note',
  'private-note',
  'sealed-exhibit',
];

/** Sealed values to commit in one entry, by field name. */
export type SealedValues = { [N in SealedFieldName]?: SealedValueByName[N] };
