// The invented scenario behind docs/examples/bundle.json. Deterministic: a seeded random
// source draws every lot code, nonce and salt. Takes the core module as an argument so the
// tests can run it against the sources and this script against the build.

const T = (day, hh = '10') => `2025-03-${String(day).padStart(2, '0')}T${hh}:00:00.000Z`;

const DEALER_A = 'acct-3f9c1a'; // invented dealer in an invented town
const DEALER_B = 'acct-7b20e4';
const ASSESSOR = 'acct-a51d09';
const REGISTRAR = 'acct-r00001';

/** Builds the example bundle with the given core module. */
export function buildExampleBundle(core) {
  const random = core.seededRandom('beadroll example bundle v1');
  const code = () => core.generateLotCode(random);
  const rolls = [];

  function roll(lot) {
    const entries = [];
    let head = null;
    return {
      lot,
      entries,
      add(draft) {
        const b = core.buildEntry(head, { ...draft, lot }, { random });
        head = core.headOf(b);
        entries.push({ ...b.stored, logIndex: null });
        return b;
      },
    };
  }

  const desc = (over) => ({
    title: 'Strand of wound glass beads',
    form: 'strand',
    count: { value: 40, estimated: false },
    colours: ['cobalt blue', 'white'],
    baseGlass: ['opaque'],
    decoration: ['trailing'],
    listed: true,
    ...over,
  });

  // 1. A lot that changes hands.
  const a = roll(code());
  a.add({
    kind: 'registered',
    time: T(1),
    actor: DEALER_A,
    body: {
      description: desc({
        title: 'Blue and white wound beads, old strand',
        diameterMm: { min: 7, max: 9.5 },
        strandLengthMm: 406.4,
      }),
    },
    sealed: {
      'acquisition-date': '2025-02-20',
      'acquisition-source': 'house clearance, Conterie Moor',
      'acquisition-cost': { amount: 4500, currency: 'EUR' },
    },
  });
  a.add({
    kind: 'observed',
    time: T(1, '11'),
    actor: DEALER_A,
    body: {
      observations: {
        hole: 'clean',
        holeShape: 'irregular',
        windingMarks: 'seen',
        beadShape: 'irregular',
        surface: 'worn',
        foil: 'none',
        uvA: 'not-tested',
      },
    },
  });
  const exA = {
    kind: 'whole-lot',
    original: {
      sha256: core.sha256HexOfText('invented photo bytes: strand on linen'),
      size: 2481332,
      mediaType: 'image/jpeg',
      width: 4000,
      height: 3000,
    },
    derivatives: [
      {
        role: 'web',
        sha256: core.sha256HexOfText('invented photo bytes: strand on linen, web'),
        size: 184220,
        mediaType: 'image/webp',
        width: 1600,
        height: 1200,
      },
      {
        role: 'thumbnail',
        sha256: core.sha256HexOfText('invented photo bytes: strand on linen, thumb'),
        size: 12004,
        mediaType: 'image/webp',
        width: 320,
        height: 240,
      },
    ],
    caption: 'The whole strand in daylight',
  };
  a.add({ kind: 'exhibit-added', time: T(1, '12'), actor: DEALER_A, body: { exhibit: exA } });
  a.add({
    kind: 'opinion',
    time: T(2),
    actor: DEALER_A,
    body: {
      origin: 'venice-murano',
      period: { from: 1850, to: 1900, approximate: true },
      technique: 'wound-lampwork',
      qualifier: 'attributed-to',
      confidence: 'medium',
      rationale: 'Irregular wound shapes with visible winding marks and clean holes.',
      exhibits: [exA.original.sha256],
    },
  });
  const offer = a.add({
    kind: 'transfer-offered',
    time: T(3),
    actor: DEALER_A,
    body: { recipient: DEALER_B, note: 'As discussed at the Conterie Moor fair.' },
    sealed: { 'transfer-price': { amount: 9000, currency: 'EUR' } },
  });
  a.add({ kind: 'transfer-accepted', time: T(4), actor: DEALER_B, body: { offerSeq: offer.header.seq } });
  rolls.push(a);

  // 2. A dissent, and a redacted body.
  const b = roll(code());
  b.add({
    kind: 'registered',
    time: T(5),
    actor: DEALER_B,
    body: {
      description: desc({
        title: 'Millefiori beads, loose',
        form: 'loose',
        count: { value: 25, estimated: true },
        colours: ['red', 'green', 'yellow'],
        baseGlass: ['opaque'],
        decoration: ['other-flowers'],
      }),
    },
  });
  b.add({
    kind: 'opinion',
    time: T(5, '11'),
    actor: DEALER_B,
    body: {
      origin: 'venice-murano',
      period: { from: 1880, to: 1920, approximate: true },
      technique: 'drawn',
      qualifier: 'attributed-to',
      confidence: 'medium',
      rationale: 'Cane slices typical of trade beads.',
      exhibits: [],
    },
  });
  const exB = {
    kind: 'uv-a',
    original: {
      sha256: core.sha256HexOfText('invented photo bytes: beads under UV-A'),
      size: 1934000,
      mediaType: 'image/jpeg',
      width: 3000,
      height: 2000,
    },
    derivatives: [],
    caption: 'Under a UV-A torch',
  };
  // The holder asks an assessor; the assessor's evidence and opinion name the request.
  const asked = b.add({
    kind: 'opinion-requested',
    time: T(5, '12'),
    actor: DEALER_B,
    body: { assessor: ASSESSOR },
  });
  const request = asked.header.seq;
  b.add({ kind: 'exhibit-added', time: T(6), actor: ASSESSOR, body: { exhibit: exB, request } });
  const dissent = b.add({
    kind: 'opinion',
    time: T(6, '11'),
    actor: ASSESSOR,
    body: {
      origin: 'bohemia-czech',
      period: { from: 1950, to: 1980, approximate: false },
      technique: 'pressed-moulded',
      qualifier: 'later-copy',
      confidence: 'high',
      rationale: 'Mould seams and an even surface point to later pressed work.',
      exhibits: [exB.original.sha256],
      request,
    },
  });
  const note = b.add({
    kind: 'note',
    time: T(7),
    actor: DEALER_B,
    body: { text: 'Call me on my private number to discuss.', ref: dissent.header.seq },
  });
  b.add({
    kind: 'redacted',
    time: T(8),
    actor: REGISTRAR,
    body: { target: note.header.seq, reason: 'personal-data' },
  });
  b.entries[note.header.seq].body = null;
  rolls.push(b);

  // 3. A split strand and its children.
  const p = roll(code());
  p.add({
    kind: 'registered',
    time: T(9),
    actor: DEALER_A,
    body: {
      description: desc({
        title: 'Long rope of black beads',
        form: 'strand',
        count: { value: 60, estimated: false },
        colours: ['black'],
        decoration: [],
      }),
    },
  });
  const kids = [code(), code(), code()];
  const split = p.add({
    kind: 'split',
    time: T(10),
    actor: DEALER_A,
    body: { children: kids.map((k) => ({ lot: k, count: { value: 20, estimated: false } })) },
  });
  rolls.push(p);
  kids.forEach((k, i) => {
    const c = roll(k);
    c.add({
      kind: 'registered',
      time: T(10, '11'),
      actor: DEALER_A,
      parents: [{ lot: p.lot, seq: split.header.seq, hash: split.stored.hash }],
      body: {
        description: desc({
          title: `Black bead strand ${i + 1} of 3`,
          count: { value: 20, estimated: false },
          colours: ['black'],
          decoration: [],
          listed: i === 0,
        }),
      },
    });
    rolls.push(c);
  });

  return core.createBundle(rolls.map((r) => ({ lot: r.lot, entries: r.entries })));
}
