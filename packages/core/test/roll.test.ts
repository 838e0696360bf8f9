import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ENTRY_KINDS,
  GENESIS_PREV,
  SYSTEM_ACTOR,
  TRANSITION_RULES,
  ValidationError,
  bodyDigest,
  buildEntry,
  checkTransition,
  createRollVerifier,
  discloseSealedField,
  entryHash,
  generateLotCode,
  matchTag,
  openSealedFields,
  opinionsDisagree,
  reduceRoll,
  seededRandom,
  tagReference,
  verifyRoll,
  verifySealedDisclosure,
  type StoredEntry,
} from '../src/index.js';
import { HOLDER, LOT, OTHER, RollBuilder, THIRD, description, generatedRoll, opinion } from './helpers.js';
import dissentTable from './fixtures/dissent-cases.json' with { type: 'json' };

describe('building entries', () => {
  it('links seq 0 to the genesis value and each entry to the previous hash', () => {
    const r = new RollBuilder().register();
    r.add('observed', HOLDER, { observations: { hole: 'powder' } });
    const [a, b] = r.built;
    expect(a!.header.prev).toBe(GENESIS_PREV);
    expect(b!.header.prev).toBe(a!.stored.hash);
    expect(a!.stored.hash).toBe(entryHash(a!.stored.header));
    expect(a!.header.body).toBe(bodyDigest(a!.stored.body!));
    expect(a!.body.nonce).toMatch(/^[0-9a-f]{32}$/);
    expect(verifyRoll(r.stored).ok).toBe(true);
  });
  it('refuses bad drafts with every offending field named', () => {
    const r = new RollBuilder().register();
    const head = { lot: LOT, seq: 0, hash: r.stored[0]!.hash, time: '2025-01-01T00:00:00.000Z' };
    try {
      buildEntry(head, {
        kind: 'described',
        actor: 'a b',
        time: '2024-01-01T00:00:00Z',
        body: {
          description: description({
            count: { value: -1, estimated: false },
            diameterMm: { min: 9, max: 3 },
          }),
        },
      });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ValidationError);
      expect((e as ValidationError).issues.map((i) => i.path)).toEqual(['time', 'actor']);
    }
    try {
      buildEntry(head, {
        kind: 'described',
        actor: HOLDER,
        time: '2025-01-02T00:00:00.000Z',
        body: {
          description: {
            ...description({ count: { value: -1, estimated: false }, diameterMm: { min: 9, max: 3 } }),
            extra: 1,
          } as never,
        },
      });
      expect.unreachable();
    } catch (e) {
      expect((e as ValidationError).code).toBe('bad-body');
      expect((e as ValidationError).issues.map((i) => i.path).sort()).toEqual([
        'body.description.count.value',
        'body.description.diameterMm',
        'body.description.extra',
      ]);
    }
  });
  it('seals private fields with a fresh salt each; one can be disclosed alone', () => {
    const r = new RollBuilder();
    const b = r.add(
      'registered',
      HOLDER,
      { description: description() },
      {
        sealed: {
          'acquisition-source': 'estate sale',
          'acquisition-cost': { amount: 1200, currency: 'EUR' },
          'storage-location': 'drawer 4',
        },
      },
    );
    expect(b.stored.body).not.toContain('estate');
    expect(b.stored.header).not.toContain('estate');
    const salts = b.sealed!.fields.map((f) => f.salt);
    expect(new Set(salts).size).toBe(3);
    expect(openSealedFields(b.sealed!, b.header.sealed!)).toBe(true);
    const d = discloseSealedField(b.sealed!, 'acquisition-source');
    expect(JSON.stringify(d)).not.toContain('1200');
    expect(verifySealedDisclosure(d, b.header.sealed!)).toBe(true);
    expect(verifySealedDisclosure({ ...d, value: 'auction' }, b.header.sealed!)).toBe(false);
    expect(() =>
      new RollBuilder().add(
        'registered',
        HOLDER,
        { description: description() },
        { sealed: { 'acquisition-cost': { amount: 1, currency: 'euro' } } },
      ),
    ).toThrow(ValidationError);
  });
  it('is deterministic with an injected random source', () => {
    const a = new RollBuilder(LOT, seededRandom('x')).register();
    const b = new RollBuilder(LOT, seededRandom('x')).register();
    expect(a.stored).toEqual(b.stored);
  });
});

describe('rule table', () => {
  it('has a row for every kind', () =>
    expect(Object.keys(TRANSITION_RULES).sort()).toEqual([...ENTRY_KINDS].sort()));

  const offered = (): RollBuilder => {
    const r = new RollBuilder().register();
    r.add('transfer-offered', HOLDER, { recipient: OTHER });
    return r;
  };
  const cases: Array<{
    desc: string;
    roll: () => RollBuilder;
    kind: string;
    actor: string;
    body: object;
    want: string;
  }> = [
    {
      desc: 'only the holder describes',
      roll: () => new RollBuilder().register(),
      kind: 'described',
      actor: OTHER,
      body: { description: description() },
      want: 'bad-actor',
    },
    {
      desc: 'only the holder observes',
      roll: () => new RollBuilder().register(),
      kind: 'observed',
      actor: OTHER,
      body: { observations: {} },
      want: 'bad-actor',
    },
    {
      desc: 'only the holder offers',
      roll: () => new RollBuilder().register(),
      kind: 'transfer-offered',
      actor: OTHER,
      body: { recipient: THIRD },
      want: 'bad-actor',
    },
    {
      desc: 'no offer to oneself',
      roll: () => new RollBuilder().register(),
      kind: 'transfer-offered',
      actor: HOLDER,
      body: { recipient: HOLDER },
      want: 'bad-transition',
    },
    {
      desc: 'one open offer',
      roll: offered,
      kind: 'transfer-offered',
      actor: HOLDER,
      body: { recipient: THIRD },
      want: 'bad-transition',
    },
    {
      desc: 'only the recipient accepts',
      roll: offered,
      kind: 'transfer-accepted',
      actor: THIRD,
      body: { offerSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'the holder cannot accept its own offer',
      roll: offered,
      kind: 'transfer-accepted',
      actor: HOLDER,
      body: { offerSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'only the recipient declines',
      roll: offered,
      kind: 'transfer-declined',
      actor: HOLDER,
      body: { offerSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'only the offerer withdraws',
      roll: offered,
      kind: 'transfer-withdrawn',
      actor: OTHER,
      body: { offerSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'answers name the open offer',
      roll: offered,
      kind: 'transfer-accepted',
      actor: OTHER,
      body: { offerSeq: 0 },
      want: 'bad-transition',
    },
    {
      desc: 'lapse only by the system account',
      roll: offered,
      kind: 'transfer-lapsed',
      actor: HOLDER,
      body: { offerSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'lapse only with an open offer',
      roll: () => new RollBuilder().register(),
      kind: 'transfer-lapsed',
      actor: SYSTEM_ACTOR,
      body: { offerSeq: 0 },
      want: 'bad-transition',
    },
    {
      desc: 'lapse of the open offer',
      roll: offered,
      kind: 'transfer-lapsed',
      actor: SYSTEM_ACTOR,
      body: { offerSeq: 1 },
      want: 'ok',
    },
    {
      desc: 'no split while offered',
      roll: offered,
      kind: 'split',
      actor: HOLDER,
      body: { children: [{ lot: '000000000', count: { value: 1, estimated: false } }] },
      want: 'bad-transition',
    },
    {
      desc: 'no combine while offered',
      roll: offered,
      kind: 'combined',
      actor: HOLDER,
      body: { child: '000000000', count: { value: 1, estimated: false } },
      want: 'bad-transition',
    },
    {
      desc: 'no sale while offered',
      roll: offered,
      kind: 'sold',
      actor: HOLDER,
      body: { date: '2025-01-02' },
      want: 'bad-transition',
    },
    {
      desc: 'split counts cannot exceed an exact count',
      roll: () => new RollBuilder().register(),
      kind: 'split',
      actor: HOLDER,
      body: { children: [{ lot: '000000000', count: { value: 61, estimated: false } }] },
      want: 'bad-transition',
    },
    {
      desc: 'split counts may exceed an estimated count',
      roll: () => new RollBuilder().register(HOLDER, { count: { value: 60, estimated: true } }),
      kind: 'split',
      actor: HOLDER,
      body: { children: [{ lot: '000000000', count: { value: 61, estimated: false } }] },
      want: 'ok',
    },
    {
      desc: 'a non-holder may give an opinion on a listed lot',
      roll: () => new RollBuilder().register(),
      kind: 'opinion',
      actor: OTHER,
      body: opinion('india', 1950, 2000),
      want: 'ok',
    },
    {
      desc: 'a non-holder may not give an opinion on an unlisted lot',
      roll: () => new RollBuilder().register(HOLDER, { listed: false }),
      kind: 'opinion',
      actor: OTHER,
      body: opinion('india', 1950, 2000),
      want: 'bad-actor',
    },
    {
      desc: 'only its author withdraws an opinion',
      roll: () => {
        const r = new RollBuilder().register();
        r.add('opinion', OTHER, opinion('india', 1950, 2000));
        return r;
      },
      kind: 'opinion-withdrawn',
      actor: HOLDER,
      body: { opinionSeq: 1 },
      want: 'bad-actor',
    },
    {
      desc: 'withdraw names a standing opinion',
      roll: () => new RollBuilder().register(),
      kind: 'opinion-withdrawn',
      actor: HOLDER,
      body: { opinionSeq: 0 },
      want: 'bad-transition',
    },
    {
      desc: 'nothing but opinions, notes, descriptions and redactions after a sale',
      roll: () => {
        const r = new RollBuilder().register();
        r.add('sold', HOLDER, { date: '2025-01-01' });
        return r;
      },
      kind: 'observed',
      actor: HOLDER,
      body: { observations: {} },
      want: 'bad-transition',
    },
    {
      desc: 'an opinion after a sale',
      roll: () => {
        const r = new RollBuilder().register();
        r.add('sold', HOLDER, { date: '2025-01-01' });
        return r;
      },
      kind: 'opinion',
      actor: OTHER,
      body: opinion('india', 1950, 2000),
      want: 'ok',
    },
    {
      desc: 'no offer after retirement',
      roll: () => {
        const r = new RollBuilder().register();
        r.add('retired', HOLDER, {});
        return r;
      },
      kind: 'transfer-offered',
      actor: HOLDER,
      body: { recipient: OTHER },
      want: 'bad-transition',
    },
    {
      desc: 'the registered entry cannot be redacted',
      roll: () => new RollBuilder().register(),
      kind: 'redacted',
      actor: THIRD,
      body: { target: 0, reason: 'abuse' },
      want: 'bad-transition',
    },
    {
      desc: 'an open offer cannot be redacted',
      roll: offered,
      kind: 'redacted',
      actor: THIRD,
      body: { target: 1, reason: 'abuse' },
      want: 'bad-transition',
    },
    {
      desc: 'redaction of a later entry is refused',
      roll: () => new RollBuilder().register(),
      kind: 'redacted',
      actor: THIRD,
      body: { target: 5, reason: 'abuse' },
      want: 'bad-transition',
    },
    {
      desc: 'a roll opens with registered only',
      roll: () => new RollBuilder().register(),
      kind: 'registered',
      actor: HOLDER,
      body: { description: description() },
      want: 'bad-transition',
    },
  ];
  for (const c of cases) {
    it(c.desc, () => {
      const r = c.roll();
      const got = checkTransition(r.state, { kind: c.kind as never, actor: c.actor, body: c.body as never });
      expect(got.ok ? 'ok' : got.code).toBe(c.want);
    });
  }
});

describe('derived state', () => {
  it('follows a transfer: holder, status, open offer', () => {
    const r = new RollBuilder().register();
    r.add(
      'transfer-offered',
      HOLDER,
      { recipient: OTHER },
      { sealed: { 'transfer-price': { amount: 5000, currency: 'GBP' } } },
    );
    expect(r.state!.status).toBe('offered');
    expect(r.state!.openOffer).toMatchObject({ seq: 1, offerer: HOLDER, recipient: OTHER });
    r.add('transfer-accepted', OTHER, { offerSeq: 1 });
    expect(r.state).toMatchObject({ status: 'held', holder: OTHER, openOffer: null });
    const v = verifyRoll(r.stored);
    expect(v.ok && v.state.holder).toBe(OTHER);
  });

  // Dissent: another author's standing opinion with a different origin (neither "unknown") or
  // a period that does not overlap the holder's latest standing opinion.
  const dissentCases = dissentTable.cases as Array<{
    desc: string;
    holder: [string, number, number] | null;
    other: [string, number, number];
    dissent: boolean;
  }>;
  for (const c of dissentCases) {
    it(`dissent table: ${c.desc}`, () => {
      const r = new RollBuilder().register();
      if (c.holder) r.add('opinion', HOLDER, opinion(...c.holder));
      r.add('opinion', OTHER, opinion(...c.other));
      expect(r.state!.dissents.length).toBe(c.dissent ? 1 : 0);
      expect(r.state!.attribution === null).toBe(c.holder === null);
    });
  }
  it('uses the holder’s latest standing opinion; withdrawn ones stop counting; earlier holders become ordinary', () => {
    const r = new RollBuilder().register();
    r.add('opinion', HOLDER, opinion('venice-murano', 1850, 1900));
    r.add('opinion', OTHER, opinion('bohemia-czech', 1920, 1940));
    expect(r.state!.dissents.map((d) => d.author)).toEqual([OTHER]);
    r.add('opinion', HOLDER, opinion('bohemia-czech', 1920, 1950));
    expect(r.state!.attribution!.seq).toBe(3);
    expect(r.state!.dissents).toEqual([]);
    r.add('opinion-withdrawn', HOLDER, { opinionSeq: 3 });
    expect(r.state!.attribution!.seq).toBe(1);
    expect(r.state!.dissents.length).toBe(1);
    r.add('transfer-offered', HOLDER, { recipient: OTHER });
    r.add('transfer-accepted', OTHER, { offerSeq: 5 });
    expect(r.state!.attribution!.author).toBe(OTHER);
    expect(r.state!.dissents.map((d) => d.author)).toEqual([HOLDER]);
    expect(opinionsDisagree(opinion('india', 1, 2).valueOf() as never, opinion('india', 1, 2) as never)).toBe(
      false,
    );
  });
  it('counts down through splits and combinations', () => {
    const rnd = seededRandom('children');
    const [c1, c2, c3] = [generateLotCode(rnd), generateLotCode(rnd), generateLotCode(rnd)];
    const r = new RollBuilder().register();
    r.add('split', HOLDER, {
      children: [c1!, c2!].map((lot) => ({ lot, count: { value: 20, estimated: false } })),
    });
    expect(r.state!.remaining).toEqual({ value: 20, estimated: false });
    expect(r.state!.status).toBe('held');
    r.add('combined', HOLDER, { child: c3!, count: { value: 20, estimated: false } });
    expect(r.state!.status).toBe('combined');
    expect(r.state!.children.map((c) => c.lot)).toEqual([c1, c2, c3]);
    expect(
      checkTransition(r.state, { kind: 'sold', actor: HOLDER, body: { date: '2025-01-01' } }),
    ).toMatchObject({ ok: false });
  });
});

describe('verification', () => {
  it('a redacted body still verifies; a missing body without a redaction does not', () => {
    const r = new RollBuilder().register();
    r.add('opinion', OTHER, opinion('china', 1990, 2000));
    r.add('note', OTHER, { text: 'private phone number here', ref: 1 });
    const missing = r.stored.map((e, i) => (i === 2 ? { ...e, body: null } : e));
    expect(verifyRoll(missing)).toMatchObject({ ok: false, seq: 2, reason: 'missing-body' });
    r.add('redacted', THIRD, { target: 2, reason: 'personal-data' });
    const redacted = r.stored.map((e, i) => (i === 2 ? { ...e, body: null } : e));
    const v = verifyRoll(redacted);
    expect(v.ok).toBe(true);
    if (v.ok) expect(v.redacted).toEqual([2]);
    const noReg = r.stored.map((e, i) => (i === 0 ? { ...e, body: null } : e));
    expect(verifyRoll(noReg)).toMatchObject({ ok: false, seq: 0, reason: 'missing-body' });
  });
  it('a description is redacted once a newer one replaces it; the state is the same with or without the body', () => {
    const r = new RollBuilder().register();
    r.add('described', HOLDER, { description: description({ title: 'A name and address' }) });
    expect(
      checkTransition(r.state, {
        kind: 'redacted',
        actor: THIRD,
        body: { target: 1, reason: 'personal-data' },
      }),
    ).toMatchObject({ ok: false, code: 'bad-transition' });
    r.add('opinion', OTHER, opinion('india', 1950, 2000));
    r.add('described', HOLDER, { description: description({ title: 'Corrected title' }) });
    r.add('redacted', THIRD, { target: 1, reason: 'personal-data' });
    const kept = verifyRoll(r.stored);
    const gone = verifyRoll(r.stored.map((e, i) => (i === 1 ? { ...e, body: null } : e)));
    expect(kept.ok && gone.ok).toBe(true);
    if (kept.ok && gone.ok) {
      expect(kept.state).toEqual(gone.state);
      expect(gone.state.description!.title).toBe('Corrected title');
    }
  });
  it('reports a wrong-actor transition at its seq', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat(1000), { maxLength: 25 }),
        fc.constantFrom('transfer-offered', 'observed', 'sold', 'retired'),
        (choices, kind) => {
          const r = generatedRoll(choices);
          const s = r.state!;
          if (s.status !== 'held') return;
          const intruder = [HOLDER, OTHER, THIRD].find((a) => a !== s.holder)!;
          const body =
            kind === 'transfer-offered'
              ? { recipient: s.holder }
              : kind === 'observed'
                ? { observations: {} }
                : kind === 'sold'
                  ? { date: '2025-01-01' }
                  : {};
          r.add(kind, intruder, body as never, { unchecked: true });
          expect(verifyRoll(r.stored)).toMatchObject({
            ok: false,
            seq: r.stored.length - 1,
            reason: 'bad-actor',
          });
        },
      ),
      { numRuns: 60 },
    );
  });
  it('detects a changed character in any stored field of any entry, at that seq', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat(1000), { minLength: 1, maxLength: 20 }),
        fc.nat(),
        fc.constantFrom('hash', 'header', 'body'),
        fc.nat(),
        fc.nat(94),
        (choices, pick, field, pos, ch) => {
          const r = generatedRoll(choices);
          const k = pick % r.stored.length;
          const e = r.stored[k]!;
          const text = e[field as keyof StoredEntry]!;
          const i = pos % text.length;
          let c = String.fromCharCode(32 + ch);
          if (c === text[i]) c = c === 'a' ? 'b' : 'a';
          const changed = text.slice(0, i) + c + text.slice(i + 1);
          const rolled = r.stored.map((x, j) => (j === k ? { ...x, [field]: changed } : x));
          const v = verifyRoll(rolled);
          expect(v.ok).toBe(false);
          if (!v.ok) expect(v.seq).toBe(k);
        },
      ),
      { numRuns: 300 },
    );
  });
  it('detects dropped, duplicated and reordered entries; a tag catches truncation', () => {
    fc.assert(
      fc.property(fc.array(fc.nat(1000), { minLength: 2, maxLength: 20 }), fc.nat(), (choices, pick) => {
        const r = generatedRoll(choices);
        const n = r.stored.length;
        if (n < 2) return;
        const k = pick % (n - 1);
        const dropped = r.stored.filter((_, j) => j !== k);
        expect(verifyRoll(dropped)).toMatchObject({ ok: false, seq: k });
        const dup = [...r.stored.slice(0, k + 1), r.stored[k]!, ...r.stored.slice(k + 1)];
        expect(verifyRoll(dup)).toMatchObject({ ok: false, seq: k + 1 });
        const swapped = [...r.stored];
        [swapped[k], swapped[k + 1]] = [swapped[k + 1]!, swapped[k]!];
        expect(verifyRoll(swapped)).toMatchObject({ ok: false, seq: k });
        const tag = { seq: n - 1, ref: tagReference(r.stored[n - 1]!.hash) };
        expect(matchTag(r.stored, tag)).toBe('found');
        const truncated = r.stored.slice(0, n - 1 - (pick % (n - 1)));
        expect(verifyRoll(truncated).ok).toBe(true);
        expect(matchTag(truncated, tag)).toBe('missing');
      }),
      { numRuns: 100 },
    );
  });
  it('redacting any redactable body keeps the roll verifying', () => {
    fc.assert(
      fc.property(fc.array(fc.nat(1000), { minLength: 1, maxLength: 20 }), fc.nat(), (choices, pick) => {
        const r = generatedRoll(choices);
        const s = r.state!;
        const candidates = r.built
          .map((b) => b.header.seq)
          .filter(
            (q) =>
              checkTransition(s, { kind: 'redacted', actor: THIRD, body: { target: q, reason: 'abuse' } }).ok,
          );
        if (candidates.length === 0) return;
        const t = candidates[pick % candidates.length]!;
        r.add('redacted', THIRD, { target: t, reason: 'abuse' });
        const v = verifyRoll(r.stored.map((e, j) => (j === t ? { ...e, body: null } : e)));
        expect(v.ok).toBe(true);
      }),
      { numRuns: 100 },
    );
  });
  it('the incremental verifier agrees with the whole-roll verifier', () => {
    const r = generatedRoll(Array.from({ length: 40 }, (_, i) => (i * 37) % 1000));
    const v = createRollVerifier(LOT);
    for (const e of r.stored) expect(v.push(e)).toBeNull();
    const a = v.finish();
    const b = verifyRoll(r.stored);
    expect(a.ok && b.ok && a.state).toEqual(b.ok && b.state);
    expect(reduceRoll(b.verified)).toEqual(a.ok && a.state);
  });
  it('names unknown versions, bad types and unsafe integers without throwing', () => {
    const r = new RollBuilder().register();
    const e = r.stored[0]!;
    const swap = (from: string, to: string): StoredEntry => {
      const header = e.header.replace(from, to);
      return { ...e, header, hash: entryHash(header) };
    };
    expect(verifyRoll([swap('"v":3', '"v":4')])).toMatchObject({ ok: false, reason: 'unknown-version' });
    expect(verifyRoll([swap('"seq":0', '"seq":"0"')])).toMatchObject({ ok: false, reason: 'bad-seq' });
    expect(verifyRoll([{ ...e, header: e.header.replace('{', '{ ') }])).toMatchObject({
      ok: false,
      reason: 'non-canonical',
    });
    expect(verifyRoll([swap('"seq":0', '"seq":9007199254740993')])).toMatchObject({
      ok: false,
      reason: 'non-canonical',
    });
    expect(verifyRoll([swap('"seq":0', '"seq":-1')])).toMatchObject({ ok: false, reason: 'bad-seq' });
    expect(verifyRoll([swap('"kind":"registered"', '"kind":"gifted"')])).toMatchObject({
      ok: false,
      reason: 'bad-header',
    });
    expect(verifyRoll([{ ...e, header: 42 as never }])).toMatchObject({ ok: false, reason: 'non-canonical' });
    expect(verifyRoll([null as never])).toMatchObject({ ok: false, seq: 0 });
    expect(verifyRoll([])).toMatchObject({ ok: false, seq: 0 });
    expect(verifyRoll([e], { lot: '000000000' })).toMatchObject({ ok: false, reason: 'bad-header' });
    const late = new RollBuilder().register();
    const built = late.built[0]!;
    const next = buildEntry(
      { lot: LOT, seq: 0, hash: built.stored.hash, time: '2020-01-01T00:00:00.000Z' },
      { kind: 'note', actor: HOLDER, time: '2020-01-01T00:00:00.000Z', body: { text: 'x' } },
    );
    expect(verifyRoll([built.stored, next.stored])).toMatchObject({ ok: false, seq: 1, reason: 'bad-time' });
  });
});
