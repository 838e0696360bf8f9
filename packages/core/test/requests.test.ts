import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  bodyIssues,
  canonicalise,
  checkTransition,
  decodeHeader,
  entryHash,
  factsIssues,
  isHeaderProblem,
  mayAppend,
  parseCanonical,
  reduceEntry,
  requestFor,
  verifyRoll,
  type BuiltEntry,
  type RollState,
} from '../src/index.js';
import { HOLDER, OTHER, RollBuilder, THIRD, generatedRoll, opinion } from './helpers.js';

const ASSESSOR = 'acct-as04';
const exhibit = (n: string) => ({
  kind: 'close-up' as const,
  original: { sha256: n.repeat(64), size: 10, mediaType: 'image/jpeg' },
  derivatives: [],
});

/** An unlisted lot whose holder asks `assessor` (null: any assessor). */
function asked(assessor: string | null = ASSESSOR): { r: RollBuilder; request: number } {
  const r = new RollBuilder().register(HOLDER, { listed: false });
  const q = r.add('opinion-requested', HOLDER, { assessor });
  return { r, request: q.header.seq };
}

describe('opinion requests (format version 3)', () => {
  it('the asked assessor adds evidence and an opinion on an unlisted lot; the opinion closes the request; it verifies', () => {
    const { r, request } = asked();
    expect(r.state!.openRequests).toEqual([{ seq: 1, assessor: ASSESSOR, time: r.built[1]!.header.time }]);
    const ex = r.add('exhibit-added', ASSESSOR, { exhibit: exhibit('a'), request });
    expect(ex.header.facts).toEqual({ original: 'a'.repeat(64), request });
    expect(r.state!.openRequests).toHaveLength(1); // evidence does not answer
    const op = r.add('opinion', ASSESSOR, {
      ...opinion('bohemia-czech', 1920, 1940, ['a'.repeat(64)]),
      request,
    });
    expect(op.header).toMatchObject({ v: 3, facts: { exhibits: ['a'.repeat(64)], request } });
    expect(r.state!.openRequests).toEqual([]);
    const v = verifyRoll(r.stored);
    expect(v.ok).toBe(true);
    expect(v.ok && v.state).toEqual(r.state);
  });
  it('without a request, or after it closed, an outsider still may not write on an unlisted lot', () => {
    const { r, request } = asked();
    expect(r.tryAdd('opinion', ASSESSOR, opinion('india', 1900, 1950))).toEqual({ refused: 'bad-actor' });
    expect(r.tryAdd('exhibit-added', ASSESSOR, { exhibit: exhibit('b') })).toEqual({ refused: 'bad-actor' });
    r.add('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request });
    expect(r.tryAdd('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request })).toEqual({
      refused: 'bad-transition',
    });
    expect(r.tryAdd('exhibit-added', ASSESSOR, { exhibit: exhibit('c'), request })).toEqual({
      refused: 'bad-transition',
    });
  });
  it('a request asks only its assessor; one open to any assessor asks anyone but the holder', () => {
    const { r, request } = asked();
    expect(r.tryAdd('opinion', THIRD, { ...opinion('india', 1900, 1950), request })).toEqual({
      refused: 'bad-actor',
    });
    const any = asked(null);
    expect(
      any.r.tryAdd('opinion', HOLDER, { ...opinion('india', 1900, 1950), request: any.request }),
    ).toEqual({
      refused: 'bad-actor',
    });
    any.r.add('opinion', THIRD, { ...opinion('india', 1900, 1950), request: any.request });
    expect(any.r.state!.openRequests).toEqual([]);
    expect(verifyRoll(any.r.stored).ok).toBe(true);
  });
  it('only the holder asks and closes, only while held or offered, never itself or a reserved id', () => {
    const r = new RollBuilder().register(HOLDER, { listed: false });
    expect(r.tryAdd('opinion-requested', OTHER, { assessor: ASSESSOR })).toEqual({ refused: 'bad-actor' });
    expect(r.tryAdd('opinion-requested', HOLDER, { assessor: HOLDER })).toEqual({
      refused: 'bad-transition',
    });
    expect(r.tryAdd('opinion-requested', HOLDER, { assessor: 'beadroll:system' })).toEqual({
      refused: 'bad-transition',
    });
    const q = r.add('opinion-requested', HOLDER, { assessor: ASSESSOR }).header.seq;
    expect(r.tryAdd('opinion-request-closed', ASSESSOR, { request: q })).toEqual({ refused: 'bad-actor' });
    expect(r.tryAdd('opinion-request-closed', HOLDER, { request: 0 })).toEqual({ refused: 'bad-transition' });
    r.add('opinion-request-closed', HOLDER, { request: q });
    expect(r.tryAdd('opinion-request-closed', HOLDER, { request: q })).toEqual({ refused: 'bad-transition' });
    expect(r.tryAdd('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request: q })).toEqual({
      refused: 'bad-transition',
    });
    r.add('sold', HOLDER, { date: '2025-01-01' });
    expect(r.tryAdd('opinion-requested', HOLDER, { assessor: ASSESSOR })).toEqual({
      refused: 'bad-transition',
    });
    expect(verifyRoll(r.stored).ok).toBe(true);
  });
  it('every open request closes when the lot changes hands or reaches a final status', () => {
    const moved = asked().r;
    const offer = moved.add('transfer-offered', HOLDER, { recipient: OTHER }).header.seq;
    expect(moved.state!.openRequests).toHaveLength(1); // an open offer keeps the request
    moved.add('transfer-accepted', OTHER, { offerSeq: offer });
    expect(moved.state!.openRequests).toEqual([]);
    expect(moved.tryAdd('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request: 1 })).toEqual({
      refused: 'bad-transition',
    });
    for (const end of ['sold', 'retired', 'split'] as const) {
      const { r } = asked();
      if (end === 'sold') r.add('sold', HOLDER, { date: '2025-01-01' });
      if (end === 'retired') r.add('retired', HOLDER, {});
      if (end === 'split')
        r.add('split', HOLDER, { children: [{ lot: '000000000', count: { value: 60, estimated: false } }] });
      expect(r.state!.status).toBe(end);
      expect(r.state!.openRequests).toEqual([]);
      expect(verifyRoll(r.stored).ok).toBe(true);
    }
  });
  it('on a listed lot the request is optional, but when named it must be open and ask the author', () => {
    const r = new RollBuilder().register();
    r.add('opinion', THIRD, opinion('india', 1900, 1950));
    expect(r.tryAdd('opinion', THIRD, { ...opinion('india', 1900, 1950), request: 1 })).toEqual({
      refused: 'bad-transition',
    });
    const q = r.add('opinion-requested', HOLDER, { assessor: ASSESSOR }).header.seq;
    expect(r.tryAdd('opinion', THIRD, { ...opinion('india', 1900, 1950), request: q })).toEqual({
      refused: 'bad-actor',
    });
    r.add('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request: q });
    expect(verifyRoll(r.stored).ok).toBe(true);
  });
  it('requestFor picks the request naming the author first, then one open to any; none for the holder', () => {
    const { r, request } = asked(null);
    const named = r.add('opinion-requested', HOLDER, { assessor: ASSESSOR }).header.seq;
    expect(requestFor(r.state!, ASSESSOR)).toBe(named);
    expect(requestFor(r.state!, THIRD)).toBe(request);
    expect(requestFor(r.state!, HOLDER)).toBeUndefined();
  });
  it('mayAppend lets the asked assessor, and no one else but the holder, add evidence and an opinion on the unlisted lot', () => {
    const { r } = asked();
    for (const kind of ['opinion', 'exhibit-added'] as const) {
      expect(mayAppend(r.state!, kind, ASSESSOR).allowed).toBe(true);
      expect(mayAppend(r.state!, kind, HOLDER).allowed).toBe(true);
      expect(mayAppend(r.state!, kind, THIRD)).toMatchObject({ allowed: false, why: 'actor' });
    }
  });
  it('a redacted request keeps its facts in the header, so its answer is still checked', () => {
    const { r, request } = asked();
    r.add('redacted', 'acct-reg', { target: request, reason: 'holder-request' });
    r.add('opinion', ASSESSOR, { ...opinion('india', 1900, 1950), request });
    const stored = r.stored.map((e, i) => (i === request ? { ...e, body: null } : e));
    const v = verifyRoll(stored);
    expect(v.ok).toBe(true);
    expect(v.ok && v.unchecked).toEqual([]);
  });
});

describe('opinion requests are version 3 only', () => {
  const { r } = asked();
  const q = r.built[1]!;
  it('a version-1 or version-2 header of a new kind is bad-header, even re-hashed', () => {
    for (const v of [1, 2]) {
      const h = parseCanonical(q.stored.header) as Record<string, unknown>;
      h.v = v;
      if (v === 1) delete h.facts;
      const text = canonicalise(h);
      const d = decodeHeader(text);
      expect(isHeaderProblem(d) && d.reason).toBe('bad-header');
      expect(verifyRoll([r.stored[0]!, { ...q.stored, header: text, hash: entryHash(text) }])).toMatchObject({
        ok: false,
        seq: 1,
        reason: 'bad-header',
      });
    }
  });
  it('a request in a version-1 or version-2 body is bad-body; in version-2 facts, bad-facts', () => {
    const body = { ...opinion('india', 1900, 1950), nonce: '0'.repeat(32), request: 1 };
    expect(bodyIssues('opinion', body, 3)).toEqual([]);
    expect(bodyIssues('opinion', body, 2)).toEqual([{ path: 'request', message: 'is not a known field' }]);
    expect(bodyIssues('opinion', body, 1)).toEqual([{ path: 'request', message: 'is not a known field' }]);
    expect(
      bodyIssues('exhibit-added', { nonce: '0'.repeat(32), exhibit: exhibit('d'), request: 1 }, 2),
    ).toEqual([{ path: 'request', message: 'is not a known field' }]);
    expect(factsIssues('opinion', { exhibits: [], request: 1 }, 2)).toHaveLength(1);
    expect(factsIssues('opinion', { exhibits: [], request: 1 }, 3)).toEqual([]);
    const v2 = new RollBuilder(undefined, undefined, 2).register(HOLDER);
    expect(() =>
      v2.add('opinion', THIRD, { ...opinion('india', 1900, 1950), request: 0 }, { unchecked: true }),
    ).toThrow(/body\.request/);
    expect(() => v2.add('opinion-requested', HOLDER, { assessor: ASSESSOR }, { unchecked: true })).toThrow(
      /format version 2/,
    );
  });
  it('has closed body shapes: an account id or null; a seq', () => {
    const n = '0'.repeat(32);
    expect(bodyIssues('opinion-requested', { nonce: n, assessor: null })).toEqual([]);
    expect(bodyIssues('opinion-requested', { nonce: n })).toContainEqual({
      path: 'assessor',
      message: 'is required',
    });
    expect(bodyIssues('opinion-requested', { nonce: n, assessor: 'a b' })).toHaveLength(1);
    expect(bodyIssues('opinion-request-closed', { nonce: n, request: -1 })).toHaveLength(1);
    expect(bodyIssues('opinion-request-closed', { nonce: n, request: 2, note: 'x' })).toHaveLength(1);
  });
  it('facts that differ from the body are bad-facts', () => {
    const h = parseCanonical(q.stored.header) as { facts: { assessor: string | null } };
    h.facts.assessor = THIRD;
    const text = canonicalise(h);
    expect(verifyRoll([r.stored[0]!, { ...q.stored, header: text, hash: entryHash(text) }])).toMatchObject({
      ok: false,
      reason: 'bad-facts',
    });
  });
});

describe('property: an outsider writes on an unlisted lot only by naming an open request that asks them', () => {
  it('holds for every entry of any generated version-3 roll, and writer and verifier agree', () => {
    fc.assert(
      fc.property(fc.array(fc.nat(1000), { maxLength: 50 }), (choices) => {
        const r = generatedRoll(choices, 'requests ' + choices.join('.'));
        const v = verifyRoll(r.stored);
        expect(v.ok).toBe(true);
        if (v.ok) expect(v.state).toEqual(r.state);
        let s: RollState | null = null;
        r.built.forEach((b: BuiltEntry) => {
          const k = b.header.kind;
          if (s && (k === 'opinion' || k === 'exhibit-added') && b.header.actor !== s.holder && !s.listed) {
            const q = (s.openRequests ?? []).find((x) => x.seq === b.header.facts!.request);
            expect(q).toBeDefined();
            expect(q!.assessor === null || q!.assessor === b.header.actor).toBe(true);
          }
          expect(
            checkTransition(s, {
              kind: k,
              actor: b.header.actor,
              body: b.body,
              facts: b.header.facts,
              version: 3,
              time: b.header.time,
            }).ok,
          ).toBe(true);
          s = reduceEntry(s, { header: b.header, hash: b.stored.hash, body: b.body });
        });
      }),
      { numRuns: 150 },
    );
  });
});
