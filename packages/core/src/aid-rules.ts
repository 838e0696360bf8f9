import type { Decoration, Observations, Origin, Qualifier, Technique } from './types.js';

/**
 * How much weight a source carries on screen, heaviest first: museums, standards bodies,
 * government pages and recognised scholars first; trade and hobby pages after; unsourced trade
 * practice last. Sources are listed in this order.
 */
export const SOURCE_STANDINGS = [
  'museum',
  'standard',
  'scholar',
  'trade-page',
  'student-page',
  'common-practice',
  'from-memory',
] as const;

/** One of {@link SOURCE_STANDINGS}. */
export type SourceStanding = (typeof SOURCE_STANDINGS)[number];

/** Where a rule's fact comes from: a page title and address, or the plain words "common practice, no source". */
export interface AidSource {
  title: string;
  url?: string;
  standing: SourceStanding;
}

/** Conditions on the recorded clues and the lot's description; every listed condition must hold. */
export interface AidCondition {
  observations?: { [K in keyof Observations]?: NonNullable<Observations[K]>[] };
  decoration?: Decoration[];
  origin?: Origin[];
  technique?: Technique[];
  /** One of these words (whole word, any case) appears in what is written on the lot. */
  words?: string[];
  /** The aid's own indications point to one of these origins. */
  indicated?: Origin[];
  /** An opinion already on the lot's record names one of these origins. */
  recordedOrigin?: Origin[];
}

/** A clue that points towards an origin, a technique, or a later copy in an older style. */
export interface IndicationRule {
  id: string;
  when: AidCondition;
  /** The rule stays silent when this holds (another rule reads the same clues better). */
  unless?: AidCondition;
  points: { origins?: Origin[]; technique?: Technique; techniques?: Technique[]; qualifier?: Qualifier };
  weight: 1 | 2 | 3;
  reason: string;
  sources: AidSource[];
}

/** A material, decoration or method that did not exist before a year. */
export interface PeriodRule {
  id: string;
  when: AidCondition;
  notBefore: number;
  message: string;
  /** true when the clue behind the rule is a hint, not proof: the warning says "may". */
  clueIsHint?: boolean;
  sources: AidSource[];
}

/** A safety note shown where a test or a kind of handling comes up; any one listed condition brings it. */
export interface CautionRule {
  id: string;
  when: AidCondition[] | 'always-with-uv-test';
  text: string;
  sources: AidSource[];
}

const MARGARETOLOGIST: AidSource = {
  title:
    'The Venetian Bead Story, Part 2: The Beads (The Margaretologist, vol. 12 no. 1, 1999, Peter Francis Jr.)',
  url: 'https://docslib.org/download/2320431/the-venetian-bead-margaretolo-story-part-2',
  standing: 'scholar',
};
const CMOG_FANCY_BEAD: AidSource = {
  title: 'bead (Fancy-type bead, object 70.3.269 D), Corning Museum of Glass',
  url: 'https://glasscollection.cmog.org/objects/23558/bead',
  standing: 'museum',
};
const MUSEO_DEL_VETRO: AidSource = {
  title: 'Venetian beads, Museo del Vetro, Murano',
  url: 'https://museovetro.visitmuve.it/en/il-museo/layout-and-collections/venetian-beads',
  standing: 'museum',
};
const FAKTOR_GLOSSARY: AidSource = {
  title: 'Glossary – W (wound glass)',
  url: 'http://faktorinc.com/glossary/glossary/pageW.html',
  standing: 'trade-page',
};
const ANTICA_MURRINA: AidSource = {
  title: 'Beads and working over the flame (Antica Murrina)',
  url: 'http://www.anticamurrina.com/produzione-artigianale/produzione_artigianale_uk.cfm',
  standing: 'trade-page',
};
const FOURTAILS_RELEASE: AidSource = {
  title: 'Tornado Beads Redux and Musings on Cleaning Beads',
  url: 'http://fourtailslampwork.blogspot.com/2008/07/tornado-beads-redux-and-musings-on.html',
  standing: 'trade-page',
};
const MERRY_BLUEBIRD_PRESSED: AidSource = {
  title: 'A Brief History of Pressed Glass Beads',
  url: 'https://themerrybluebird.com/2024/09/30/a-brief-history-of-pressed-glass-beads/',
  standing: 'trade-page',
};
/** A student's web project hosted by the university, not a publication of its chemists. */
const BRISTOL_STUDENT_PAGE: AidSource = {
  title: 'uranium glass (a student web project, University of Bristol School of Chemistry, 2001)',
  url: 'http://www.chm.bris.ac.uk/webprojects2001/luxford/uranium_glass.htm',
  standing: 'student-page',
};
const EPFL_URANIUM_GLASS: AidSource = {
  title: 'Uranium glass (EPFL Graph Search)',
  url: 'https://graphsearch.epfl.ch/en/concept/984355',
  standing: 'trade-page',
};
const MANGANESE_GLOW: AidSource = {
  title: 'What Types of Glass Glow Under a Black Light?',
  url: 'https://biologyinsights.com/what-types-of-glass-glow-under-a-black-light',
  standing: 'trade-page',
};
const BLACKLIGHT_RELIABLE: AidSource = {
  title: 'Blacklight Testing: Is It Reliable?',
  url: 'http://whiskeyjacks-tpost.blogspot.com/2010/11/blacklight-testing-is-it-reliable.html',
  standing: 'trade-page',
};
const COMMON_PRACTICE: AidSource = { title: 'common practice, no source', standing: 'common-practice' };

/** Words that, written anywhere on a lot, mean uranium glass is named on its record. */
export const URANIUM_WORDS: readonly string[] = ['uranium', 'vaseline glass', 'annagrün', 'annagelb'];
/** Words that, written anywhere on a lot, mean lead glass or crystal is named on its record. */
export const LEAD_WORDS: readonly string[] = ['lead', 'leaded', 'lead glass', 'crystal', 'flint glass'];

/** Clues and what they point to. A clue is never proof; the aid says so on every screen. */
export const INDICATION_RULES: readonly IndicationRule[] = [
  {
    id: 'hole-clean-copper-wire',
    when: { observations: { hole: ['clean'] } },
    unless: { observations: { holeShape: ['regular'], beadShape: ['uniform'] } },
    points: { origins: ['venice-murano'], technique: 'wound-lampwork' },
    weight: 1,
    reason:
      'A clean hole without powder is consistent with glass wound on copper wire that was then dissolved in acid, which these pages describe as Italian practice. It is a weak clue: a modern bead, or one whose release was reamed out, has a clean hole too, and it says nothing of age.',
    sources: [FAKTOR_GLOSSARY, ANTICA_MURRINA, FOURTAILS_RELEASE],
  },
  {
    id: 'uniform-clean-later-work',
    when: { observations: { hole: ['clean'], holeShape: ['regular'], beadShape: ['uniform'] } },
    points: { qualifier: 'later-copy' },
    weight: 2,
    reason:
      'Beads alike in size and shape, with regular, clean holes, fit recent work as well as old: modern beads are wound on coated steel mandrels and their holes reamed clean, and beads wound one at a time by hand tend to differ. Look for other signs of age before reading them as old.',
    sources: [FOURTAILS_RELEASE, COMMON_PRACTICE],
  },
  {
    id: 'hole-powder-release',
    when: { observations: { hole: ['powder'] } },
    points: { origins: ['india', 'china'], technique: 'wound-lampwork' },
    weight: 2,
    reason:
      'White or grey powder lining the hole points to a mandrel coated with bead release, typical of modern studio work and of Indian and Chinese production (or of a bead never cleaned).',
    sources: [
      {
        title: 'Torch bead process (D’source, Purdilnagar, Uttar Pradesh)',
        url: 'https://dsource.in/resource/glass-making-purdilnagar-uttar-pradesh/making-process/torch-bead-process',
        standing: 'trade-page',
      },
      FOURTAILS_RELEASE,
    ],
  },
  {
    id: 'hole-green-traces',
    when: { observations: { hole: ['green-traces'] } },
    points: { origins: ['venice-murano'], technique: 'wound-lampwork' },
    weight: 1,
    reason: 'Green traces in the hole can be copper left from a wire dissolved in acid.',
    sources: [{ title: 'from memory', standing: 'from-memory' }],
  },
  {
    id: 'aventurine-murano',
    when: { decoration: ['aventurine'] },
    points: { origins: ['venice-murano'] },
    weight: 1,
    reason:
      'Aventurine glass (copper crystals grown on slow cooling) was first made on Murano and is used on Venetian lamp beads.',
    sources: [MARGARETOLOGIST],
  },
  {
    id: 'flowers-fiorato',
    when: { decoration: ['roses', 'forget-me-nots'] },
    points: { origins: ['venice-murano'], technique: 'wound-lampwork' },
    weight: 1,
    reason:
      'Tiny glass roses or forget-me-nots over trailing are the decoration of Venetian fiorato lamp beads, commonly dated about 1880–1920 by dealers; later and modern beads copy it.',
    sources: [
      {
        title: 'Wedding Cake Venetian Beads, 1880-1920',
        url: 'https://jeweledhorizons.blogspot.com/2011/04/wedding-cake-venetian-beads-1880-1920.html',
        standing: 'trade-page',
      },
      {
        title: 'Wedding cake beads (Depetitesmerveilles)',
        url: 'http://depetitesmerveilles.com/tag/venetian-wedding-cake-beads/',
        standing: 'trade-page',
      },
    ],
  },
  {
    id: 'uniform-regular-drawn-or-pressed',
    when: { observations: { beadShape: ['uniform'], holeShape: ['regular'] } },
    points: { techniques: ['pressed-moulded', 'drawn'] },
    weight: 1,
    reason:
      'Uniform shapes with regular holes suggest beads made by a method rather than one by one: pressed in moulds, or cut from drawn cane, which look alike in this. A mould seam tells pressed beads apart.',
    sources: [COMMON_PRACTICE],
  },
  {
    id: 'mould-seam-pressed',
    when: { observations: { mouldSeam: ['seen'] } },
    points: { origins: ['bohemia-czech'], technique: 'pressed-moulded' },
    weight: 2,
    reason:
      'A seam where the two halves of a mould met shows a pressed bead. Pressing beads in moulds developed in 18th-century Bohemia; Bohemian shapes are widely copied.',
    sources: [
      MERRY_BLUEBIRD_PRESSED,
      {
        title: 'Know Your Beads (Miss Poppy’s Boutique)',
        url: 'https://misspoppysboutique.com/2016/05/10/know-your-beads/',
        standing: 'trade-page',
      },
      COMMON_PRACTICE,
    ],
  },
  {
    id: 'winding-marks-wound',
    when: { observations: { windingMarks: ['seen'] } },
    points: { technique: 'wound-lampwork' },
    weight: 1,
    reason: 'Winding marks around the hole show a bead wound on a wire or rod rather than drawn or pressed.',
    sources: [COMMON_PRACTICE],
  },
  {
    id: 'uv-green-uranium',
    when: { observations: { uvA: ['green-glow'] } },
    points: { origins: ['bohemia-czech'] },
    weight: 1,
    reason:
      'A bright green glow under UV-A suggests uranium glass, first made commercially in Bohemia; manganese glass can glow greenish too, so a glow is a hint, not proof.',
    sources: [EPFL_URANIUM_GLASS, BRISTOL_STUDENT_PAGE, MANGANESE_GLOW, BLACKLIGHT_RELIABLE],
  },
];

/** Plausibility checks on an opinion's period. */
export const PERIOD_RULES: readonly PeriodRule[] = [
  {
    id: 'aventurine-17th-century',
    when: { decoration: ['aventurine'] },
    notBefore: 1601,
    message:
      'Aventurine glass is a 17th-century Murano invention; a bead decorated with it is unlikely to be older.',
    sources: [
      MARGARETOLOGIST,
      {
        title: 'Techniques (Ars Cenedese)',
        url: 'https://arscenedese.com/en/techniques',
        standing: 'trade-page',
      },
    ],
  },
  {
    id: 'uranium-1830s',
    when: { observations: { uvA: ['green-glow'] } },
    notBefore: 1830,
    clueIsHint: true,
    message:
      'If the green glow is from uranium, the glass is not older than the 1830s, when uranium glass came into commerce (uranium itself was identified in 1789). Manganese glass can glow greenish too, so the glow alone does not settle it.',
    sources: [
      EPFL_URANIUM_GLASS,
      BRISTOL_STUDENT_PAGE,
      {
        title: 'Uranium glass (Wikisum)',
        url: 'https://wikisum.wiki/wiki/Uranium_glass',
        standing: 'trade-page',
      },
      MANGANESE_GLOW,
    ],
  },
  {
    id: 'venetian-lampwork-16th-century',
    when: { origin: ['venice-murano'], technique: ['wound-lampwork'] },
    notBefore: 1528,
    message:
      'Venetian lamp-wound beads are on record from the 16th century: the lampworkers’ guild (Supialume) was founded in 1528. A museum dates Venetian lamp beads from about 1615, wound on iron wire, and another from the 17th century.',
    sources: [MARGARETOLOGIST, CMOG_FANCY_BEAD, MUSEO_DEL_VETRO],
  },
  {
    id: 'bohemian-pressed-18th-century',
    when: { origin: ['bohemia-czech'], technique: ['pressed-moulded'] },
    notBefore: 1700,
    message: 'Pressing beads in moulds developed in 18th-century Bohemia.',
    sources: [MERRY_BLUEBIRD_PRESSED],
  },
];

/**
 * The UV-A caution, point by point: the one wording every screen shows. The 365 nm preference
 * carries its mark on screen: no source was found for it.
 */
export const UV_A_POINTS: readonly string[] = [
  'Use a long-wave UV-A torch made for checking glass; one near 365 nm is preferred, since 395 nm torches leak violet light that can hide a weak glow (from memory, no source checked).',
  'Never use a germicidal (UV-C) lamp: even a short look at one can burn the eyes and skin.',
  'Never point the torch into anyone’s eyes, your own included; keep skin exposure short.',
  'Wear eyewear rated for UV; ordinary safety glasses may only be rated for impact.',
  'Follow your local safety rules, licensed practice and the maker’s instructions; they come first.',
];

/** Safety notes. They defer to local codes and licensed practice. */
export const CAUTION_RULES: readonly CautionRule[] = [
  {
    id: 'uv-a-torch',
    when: 'always-with-uv-test',
    text: UV_A_POINTS.join(' '),
    sources: [
      {
        title: 'UV Radiation Safety (University of Arizona)',
        url: 'https://research.arizona.edu/compliance/RLSS/radiation-safety/uv-radiation-safety',
        standing: 'standard',
      },
      {
        title: 'Beware UVC Lamps as COVID-19 Disinfectant (Prevent Blindness, citing the U.S. FDA)',
        url: 'https://lowvision.preventblindness.org/beware-uvc-lamps-as-covid-19-disinfectant/',
        standing: 'standard',
      },
      {
        title: 'Ultraviolet Light Fact Sheet (UMass EHS)',
        url: 'https://ehs.umass.edu/ultraviolet-light-fact-sheet',
        standing: 'standard',
      },
      { title: 'the torch wavelength advice: from memory', standing: 'from-memory' },
    ],
  },
  {
    id: 'uranium-handling',
    when: [{ observations: { uvA: ['green-glow'] } }, { words: [...URANIUM_WORDS] }],
    text: 'Possible uranium glass: low risk to handle and wear in the usual way, as the doses assessed are low, but never grind, drill, sand or break it, never put it in the mouth, and keep it away from food — the risk is from dust or particles taken in. Follow local rules on radioactive materials and licensed practice.',
    sources: [
      {
        title: 'NUREG-1717, Systematic Radiological Assessment of Exemptions (US NRC)',
        url: 'https://www.nrc.gov/reading-rm/doc-collections/nuregs/staff/sr1717/index.html',
        standing: 'standard',
      },
      EPFL_URANIUM_GLASS,
    ],
  },
  {
    id: 'lead-glass',
    when: [
      { origin: ['china'] },
      { recordedOrigin: ['china'] },
      { indicated: ['china'] },
      { words: [...LEAD_WORDS] },
    ],
    text: 'Lead glass and crystal, and old glass (Chinese glass especially), can contain lead. Do not mouth beads or let children handle them, do not grind or drill them, and do not sell vintage bead jewellery as children’s jewellery. Follow local consumer-safety rules and licensed practice.',
    sources: [
      {
        title: 'Chinese Glass Beads: New Evidence (Peter Francis Jr.)',
        url: 'http://thebeadsite.com/be02-ch.htm',
        standing: 'scholar',
      },
      {
        title: 'Can Crystal Beads Cause Lead Poisoning? (The Spruce Crafts)',
        url: 'https://www.thesprucecrafts.com/can-crystal-beads-cause-lead-poisoning-339376',
        standing: 'trade-page',
      },
      {
        title: 'Guide to Lead Laws (MJSA)',
        url: 'http://www.mjsa.org/publicationsmedia/compliance_guides/guide_to_lead_laws',
        standing: 'standard',
      },
    ],
  },
  {
    id: 'acid-history',
    when: [{ observations: { hole: ['clean', 'green-traces'] } }],
    text: 'Dissolving the copper wire in acid is part of the history of how such holes were made, not something to try: nitric acid destroys skin and eyes and gives off toxic fumes. Never dissolve metal cores at home; leave it to licensed practice.',
    sources: [
      {
        title: 'Nitric Acid (ACS Chemical Laboratory Information Profile, J. Chem. Educ. 2002)',
        url: 'https://moam.info/nitric-acid-american-chemical-society_59eee4b71723dd01ede6b5af.html',
        standing: 'standard',
      },
    ],
  },
  {
    id: 'foil-cleaning',
    when: [{ observations: { foil: ['intact', 'worn'] } }],
    text: 'Clean foiled beads gently: a soft cloth barely damp with mild soap, dried at once; don’t soak them and don’t use ammonia, vinegar, silver dips or abrasives on surface foil. Store beaded pieces in the dark.',
    sources: [
      {
        title: 'Care of Objects Decorated with Glass Beads (CCI Notes 6/4)',
        url: 'https://www.canada.ca/en/conservation-institute/services/conservation-preservation-publications/canadian-conservation-institute-notes/care-objects-glass-beads.html',
        standing: 'standard',
      },
      { title: 'chemical specifics from memory', standing: 'from-memory' },
    ],
  },
];

/** Shown with every result of the aid. */
export const AID_DISCLAIMER =
  'This is an aid, not an authentication. Clues point towards an attribution; they never prove one. Ask a specialist, and follow your local consumer-protection rules before describing goods as antique or vintage.';
