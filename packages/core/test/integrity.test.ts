import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import {
  SYSTEM_ACTOR,
  buildEntry,
  canonicalise,
  checkTransition,
  createBundle,
  entryHash,
  headOf,
  parseBundleText,
  parseCanonical,
  verifyBundle,
  verifyRoll,
  type BeadCount,
  type BuiltEntry,
  type FormatVersion,
  type StoredEntry,
} from '../src/index.js';
import { HOLDER, LOT, OTHER, RollBuilder, THIRD, description, generatedRoll, opinion } from './helpers.js';

const OUTSIDER = 'acct-x04';
const without = (stored: StoredEntry[], seq: number): StoredEntry[] =>
  stored.map((e, i) => (i === seq ? { ...e, body: null } : e));

/** A 40-bead roll, exact count, in the given format version. */
function fortyBeads(version?: FormatVersion): RollBuilder {
  return new RollBuilder(LOT, undefined, version).register(HOLDER, {
    count: { value: 40, estimated: false },
  });
}

describe('counts after a final status', () => {
  it('a description after everything was split off keeps the count and its estimated flag', () => {
    const r = fortyBeads();
    r.add('split', HOLDER, { children: [{ lot: childCode(0), count: { value: 40, estimated: false } }] });
    expect(r.state!.status).toBe('split');
    const same = description({ count: { value: 40, estimated: false }, listed: false });
    expect(r.tryAdd('described', HOLDER, { description: same })).not.toHaveProperty('refused');
    for (const count of [
      { value: 41, estimated: false },
      { value: 40, estimated: true },
      { value: 0, estimated: false },
    ]) {
      expect(r.tryAdd('described', HOLDER, { description: description({ count }) })).toEqual({
        refused: 'bad-transition',
      });
    }
  });
  it('the same holds after a sale, a retirement and a combination; a verifier refuses a forced change', () => {
    for (const end of ['sold', 'retired'] as const) {
      const r = fortyBeads();
      if (end === 'sold') r.add('sold', HOLDER, { date: '2025-01-02' });
      else r.add('retired', HOLDER, {});
      r.add(
        'described',
        HOLDER,
        { description: description({ count: { value: 12, estimated: false } }) },
        {
          unchecked: true,
        },
      );
      expect(verifyRoll(r.stored)).toMatchObject({ ok: false, seq: 2, reason: 'bad-transition' });
    }
  });
});

describe('the remaining count is cumulative', () => {
  it('a 40-bead lot that gave 10 cannot give 35 after a new description', () => {
    const r = fortyBeads();
    r.add('split', HOLDER, { children: [{ lot: childCode(0), count: { value: 10, estimated: false } }] });
    r.add('described', HOLDER, {
      description: description({ title: 'restrung', count: { value: 40, estimated: false } }),
    });
    expect(r.state!.remaining).toEqual({ value: 30, estimated: false });
    expect(
      r.tryAdd('split', HOLDER, {
        children: [{ lot: childCode(1), count: { value: 35, estimated: false } }],
      }),
    ).toEqual({
      refused: 'bad-transition',
    });
    expect(
      r.tryAdd('combined', HOLDER, { child: childCode(2), count: { value: 31, estimated: false } }),
    ).toEqual({ refused: 'bad-transition' });
    r.add('split', HOLDER, { children: [{ lot: childCode(3), count: { value: 30, estimated: false } }] });
    expect(r.state!.status).toBe('split');
  });
  it('a description cannot count fewer beads than were already taken', () => {
    const r = fortyBeads();
    r.add('split', HOLDER, { children: [{ lot: childCode(0), count: { value: 25, estimated: false } }] });
    expect(
      r.tryAdd('described', HOLDER, { description: description({ count: { value: 24, estimated: false } }) }),
    ).toEqual({ refused: 'bad-transition' });
    expect(
      r.tryAdd('described', HOLDER, { description: description({ count: { value: 24, estimated: true } }) }),
    ).not.toHaveProperty('refused');
  });
  it('property: no accepted sequence of descriptions and splits takes more beads than an exact count holds', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.boolean(), fc.integer({ min: 1, max: 60 }), fc.boolean()), { maxLength: 25 }),
        (steps) => {
          const r = fortyBeads();
          let n = 0;
          for (const [describe, value, est] of steps) {
            if (describe)
              r.tryAdd('described', HOLDER, {
                description: description({ count: { value, estimated: false } }),
              });
            else
              r.tryAdd('split', HOLDER, {
                children: [{ lot: childCode(n++), count: { value, estimated: est && n % 3 === 0 } }],
              });
            const s = r.state!;
            if (!s.count!.estimated && !s.taken!.estimated)
              expect(s.taken!.value).toBeLessThanOrEqual(s.count!.value);
          }
          expect(verifyRoll(r.stored).ok).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });
});

/** The `registered` entry of `kid`, a child of LOT's `split` entry, holding `count` beads. */
function childOf(split: BuiltEntry, kid: string, count: BeadCount) {
  return buildEntry(null, {
    lot: kid,
    kind: 'registered',
    actor: HOLDER,
    time: '2030-01-01T00:00:00.000Z',
    body: { description: description({ count }) },
    parents: [{ lot: LOT, seq: split.header.seq, hash: split.stored.hash }],
  });
}

/** The n-th of a series of distinct canonical lot codes (data symbols, then the check symbol). */
function childCode(n: number): string {
  const alphabet = '0123456789ABCDEFGHJKMNPQRSTVWXYZ*~$=U';
  let data = '';
  let v = n + 1000;
  for (let i = 0; i < 8; i++) {
    data = alphabet[v % 32] + data;
    v = Math.floor(v / 32);
  }
  let num = 0;
  for (const ch of data) num = num * 32 + alphabet.indexOf(ch);
  return data + alphabet[num % 37];
}

describe('reserved account ids', () => {
  it('only beadroll:system acts, and only to lapse an offer', () => {
    const r = fortyBeads();
    for (const [kind, body] of [
      ['note', { text: 'hello' }],
      ['opinion', opinion('venice-murano', 1850, 1900)],
      ['exhibit-added', { sealedOnly: true }],
      ['redacted', { target: 0, reason: 'abuse' }],
    ] as const) {
      expect(checkTransition(r.state, { kind, actor: SYSTEM_ACTOR, body: body as never }).ok).toBe(false);
      expect(
        checkTransition(r.state, { kind, actor: 'beadroll:registry', body: body as never }),
      ).toMatchObject({
        ok: false,
        code: 'bad-actor',
      });
    }
    expect(checkTransition(null, { kind: 'registered', actor: 'beadroll:x', body: null }).ok).toBe(false);
    expect(r.tryAdd('transfer-offered', HOLDER, { recipient: 'beadroll:archive' })).toEqual({
      refused: 'bad-transition',
    });
    expect(r.tryAdd('transfer-offered', HOLDER, { recipient: SYSTEM_ACTOR })).toEqual({
      refused: 'bad-transition',
    });
    r.add('transfer-offered', HOLDER, { recipient: OTHER });
    expect(r.tryAdd('transfer-lapsed', 'beadroll:other', { offerSeq: 1 })).toEqual({ refused: 'bad-actor' });
    expect(r.tryAdd('transfer-lapsed', OTHER, { offerSeq: 1 })).toEqual({ refused: 'bad-actor' });
    r.add('transfer-lapsed', SYSTEM_ACTOR, { offerSeq: 1 });
    r.add('redacted', THIRD, { target: 1, reason: 'abuse' });
    expect(r.tryAdd('redacted', 'beadroll:registrar', { target: 2, reason: 'abuse' })).toEqual({
      refused: 'bad-actor',
    });
    expect(verifyRoll(r.stored).ok).toBe(true);
  });
});

/** A transfer accepted by the wrong account: the roll is invalid. */
function wrongAcceptor(version: FormatVersion): RollBuilder {
  const r = fortyBeads(version);
  r.add('transfer-offered', HOLDER, { recipient: OTHER }); // seq 1
  r.add('transfer-accepted', THIRD, { offerSeq: 1 }, { unchecked: true, force: true }); // seq 2
  r.add('redacted', OUTSIDER, { target: 1, reason: 'personal-data' }); // seq 3
  return r;
}

/** An outsider's note on an unlisted lot whose listing is later redacted: the roll is invalid. */
function outsiderNote(version: FormatVersion): RollBuilder {
  const r = fortyBeads(version);
  r.add('described', HOLDER, {
    description: description({ listed: false, count: { value: 40, estimated: false } }),
  }); // 1
  r.add('note', OUTSIDER, { text: 'not yours' }, { unchecked: true, force: true }); // 2
  r.add('described', HOLDER, {
    description: description({ listed: false, count: { value: 40, estimated: false } }),
  }); // 3
  r.add('redacted', THIRD, { target: 1, reason: 'holder-request' }); // 4
  return r;
}

describe('a redaction never makes an invalid roll verify', () => {
  for (const [name, make, seq, removed] of [
    ['a transfer accepted by the wrong account', wrongAcceptor, 2, 1],
    ["an outsider's note on an unlisted lot", outsiderNote, 2, 1],
  ] as const) {
    it(`version 2: ${name} fails with or without the removed body`, () => {
      const r = make(2);
      expect(verifyRoll(r.stored)).toMatchObject({ ok: false, seq, reason: 'bad-actor' });
      expect(verifyRoll(without(r.stored, removed))).toMatchObject({ ok: false, seq, reason: 'bad-actor' });
    });
    it(`version 1: ${name} fails with the body, and without it verifies only as not fully checkable`, () => {
      const r = make(1);
      expect(verifyRoll(r.stored)).toMatchObject({ ok: false, seq, reason: 'bad-actor' });
      const v = verifyRoll(without(r.stored, removed));
      expect(v.ok).toBe(true);
      // The removed entry's own rules and the broken entry's are both named.
      if (v.ok) expect(v.unchecked.map((u) => u.seq)).toEqual([removed, seq]);
    });
  }
  it('a fully valid version-1 roll with a removal that no rule needed is fully checked', () => {
    const r = fortyBeads(1);
    r.add('observed', HOLDER, { observations: { hole: 'clean', note: 'my address is …' } });
    r.add('redacted', THIRD, { target: 1, reason: 'personal-data' });
    const v = verifyRoll(without(r.stored, 1));
    expect(v).toMatchObject({ ok: true, unchecked: [] });
  });
  it('property: removing any removable body of a broken roll never makes it verify', () => {
    fc.assert(
      fc.property(fc.array(fc.nat(1000), { minLength: 3, maxLength: 25 }), fc.nat(), (choices, pick) => {
        const good = generatedRoll(choices, 'redaction ' + choices.join('.'));
        // Break it: re-append a copy of a valid step by an account the rules refuse.
        const s = good.state!;
        const r = good;
        const bad = s.listed
          ? r.add('transfer-withdrawn', OUTSIDER, { offerSeq: 0 }, { unchecked: true, force: true })
          : r.add('note', OUTSIDER, { text: 'intruder' }, { unchecked: true, force: true });
        const badSeq = bad.header.seq;
        expect(verifyRoll(r.stored).ok).toBe(false);
        const removable = r.built.filter(
          (b) =>
            !['registered', 'split', 'combined', 'redacted'].includes(b.header.kind) &&
            b.header.seq !== badSeq,
        );
        if (removable.length === 0) return;
        const target = removable[pick % removable.length]!.header.seq;
        const head = headOf(r.built.at(-1)!);
        const red = buildEntry(head, {
          kind: 'redacted',
          actor: THIRD,
          time: '2030-01-01T00:00:00.000Z',
          body: { target, reason: 'abuse' },
        });
        const stored = [...without(r.stored, target), red.stored];
        expect(verifyRoll(stored).ok).toBe(false);
        expect(verifyRoll([...without(r.stored, badSeq), red.stored]).ok).toBe(false);
      }),
      { numRuns: 150 },
    );
  });
});

describe('the reducer and the verifier agree', () => {
  it('property: the verified state equals the state folded while writing, for any generated roll', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat(1000), { maxLength: 40 }),
        fc.constantFrom<FormatVersion>(1, 2, 3),
        (choices, version) => {
          const r = generatedRoll(choices, 'agree ' + version + choices.join('.'), version);
          const v = verifyRoll(r.stored);
          expect(v.ok).toBe(true);
          if (v.ok) {
            expect(v.state).toEqual(r.state);
            expect(JSON.parse(JSON.stringify(v.state))).toEqual(v.state);
            expect(v.unchecked).toEqual([]);
          }
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe('rule facts (version 2)', () => {
  const r = fortyBeads();
  r.add('transfer-offered', HOLDER, { recipient: OTHER });
  it('every header carries the facts of its body', () => {
    const [reg, offer] = r.built as [BuiltEntry, BuiltEntry];
    expect(reg.header).toMatchObject({
      v: 3,
      facts: { count: { value: 40, estimated: false }, listed: true },
    });
    expect(offer.header.facts).toEqual({ recipient: OTHER });
  });
  it('facts that differ from the body fail with bad-facts, even when re-hashed', () => {
    const e = r.stored[1]!;
    const header = e.header.replace(`"recipient":"${OTHER}"`, `"recipient":"${THIRD}"`);
    const forged = [r.stored[0]!, { ...e, header, hash: entryHash(header) }];
    expect(verifyRoll(forged)).toMatchObject({ ok: false, seq: 1, reason: 'bad-facts' });
  });
  it('a version-2 header without facts, or with unknown facts, is bad-facts; a version-1 header with facts is bad-header', () => {
    const h = parseCanonical(r.stored[0]!.header) as Record<string, unknown>;
    const re = (o: Record<string, unknown>): StoredEntry[] => {
      const header = canonicalise(o);
      return [{ ...r.stored[0]!, header, hash: entryHash(header) }];
    };
    const { facts, ...bare } = h;
    expect(verifyRoll(re(bare))).toMatchObject({ ok: false, reason: 'bad-facts' });
    expect(verifyRoll(re({ ...h, facts: { ...(facts as object), extra: 1 } }))).toMatchObject({
      reason: 'bad-facts',
    });
    expect(verifyRoll(re({ ...h, v: 1 }))).toMatchObject({ ok: false, reason: 'bad-header' });
  });
  it('a version never goes down along a roll', () => {
    const v1 = buildEntry(
      headOf(r.built[1]!),
      { kind: 'note', actor: HOLDER, time: '2026-01-01T00:00:00.000Z', body: { text: 'x' } },
      { version: 1 },
    );
    expect(verifyRoll([...r.stored, v1.stored])).toMatchObject({ ok: false, seq: 2, reason: 'bad-header' });
    const old = fortyBeads(1);
    const v2 = buildEntry(headOf(old.built[0]!), {
      kind: 'note',
      actor: HOLDER,
      time: '2026-01-01T00:00:00.000Z',
      body: { text: 'x' },
    });
    expect(verifyRoll([...old.stored, v2.stored]).ok).toBe(true);
  });
  it('an opinion cites only public, unredacted exhibits of its own roll (version 2)', () => {
    const x = fortyBeads();
    const sha = 'ab'.repeat(32);
    expect(x.tryAdd('opinion', OTHER, opinion('venice-murano', 1850, 1900, [sha]))).toEqual({
      refused: 'bad-transition',
    });
    x.add('exhibit-added', OTHER, {
      exhibit: {
        kind: 'hole',
        original: { sha256: sha, size: 10, mediaType: 'image/jpeg' },
        derivatives: [],
      },
    });
    x.add('opinion', OTHER, opinion('venice-murano', 1850, 1900, [sha]));
    x.add('redacted', THIRD, { target: 1, reason: 'unlawful-content' });
    expect(x.tryAdd('opinion', THIRD, opinion('bohemia-czech', 1850, 1900, [sha]))).toEqual({
      refused: 'bad-transition',
    });
    const old = fortyBeads(1);
    expect(old.tryAdd('opinion', OTHER, opinion('venice-murano', 1850, 1900, [sha]))).not.toHaveProperty(
      'refused',
    );
  });
  it('a sealed-only exhibit needs a sealed root in its header', () => {
    const x = fortyBeads();
    x.add('exhibit-added', HOLDER, { sealedOnly: true }, { unchecked: true });
    expect(verifyRoll(x.stored)).toMatchObject({ ok: false, seq: 1, reason: 'bad-body' });
    expect(verifyRoll(without(x.stored, 1))).toMatchObject({ ok: false, seq: 1, reason: 'bad-facts' });
  });
});

describe('version-1 bundles keep verifying under the version-1 rules', () => {
  // Written by the version-1 writer before version 2 existed, and frozen.
  const frozen = readFileSync(new URL('./fixtures/bundle-v1.json', import.meta.url), 'utf8');
  it("the frozen example verifies; its removed note leaves only that note's rule unchecked", () => {
    const b = parseBundleText(frozen);
    expect(b.version).toBe(1);
    const r = verifyBundle(b);
    expect(r.failures).toEqual([]);
    const redacted = b.rolls[1]!.entries.findIndex((e) => e.body === null);
    expect(r.rolls.map((x) => x.unchecked.map((u) => u.seq))).toEqual([[], [redacted], [], [], [], []]);
    expect(b.rolls.every((x) => x.entries.every((e) => e.header.includes('"v":1')))).toBe(true);
  });
});

describe('link-scope rolls', () => {
  it('a link roll holding an entry no child names fails with unnamed-link', () => {
    const parent = fortyBeads();
    const kid = childCode(0);
    const split = parent.add('split', HOLDER, {
      children: [{ lot: kid, count: { value: 5, estimated: false } }],
    });
    const extra = parent.add('split', HOLDER, {
      children: [{ lot: childCode(4), count: { value: 5, estimated: false } }],
    });
    const c = childOf(split, kid, { value: 5, estimated: false });
    const good = createBundle([
      { lot: kid, entries: [c.stored] },
      { lot: LOT, scope: 'link', entries: [split.stored] },
    ]);
    expect(verifyBundle(good).ok).toBe(true);
    const leaky = createBundle([
      { lot: kid, entries: [c.stored] },
      { lot: LOT, scope: 'link', entries: [split.stored, extra.stored] },
    ]);
    expect(verifyBundle(leaky).failures).toEqual([
      expect.objectContaining({ lot: LOT, seq: extra.header.seq, reason: 'unnamed-link' }),
    ]);
  });
  it('a split child whose registered count differs in its estimated flag is broken (version 2)', () => {
    const parent = fortyBeads();
    const kid = childCode(0);
    const split = parent.add('split', HOLDER, {
      children: [{ lot: kid, count: { value: 5, estimated: false } }],
    });
    const c = childOf(split, kid, { value: 5, estimated: true });
    const b = createBundle([
      { lot: LOT, entries: parent.stored },
      { lot: kid, entries: [c.stored] },
    ]);
    expect(verifyBundle(b).failures).toEqual([expect.objectContaining({ lot: kid, reason: 'bad-parent' })]);
  });
  it('parents naming the same lot twice are bad-parent', () => {
    const h = { lot: LOT, seq: 1, hash: 'ab'.repeat(32) };
    expect(() =>
      buildEntry(null, {
        lot: childCode(0),
        kind: 'registered',
        actor: HOLDER,
        time: '2030-01-01T00:00:00.000Z',
        body: { description: description() },
        parents: [h, { ...h, seq: 2 }],
      }),
    ).toThrow(/same lot twice/);
  });
});

describe('what a version-1 removal leaves unchecked', () => {
  it('a removed version-1 opinion or observation leaves nothing unchecked; a removed offer does', () => {
    const r = fortyBeads(1);
    r.add('opinion', OTHER, opinion('venice-murano', 1850, 1900)); // 1
    r.add('observed', HOLDER, { observations: { hole: 'clean' } }); // 2
    r.add('transfer-offered', HOLDER, { recipient: OTHER }); // 3
    r.add('transfer-withdrawn', HOLDER, { offerSeq: 3 }); // 4
    for (const t of [1, 2, 3]) r.add('redacted', THIRD, { target: t, reason: 'abuse' });
    const v = verifyRoll(r.stored.map((e, i) => ([1, 2, 3].includes(i) ? { ...e, body: null } : e)));
    expect(v.ok).toBe(true);
    if (v.ok) expect(v.unchecked.map((u) => u.seq)).toEqual([3]);
  });
});

describe('version-2 body fields', () => {
  it('a mould seam is recorded in version 2 and is an unknown field in version 1', () => {
    const v2 = fortyBeads();
    v2.add('observed', HOLDER, { observations: { mouldSeam: 'seen' } });
    expect(verifyRoll(v2.stored).ok).toBe(true);
    const v1 = fortyBeads(1);
    expect(() => v1.add('observed', HOLDER, { observations: { mouldSeam: 'seen' } })).toThrow(/mouldSeam/);
  });
});

describe('version-2 kinds and fields stay out of version 1', () => {
  it('a voided sale and a correction are version-2 only', () => {
    const v1 = fortyBeads(1);
    expect(() =>
      v1.add(
        'observed',
        HOLDER,
        {
          observations: { hole: 'clean' },
          corrects: { seq: 0, reason: 'x' },
        } as never,
        { unchecked: true },
      ),
    ).toThrow(/corrects/);
    v1.add('sold', HOLDER, { date: '2025-01-02' });
    expect(() => v1.add('sale-voided', HOLDER, { saleSeq: 1 } as never, { unchecked: true })).toThrow(
      /format version 1/,
    );
  });
});
