import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import {
  REASON_CODES,
  bodyDigest,
  buildEntry,
  canonicalise,
  entryHash,
  parseBundleText,
  parseCanonical,
  verifyBundle,
  type Bundle,
  type BundleEntry,
  type ReasonCode,
} from '../src/index.js';

// A mutation corpus over the example bundle of the format document (format version 3): each
// case changes one thing, re-signing what a forger would re-sign (the entry hash after a header
// change), and names the reason a verifier must give. Together they produce every reason code.
const example = (): Bundle =>
  parseBundleText(readFileSync(new URL('../../../docs/examples/bundle.json', import.meta.url), 'utf8'));
const resign = (e: BundleEntry, change: (h: Record<string, unknown>) => void): void => {
  const h = parseCanonical(e.header) as Record<string, unknown>;
  change(h);
  e.header = canonicalise(h);
  e.hash = entryHash(e.header);
};
const last = (b: Bundle, roll = 0): BundleEntry => b.rolls[roll]!.entries.at(-1)!;
const append = (b: Bundle, roll: number, draft: Omit<Parameters<typeof buildEntry>[1], 'time'>): void => {
  const prev = last(b, roll);
  const h = parseCanonical(prev.header) as { lot: string; seq: number; time: string };
  const e = buildEntry(
    { lot: h.lot, seq: h.seq, hash: prev.hash, time: h.time },
    { ...draft, time: '2026-01-01T00:00:00.000Z' },
  );
  b.rolls[roll]!.entries.push({ ...e.stored, logIndex: null });
};
const holder = (b: Bundle): string => verifyBundle(b).rolls[0]!.state!.holder;
// The example's second roll: its holder asks an assessor, whose evidence and dissent name the request.
const requestSeq = (b: Bundle): number =>
  b.rolls[1]!.entries.findIndex((e) => e.header.includes('"kind":"opinion-requested"'));
const unlist = (b: Bundle): void => {
  const s = verifyBundle(b).rolls[1]!.state!;
  append(b, 1, {
    kind: 'described',
    actor: s.holder,
    body: { description: { ...s.description!, listed: false } },
  });
};
const anOpinion = () => ({
  origin: 'india' as const,
  period: { from: 1900, to: 1950, approximate: false },
  technique: 'drawn' as const,
  qualifier: 'attributed-to' as const,
  confidence: 'low' as const,
  rationale: '',
  exhibits: [],
});

const corpus: Array<{ desc: string; want: ReasonCode; mutate: (b: Bundle) => void }> = [
  {
    desc: 'a space in a header',
    want: 'non-canonical',
    mutate: (b) => (last(b).header = ' ' + last(b).header),
  },
  {
    desc: 'a version no document defines',
    want: 'unknown-version',
    mutate: (b) => resign(last(b), (h) => (h.v = 9)),
  },
  { desc: 'an unknown header key', want: 'bad-header', mutate: (b) => resign(last(b), (h) => (h.extra = 1)) },
  {
    desc: 'a version-1 header inside a version-2 roll',
    want: 'bad-header',
    mutate: (b) =>
      resign(last(b), (h) => {
        h.v = 1;
        delete h.facts;
      }),
  },
  { desc: 'an entry dropped', want: 'bad-seq', mutate: (b) => b.rolls[0]!.entries.splice(1, 1) },
  {
    desc: 'a time before the previous entry',
    want: 'bad-time',
    mutate: (b) => resign(last(b), (h) => (h.time = '2000-01-01T00:00:00.000Z')),
  },
  { desc: 'a malformed actor', want: 'bad-actor', mutate: (b) => resign(last(b), (h) => (h.actor = 'a b')) },
  {
    desc: 'a reserved actor writing a note',
    want: 'bad-actor',
    mutate: (b) => append(b, 0, { kind: 'note', actor: 'beadroll:system', body: { text: 'x' } }),
  },
  {
    desc: 'an outsider accepting nothing',
    want: 'bad-transition',
    mutate: (b) => append(b, 0, { kind: 'transfer-accepted', actor: 'acct-zz', body: { offerSeq: 1 } }),
  },
  {
    desc: 'an offer to a reserved id',
    want: 'bad-transition',
    mutate: (b) =>
      append(b, 0, { kind: 'transfer-offered', actor: holder(b), body: { recipient: 'beadroll:x' } }),
  },
  {
    desc: 'a version-2 header of a version-3 kind (opinion-requested)',
    want: 'bad-header',
    mutate: (b) => {
      // Re-sign the whole roll in version 2 up to the request, so only the kind is wrong.
      const entries = b.rolls[1]!.entries;
      const at = requestSeq(b);
      let prev = '0'.repeat(64);
      entries.splice(at + 1);
      for (const e of entries) {
        resign(e, (h) => {
          h.v = 2;
          h.prev = prev;
        });
        prev = e.hash;
      }
    },
  },
  {
    desc: 'a request in a version-2 opinion body',
    want: 'bad-body',
    mutate: (b) => {
      const entries = b.rolls[0]!.entries;
      let prev = '0'.repeat(64);
      for (const e of entries) {
        resign(e, (h) => {
          h.v = 2;
          h.prev = prev;
          const body = parseCanonical(e.body!) as Record<string, unknown>;
          if (h.kind === 'opinion') {
            e.body = canonicalise({ ...body, request: 0 });
            h.body = bodyDigest(e.body);
          }
        });
        prev = e.hash;
      }
    },
  },
  {
    desc: 'an outsider’s opinion on an unlisted lot naming no request',
    want: 'bad-actor',
    mutate: (b) => {
      unlist(b);
      append(b, 1, { kind: 'opinion', actor: 'acct-zz', body: anOpinion() });
    },
  },
  {
    desc: 'an opinion naming the request an earlier opinion answered',
    want: 'bad-transition',
    mutate: (b) =>
      append(b, 1, {
        kind: 'opinion',
        actor: 'acct-a51d09',
        body: { ...anOpinion(), request: requestSeq(b) },
      }),
  },
  {
    desc: 'an outsider’s evidence on an unlisted lot naming a request that asks another assessor',
    want: 'bad-actor',
    mutate: (b) => {
      unlist(b);
      append(b, 1, { kind: 'opinion-requested', actor: 'acct-7b20e4', body: { assessor: 'acct-a51d09' } });
      const seq = b.rolls[1]!.entries.length - 1;
      append(b, 1, {
        kind: 'exhibit-added',
        actor: 'acct-zz',
        body: {
          exhibit: {
            kind: 'other',
            original: { sha256: 'ab'.repeat(32), size: 1, mediaType: 'image/png' },
            derivatives: [],
          },
          request: seq,
        },
      });
    },
  },
  {
    desc: 'the holder closing a request that is not open',
    want: 'bad-transition',
    mutate: (b) =>
      append(b, 1, {
        kind: 'opinion-request-closed',
        actor: 'acct-7b20e4',
        body: { request: requestSeq(b) },
      }),
  },
  {
    desc: 'request facts that name another assessor than the body',
    want: 'bad-facts',
    mutate: (b) =>
      resign(
        b.rolls[1]!.entries[requestSeq(b)]!,
        (h) => ((h.facts as { assessor: string }).assessor = 'acct-zz'),
      ),
  },
  {
    desc: 'a link to another previous entry',
    want: 'bad-prev',
    mutate: (b) => resign(last(b), (h) => (h.prev = 'ab'.repeat(32))),
  },
  {
    desc: 'a changed body',
    want: 'bad-body-digest',
    mutate: (b) =>
      (b.rolls[1]!.entries[1]!.body = b.rolls[1]!.entries[1]!.body!.replace('"nonce":"', '"nonce":"0')),
  },
  {
    desc: 'a child naming a parent entry with another hash',
    want: 'bad-parent',
    mutate: (b) =>
      resign(
        b.rolls[3]!.entries[0]!,
        (h) => ((h.parents as Array<{ hash: string }>)[0]!.hash = 'cd'.repeat(32)),
      ),
  },
  { desc: 'a changed entry hash', want: 'bad-hash', mutate: (b) => (last(b).hash = 'ef'.repeat(32)) },
  {
    desc: 'a body removed with no redaction',
    want: 'missing-body',
    mutate: (b) => (b.rolls[1]!.entries[1]!.body = null),
  },
  {
    desc: 'a body with an unknown field, digest and hash re-signed',
    want: 'bad-body',
    mutate: (b) => {
      const e = last(b);
      const body = { ...(parseCanonical(e.body!) as object), extra: 1 };
      e.body = canonicalise(body);
      resign(e, (h) => (h.body = bodyDigest(e.body!)));
    },
  },
  {
    desc: 'facts that differ from the body',
    want: 'bad-facts',
    mutate: (b) => resign(b.rolls[0]!.entries[0]!, (h) => ((h.facts as { listed: boolean }).listed = false)),
  },
  {
    desc: 'a roll with a bad scope',
    want: 'bad-roll',
    mutate: (b) => ((b.rolls[0] as { scope: string }).scope = 'all'),
  },
  {
    desc: 'an entry with a stray member',
    want: 'bad-entry',
    mutate: (b) => ((last(b) as unknown as Record<string, unknown>).note = 1),
  },
  {
    desc: 'a lot code with a bad check symbol',
    want: 'bad-lot-code',
    mutate: (b) => (b.rolls[0]!.lot = b.rolls[0]!.lot.slice(0, 8) + (b.rolls[0]!.lot[8] === '0' ? '1' : '0')),
  },
  {
    desc: 'the same lot twice',
    want: 'duplicate-lot',
    mutate: (b) => b.rolls.push(JSON.parse(JSON.stringify(b.rolls[0]))),
  },
  { desc: 'a negative log index', want: 'bad-log-index', mutate: (b) => (last(b).logIndex = -1) },
  {
    desc: 'a link roll with an entry no child names',
    want: 'unnamed-link',
    mutate: (b) => {
      const parent = b.rolls[2]!;
      const linkIdx = parent.entries.findIndex((e) => e.header.includes('"kind":"split"'));
      // Keep the children out, so the split is named by nobody in the bundle.
      b.rolls = [b.rolls[0]!, { lot: parent.lot, scope: 'link', entries: [parent.entries[linkIdx]!] }];
    },
  },
];

describe('mutation corpus over the example bundle', () => {
  it('the unmutated example verifies', () => expect(verifyBundle(example()).ok).toBe(true));
  for (const c of corpus) {
    it(`${c.desc} → ${c.want}`, () => {
      const b = example();
      c.mutate(b);
      const r = verifyBundle(b);
      expect(r.ok).toBe(false);
      expect(r.failures.map((f) => f.reason)).toContain(c.want);
    });
  }
  it('covers every reason code core reports', () => {
    expect(new Set(corpus.map((c) => c.want))).toEqual(new Set(REASON_CODES));
  });
});
