import {
  FORMAT_VERSION,
  buildEntry,
  checkTransition,
  headOf,
  reduceEntry,
  seededRandom,
  type BodyFields,
  type BuiltEntry,
  type EntryKind,
  type FormatVersion,
  type LotDescription,
  type RandomSource,
  type RollState,
  type SealedValues,
  type StoredEntry,
} from '../src/index.js';

export const HOLDER = 'acct-h01';
export const OTHER = 'acct-o02';
export const THIRD = 'acct-t03';
export const LOT = '7K2QM9XAT';

export function description(over: Partial<LotDescription> = {}): LotDescription {
  return {
    title: 'Test strand',
    form: 'strand',
    count: { value: 60, estimated: false },
    colours: ['blue'],
    baseGlass: ['opaque'],
    decoration: [],
    listed: true,
    ...over,
  };
}

/** Builds rolls entry by entry, checking each step with the rules like the server does. */
export class RollBuilder {
  stored: StoredEntry[] = [];
  built: BuiltEntry[] = [];
  state: RollState | null = null;
  private minute = 0;
  constructor(
    readonly lot = LOT,
    readonly random: RandomSource = seededRandom('roll ' + lot),
    readonly version?: FormatVersion,
  ) {}

  time(): string {
    const t = new Date(Date.UTC(2025, 0, 1) + this.minute++ * 60_000);
    return t.toISOString();
  }

  /** Appends if the rules allow; returns the built entry or the refusal. */
  tryAdd<K extends EntryKind>(
    kind: K,
    actor: string,
    body: BodyFields<K>,
    extra: {
      sealed?: SealedValues;
      parents?: { lot: string; seq: number; hash: string }[];
      /** Build without asking the rules (and without folding it into the state). */
      unchecked?: boolean;
      /** The entry's time instead of the next minute. */
      time?: string;
      /** With `unchecked`: fold it into the state anyway, as a careless writer would. */
      force?: boolean;
    } = {},
  ): BuiltEntry | { refused: string } {
    const time = extra.time ?? this.time();
    if (!extra.unchecked) {
      const t = checkTransition(this.state, {
        kind,
        actor,
        body,
        parents: extra.parents,
        version: this.version,
        time,
      });
      if (!t.ok) return { refused: t.code };
    }
    const head = this.built.length ? headOf(this.built.at(-1)!) : null;
    const b = buildEntry(
      head,
      { lot: this.lot, kind, actor, time, body, sealed: extra.sealed, parents: extra.parents },
      { random: this.random, version: this.version },
    );
    this.built.push(b);
    this.stored.push(b.stored);
    if (!extra.unchecked || extra.force)
      this.state = reduceEntry(this.state, { header: b.header, hash: b.stored.hash, body: b.body });
    return b;
  }

  add<K extends EntryKind>(
    kind: K,
    actor: string,
    body: BodyFields<K>,
    extra: Parameters<RollBuilder['tryAdd']>[3] = {},
  ): BuiltEntry {
    const r = this.tryAdd(kind, actor, body, extra);
    if ('refused' in r) throw new Error(`${kind} by ${actor} refused: ${r.refused}`);
    return r;
  }

  register(actor = HOLDER, over: Partial<LotDescription> = {}): this {
    this.add('registered', actor, { description: description(over) });
    return this;
  }

  /** Registers this lot as the child `split` (an entry of `parentLot`) made, {@link description} changed by `over`. */
  registerChild(actor: string, parentLot: string, split: BuiltEntry, over: Partial<LotDescription>): this {
    const parents = [{ lot: parentLot, seq: split.header.seq, hash: split.stored.hash }];
    this.add('registered', actor, { description: description(over) }, { parents });
    return this;
  }
}

export function opinion(
  origin: string,
  from: number,
  to: number,
  exhibits: string[] = [],
): BodyFields<'opinion'> {
  return {
    origin: origin as BodyFields<'opinion'>['origin'],
    period: { from, to, approximate: false },
    technique: 'wound-lampwork',
    qualifier: 'attributed-to',
    confidence: 'medium',
    rationale: 'test',
    exhibits,
  };
}

/** A generated, valid roll driven by a list of choices (for property tests). */
export function generatedRoll(choices: number[], seed = 'gen', version?: FormatVersion): RollBuilder {
  const r = new RollBuilder(LOT, seededRandom(seed), version).register();
  const actors = [HOLDER, OTHER, THIRD];
  for (const c of choices) {
    const s = r.state!;
    const actor = actors[c % 3]!;
    const holder = s.holder;
    // Version 3 adds opinion requests: asked, answered by the one asked, closed by the holder.
    const step = Math.floor(c / 3) % ((version ?? FORMAT_VERSION) >= 3 ? 13 : 10);
    const open = s.openRequests ?? [];
    const attempts: Array<() => BuiltEntry | { refused: string }> = [
      () => r.tryAdd('observed', holder, { observations: { hole: 'clean', note: `n${c}` } }),
      () =>
        r.tryAdd(
          'opinion',
          actor,
          opinion(c % 2 ? 'venice-murano' : 'bohemia-czech', 1800 + (c % 100), 1900 + (c % 100)),
        ),
      () => r.tryAdd('note', actor, { text: `note ${c}` }),
      () =>
        r.tryAdd('transfer-offered', holder, { recipient: actor === holder ? actors[(c + 1) % 3]! : actor }),
      () =>
        s.openOffer
          ? r.tryAdd('transfer-accepted', s.openOffer.recipient!, { offerSeq: s.openOffer.seq })
          : { refused: 'none' },
      () =>
        s.openOffer
          ? r.tryAdd('transfer-declined', s.openOffer.recipient!, { offerSeq: s.openOffer.seq })
          : { refused: 'none' },
      () =>
        s.openOffer
          ? r.tryAdd('transfer-withdrawn', s.openOffer.offerer, { offerSeq: s.openOffer.seq })
          : { refused: 'none' },
      () =>
        r.tryAdd('described', holder, { description: description({ title: `t${c}`, listed: c % 5 !== 0 }) }),
      () => r.tryAdd('exhibit-added', holder, { sealedOnly: true }, { sealed: { 'private-note': `p${c}` } }),
      () =>
        s.opinions[0]
          ? r.tryAdd('opinion-withdrawn', s.opinions[0].author, { opinionSeq: s.opinions[0].seq })
          : { refused: 'none' },
      () => r.tryAdd('opinion-requested', holder, { assessor: actor === holder ? null : actor }),
      () =>
        open[0]
          ? r.tryAdd('opinion', open[0].assessor ?? actors.find((a) => a !== holder)!, {
              ...opinion('india', 1700 + (c % 50), 1800),
              request: open[0].seq,
            })
          : { refused: 'none' },
      () =>
        open.at(-1)
          ? r.tryAdd('opinion-request-closed', holder, { request: open.at(-1)!.seq })
          : { refused: 'none' },
    ];
    attempts[step]!();
  }
  return r;
}

/** One known answer of fixtures/sha256.json: the message (text, bytes, or a repeated character) and its digest. */
export interface Sha256Case {
  desc: string;
  source: string;
  utf8?: string;
  hex?: string;
  repeat?: { char: string; count: number };
  expected: string;
}
