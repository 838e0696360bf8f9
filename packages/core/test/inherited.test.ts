import { describe, expect, it } from 'vitest';
import {
  attributionOnRecord,
  createBundle,
  inheritedRecord,
  seededRandom,
  verifyBundle,
  verifyRoll,
  type Bundle,
  type StoredEntry,
} from '../src/index.js';
import { HOLDER, OTHER, RollBuilder, THIRD, description, opinion } from './helpers.js';

/** Moves a builder's clock past a parent's entries, as a child is registered after its parent's split. */
function later(b: RollBuilder): RollBuilder {
  for (let i = 0; i < 30; i++) b.time();
  return b;
}

const PARENT = '2Z4SDBH52';
const CHILD = '7K2QM9XAT';
const GRAND = 'S74X2E0K6';

/** A listed or unlisted parent with the holder's attribution, a dissent and an exhibit, split into one child. */
function family(parentListed: boolean) {
  const parent = new RollBuilder(PARENT, seededRandom('parent')).register(HOLDER);
  const photo = 'ab'.repeat(32);
  parent.add('observed', HOLDER, { observations: { hole: 'clean' } });
  const ex = parent.add('exhibit-added', OTHER, {
    exhibit: {
      kind: 'hole',
      original: { sha256: photo, size: 10, mediaType: 'image/jpeg' },
      derivatives: [],
    },
  });
  parent.add('exhibit-added', HOLDER, {
    exhibit: {
      kind: 'whole-lot',
      original: { sha256: 'cd'.repeat(32), size: 10, mediaType: 'image/jpeg' },
      derivatives: [],
    },
  });
  const attribution = parent.add('opinion', HOLDER, opinion('venice-murano', 1850, 1900));
  const dissent = parent.add('opinion', OTHER, opinion('bohemia-czech', 1920, 1940, [photo]));
  // Unlisting the parent afterwards must not leave the dissent behind.
  if (!parentListed) parent.add('described', HOLDER, { description: description({ listed: false }) });
  const split = parent.add('split', HOLDER, {
    children: [{ lot: CHILD, count: { value: 20, estimated: false } }],
  });
  const child = later(new RollBuilder(CHILD, seededRandom('child')));
  child.registerChild(HOLDER, PARENT, split, {
    title: 'Child strand',
    count: { value: 20, estimated: false },
  });
  return { parent, child, ex, attribution, dissent, split };
}

const only = (entries: StoredEntry[], seqs: number[], withhold: number[] = []) =>
  entries
    .filter((e) => seqs.includes(JSON.parse(e.header).seq))
    .map((e) => ({
      ...e,
      body: withhold.includes(JSON.parse(e.header).seq) ? null : e.body,
    }));

describe('the inherited record', () => {
  it('a split child of a listed parent inherits its opinions, observations and exhibits; the dissent counts against the parent holder’s attribution', () => {
    const f = family(true);
    const bundle = createBundle([
      { lot: CHILD, entries: f.child.stored },
      { lot: PARENT, entries: f.parent.stored },
    ]);
    expect(verifyBundle(bundle).ok).toBe(true);
    const rec = inheritedRecord(bundle, CHILD);
    expect(rec.map((r) => [r.lot, r.kind, r.depth, r.before])).toEqual([
      [PARENT, 'observed', 1, true],
      [PARENT, 'exhibit-added', 1, true],
      [PARENT, 'exhibit-added', 1, true],
      [PARENT, 'opinion', 1, true],
      [PARENT, 'opinion', 1, true],
    ]);
    const own = verifyRoll(f.child.stored, { lot: CHILD });
    if (!own.ok) throw new Error('child roll');
    const a = attributionOnRecord(own.verified, own.state, rec);
    expect(a.source).toBe('ancestor');
    expect(a.record?.hash).toBe(f.attribution.stored.hash);
    expect(a.dissent.map((d) => d.hash)).toEqual([f.dissent.stored.hash]);
    expect(a.agree).toEqual([]);
  });

  it('an unlisted parent sends only its opinions and the exhibits they cite, each checked one by one', () => {
    const f = family(false);
    const seqs = [0, f.attribution.header.seq, f.dissent.header.seq, f.ex.header.seq, f.split.header.seq];
    const bundle: Bundle = createBundle([
      { lot: CHILD, entries: f.child.stored },
      { lot: PARENT, scope: 'inherited', entries: only(f.parent.stored, seqs, [0]) },
    ]);
    expect(verifyBundle(bundle).failures).toEqual([]);
    const rec = inheritedRecord(bundle, CHILD);
    expect(rec.map((r) => [r.kind, r.byHolder])).toEqual([
      ['exhibit-added', false],
      ['opinion', true],
      ['opinion', false],
    ]);
    // An exhibit no opinion cites does not travel.
    const extra = createBundle([
      { lot: CHILD, entries: f.child.stored },
      { lot: PARENT, scope: 'inherited', entries: only(f.parent.stored, [...seqs, 3], [0]) },
    ]);
    expect(verifyBundle(extra).failures[0]).toMatchObject({ lot: PARENT, seq: 3, reason: 'bad-header' });
    // A changed opinion breaks its hash.
    const tampered: Bundle = JSON.parse(JSON.stringify(bundle));
    const op = tampered.rolls[1]!.entries.find((e) => e.header.includes('"kind":"opinion"'))!;
    op.header = op.header.replace('"seq":', '"seq":1');
    expect(verifyBundle(tampered).ok).toBe(false);
  });

  it('walks through an unlisted parent to a listed grandparent', () => {
    const grand = new RollBuilder(GRAND, seededRandom('grand')).register(THIRD);
    grand.add('opinion', THIRD, opinion('india', 1950, 1980));
    const gsplit = grand.add('split', THIRD, {
      children: [{ lot: PARENT, count: { value: 60, estimated: false } }],
    });
    const parent = later(new RollBuilder(PARENT, seededRandom('p2')));
    parent.registerChild(THIRD, GRAND, gsplit, {
      title: 'Unlisted middle',
      form: 'loose',
      count: { value: 60, estimated: false },
      listed: false,
    });
    const psplit = parent.add('split', THIRD, {
      children: [{ lot: CHILD, count: { value: 10, estimated: false } }],
    });
    const child = later(later(new RollBuilder(CHILD, seededRandom('c2'))));
    child.registerChild(HOLDER, PARENT, psplit, {
      title: 'Grandchild',
      form: 'loose',
      count: { value: 10, estimated: false },
      listed: true,
    });
    const bundle = createBundle([
      { lot: CHILD, entries: child.stored },
      { lot: PARENT, scope: 'inherited', entries: only(parent.stored, [0, 1], [0]) },
      { lot: GRAND, entries: grand.stored },
    ]);
    expect(verifyBundle(bundle).failures).toEqual([]);
    const rec = inheritedRecord(bundle, CHILD);
    expect(rec.map((r) => [r.lot, r.kind, r.depth])).toEqual([[GRAND, 'opinion', 2]]);
    const own = verifyRoll(child.stored, { lot: CHILD });
    if (!own.ok) throw new Error('child roll');
    expect(attributionOnRecord(own.verified, own.state, rec).record?.body.origin).toBe('india');
  });

  it('after a transfer the earlier holder’s attribution is on record until the new holder adopts it', () => {
    const r = new RollBuilder(CHILD, seededRandom('transfer')).register(HOLDER);
    const first = r.add('opinion', HOLDER, opinion('venice-murano', 1850, 1900));
    r.add('opinion', THIRD, opinion('venice-murano', 1880, 1920));
    const offer = r.add('transfer-offered', HOLDER, { recipient: OTHER });
    r.add('transfer-accepted', OTHER, { offerSeq: offer.header.seq });
    let v = verifyRoll(r.stored, { lot: CHILD });
    if (!v.ok) throw new Error('roll');
    let a = attributionOnRecord(v.verified, v.state, []);
    expect([a.source, a.record?.seq, a.agree.length, a.dissent.length]).toEqual([
      'earlier-holder',
      first.header.seq,
      1,
      0,
    ]);
    r.add('opinion', OTHER, {
      ...opinion('venice-murano', 1850, 1900),
      adopts: { lot: CHILD, seq: first.header.seq, hash: first.stored.hash },
    });
    v = verifyRoll(r.stored, { lot: CHILD });
    if (!v.ok) throw new Error('roll');
    a = attributionOnRecord(v.verified, v.state, []);
    expect(a.source).toBe('holder');
    expect(a.adopted?.seq).toBe(first.header.seq);
    expect(a.agree.map((o) => o.author)).toEqual([THIRD]);
  });
});
