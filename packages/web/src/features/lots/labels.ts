import type {
  BaseGlass,
  BeadCount,
  Decoration,
  LotForm,
  LotStatus,
  Money,
  Observations,
  Origin,
} from '@beadroll/core';

export const FORM_LABEL: Record<LotForm, string> = {
  loose: 'Loose beads',
  strand: 'Strand',
  necklace: 'Necklace',
  piece: 'Finished piece',
  mixed: 'Mixed lot',
};

export const STATUS_LABEL: Record<LotStatus, string> = {
  held: 'Held',
  offered: 'Offered to a dealer',
  sold: 'Sold',
  split: 'Split up',
  combined: 'Combined into another lot',
  retired: 'Out of trade',
};

export const ORIGIN_LABEL: Record<Origin, string> = {
  'venice-murano': 'Venice / Murano',
  'bohemia-czech': 'Bohemia / Czech lands',
  india: 'India',
  china: 'China',
  japan: 'Japan',
  'other-european': 'Elsewhere in Europe',
  unknown: 'Unknown',
  other: 'Other',
};

export const BASE_GLASS_LABEL: Record<BaseGlass, string> = {
  opaque: 'Opaque',
  transparent: 'Transparent',
  satin: 'Satin',
  other: 'Other',
};

export const DECORATION_LABEL: Record<Decoration, string> = {
  roses: 'Roses',
  'forget-me-nots': 'Forget-me-nots',
  'other-flowers': 'Other flowers',
  trailing: 'Trailing',
  'gold-foil': 'Gold foil',
  'silver-foil': 'Silver foil',
  aventurine: 'Aventurine',
  other: 'Other',
};

/** 1 in = 25.4 mm exactly (the international inch). */
export const MM_PER_INCH = 25.4;

/** Inches for a length in mm, to one decimal. */
export function inchesOf(mm: number): string {
  return (mm / MM_PER_INCH).toFixed(1).replace(/\.0$/, '');
}

/** A length in mm with inches beside it: "406.4 mm (16 in)". */
export function formatLength(mm: number): string {
  return `${mm} mm (${inchesOf(mm)} in)`;
}

export function formatCount(c: BeadCount): string {
  return c.estimated ? `about ${c.value}` : String(c.value);
}

export function formatMoney(m: Money): string {
  // Minor units per currency come from Intl (ISO 4217 exponents).
  const digits =
    new Intl.NumberFormat(undefined, { style: 'currency', currency: m.currency }).resolvedOptions()
      .maximumFractionDigits ?? 2;
  return new Intl.NumberFormat(undefined, { style: 'currency', currency: m.currency }).format(
    m.amount / 10 ** digits,
  );
}

/** A time in the viewer's locale and time zone. */
export function formatTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

/** The first 12 hex digits of a hash, enough to compare by eye. */
export function shortHash(hash: string): string {
  return hash.slice(0, 12);
}

type ObservationKey = Exclude<keyof Observations, 'note'>;

export interface ObservationChoice {
  value: string;
  label: string;
  /** One line a dealer can act on. */
  hint: string;
}

export interface ObservationQuestion {
  key: ObservationKey;
  label: string;
  choices: ObservationChoice[];
}

/** How the checklist's hints are marked on screen: they are the trade's habit, not a cited fact. */
export const HINT_MARK = 'common practice, no source';

/**
 * The clues of the checklist, in the order a dealer looks at a bead. The hints are common
 * practice among bead dealers, no source; the screen says so beside them (HINT_MARK).
 */
export const OBSERVATION_QUESTIONS: ObservationQuestion[] = [
  {
    key: 'hole',
    label: 'Inside the hole',
    choices: [
      {
        value: 'clean',
        label: 'Clean',
        hint: 'Smooth glass right through, no powder; old and new beads can both look like this.',
      },
      { value: 'powder', label: 'White or grey powder', hint: 'Traces of release agent left in the hole.' },
      {
        value: 'green-traces',
        label: 'Green traces',
        hint: 'Greenish staining, as from an old metal core or wire.',
      },
      { value: 'not-seen', label: 'Could not see', hint: 'Hole too small, strung tight or blocked.' },
    ],
  },
  {
    key: 'holeShape',
    label: 'Shape of the hole',
    choices: [
      {
        value: 'irregular',
        label: 'Irregular',
        hint: 'Holes differ in size or sit off-centre, bead to bead.',
      },
      { value: 'regular', label: 'Regular', hint: 'Every hole the same size, neatly centred.' },
    ],
  },
  {
    key: 'windingMarks',
    label: 'Winding marks',
    choices: [
      {
        value: 'seen',
        label: 'Seen',
        hint: 'Swirls or lines running round the hole, from winding hot glass.',
      },
      { value: 'not-seen', label: 'Not seen', hint: 'No lines round the hole, even under a loupe.' },
    ],
  },
  {
    key: 'beadShape',
    label: 'Shape of the beads',
    choices: [
      { value: 'irregular', label: 'Irregular', hint: 'Each bead a little different, as made one by one.' },
      {
        value: 'uniform',
        label: 'Uniform',
        hint: 'Beads alike in size and shape, as from a mould, cut cane or a practised hand.',
      },
    ],
  },
  {
    key: 'mouldSeam',
    label: 'Mould seam',
    choices: [
      {
        value: 'seen',
        label: 'Seen',
        hint: 'A fine raised line round the bead where two halves of a mould met.',
      },
      { value: 'not-seen', label: 'Not seen', hint: 'No seam line, even under a loupe.' },
    ],
  },
  {
    key: 'surface',
    label: 'Surface',
    choices: [
      { value: 'glossy', label: 'Glossy', hint: 'Bright, unworn shine.' },
      { value: 'satin', label: 'Satin', hint: 'Soft sheen from the glass itself.' },
      { value: 'matte', label: 'Matte', hint: 'No shine: etched, frosted or dulled.' },
      { value: 'worn', label: 'Worn', hint: 'Scuffs and dull patches where beads rubbed together.' },
    ],
  },
  {
    key: 'foil',
    label: 'Metal foil',
    choices: [
      { value: 'none', label: 'None', hint: 'No gold or silver foil in the glass.' },
      { value: 'intact', label: 'Intact', hint: 'Foil bright and complete.' },
      { value: 'worn', label: 'Worn', hint: 'Foil rubbed away in places, often surviving under trailing.' },
    ],
  },
  {
    key: 'uvA',
    label: 'Under a UV-A torch',
    choices: [
      { value: 'not-tested', label: 'Not tested', hint: 'No UV test made.' },
      { value: 'none', label: 'No glow', hint: 'The glass stays dark under the torch.' },
      {
        value: 'green-glow',
        label: 'Green glow',
        hint: 'A bright green glow. Uranium glass glows so, but manganese glass can glow greenish too.',
      },
      { value: 'other', label: 'Another glow', hint: 'A glow of another colour; say which in the note.' },
    ],
  },
];

/** "Hole: clean; winding marks: seen" — the recorded clues in words. */
export function describeObservations(o: Observations): string {
  const parts: string[] = [];
  for (const q of OBSERVATION_QUESTIONS) {
    const v = o[q.key];
    if (v === undefined) continue;
    const c = q.choices.find((x) => x.value === v);
    parts.push(`${q.label.toLowerCase()}: ${(c?.label ?? v).toLowerCase()}`);
  }
  if (o.note) parts.push(`note: “${o.note}”`);
  return parts.join('; ');
}
