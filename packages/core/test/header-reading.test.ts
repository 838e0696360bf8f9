import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { decodeHeader, decodeHeaderFully } from '../src/entry.js';
// Loading it installs the direct reading into decodeHeader, as the package's index does in Node.
import { readUsualHeader } from '../src/usual-header.js';

// decodeHeader reads the usual header straight from its text and leaves everything else to the
// full reading (parseCanonical, then the field checks). Both must give the same answer for every
// text: the same header with its members in the same order, or the same problem.

interface Case {
  header: string;
  /** The previous entry's hash and the body's digest, as the verifier passes them. */
  knownHash?: string;
  knownDigest?: string;
}

function casesOf(path: string): Case[] {
  const bundle = JSON.parse(readFileSync(new URL(path, import.meta.url), 'utf8')) as {
    rolls: Array<{ entries: Array<{ hash: string; header: string }> }>;
  };
  return bundle.rolls.flatMap((r) =>
    r.entries.map((e, i) => ({
      header: e.header,
      knownHash: i > 0 ? r.entries[i - 1]!.hash : undefined,
      knownDigest: (JSON.parse(e.header) as { body: string }).body,
    })),
  );
}

// Format version 3 (the format document's example) and version 1 (an older bundle): every kind
// of header member, with and without `facts`, `sealed` and `parents`.
const cases = [...casesOf('../../../docs/examples/bundle.json'), ...casesOf('./fixtures/bundle-v1.json')];

function expectSameAnswer(text: string, knownHash?: string, knownDigest?: string): void {
  for (const [hash, digest] of [
    [knownHash, knownDigest],
    [undefined, undefined],
  ]) {
    const quick = decodeHeader(text, hash, digest);
    const full = decodeHeaderFully(text, hash, digest);
    expect(quick).toEqual(full);
    expect(JSON.stringify(quick)).toBe(JSON.stringify(full));
  }
}

// Edits that make near-usual headers: escapes, control characters, white space, number forms,
// members added, repeated or out of order, characters outside the fields' alphabets.
const pieces = [
  '\\',
  '\\"',
  '"',
  ' ',
  '\u0000',
  '\u001f',
  '\\u0041',
  '\\n',
  '0',
  '00',
  '-',
  '.',
  '1.0',
  'e1',
  ',',
  ':',
  '{',
  '}',
  '[',
  ']',
  '{}',
  'null',
  '"a":1,',
  '"facts":{},',
  ',"facts":{"ref":1}',
  '"parents":[],',
  `"sealed":"${'a'.repeat(64)}",`,
  `,"sealed":"${'b'.repeat(64)}"`,
  '"seq":1,',
  '"v":2,',
  '\ud800',
  '\ud83d\ude00',
  'é',
  'X',
  'a',
];

describe('reading a header directly agrees with the full reading', () => {
  it('on every header of the example bundles', () => {
    expect(cases.length).toBeGreaterThan(20);
    for (const c of cases) {
      expectSameAnswer(c.header, c.knownHash, c.knownDigest);
      expect(decodeHeader(c.header, c.knownHash, c.knownDigest)).not.toHaveProperty('reason');
    }
  });

  it('reads directly every header with facts and without parents, and no other', () => {
    let direct = 0;
    for (const c of cases) {
      const h = JSON.parse(c.header) as Record<string, unknown>;
      const usual = 'facts' in h && !('parents' in h);
      const read = readUsualHeader(c.header, undefined, undefined);
      expect(read === null).toBe(!usual);
      if (read) expect(JSON.stringify(read)).toBe(JSON.stringify(h));
      if (read) direct++;
    }
    expect(direct).toBeGreaterThan(10);
  });

  it('on small edits of those headers', () => {
    const edit = fc.record({ at: fc.nat(), cut: fc.nat({ max: 3 }), piece: fc.constantFrom(...pieces) });
    fc.assert(
      fc.property(fc.constantFrom(...cases), fc.array(edit, { minLength: 1, maxLength: 2 }), (c, edits) => {
        let text = c.header;
        for (const { at, cut, piece } of edits) {
          const i = at % (text.length + 1);
          text = text.slice(0, i) + piece + text.slice(i + cut);
        }
        expectSameAnswer(text, c.knownHash, c.knownDigest);
      }),
      { numRuns: 4000 },
    );
  });

  it('on the value of each member replaced by odd ones', () => {
    const odd = [
      '"a\\"b"',
      '"a\\\\b"',
      '"a\u0001b"',
      '""',
      '"\\u0061"',
      '1',
      '-1',
      '01',
      '1.5',
      '1e2',
      'true',
      'null',
      '{}',
      '[]',
    ];
    for (const c of cases) {
      const members = [...c.header.matchAll(/"([a-z]+)":("[^"]*"|-?[0-9]+)/g)];
      for (const m of members)
        for (const value of odd) {
          const text = c.header.replace(m[0], `"${m[1]}":${value}`);
          expectSameAnswer(text, c.knownHash, c.knownDigest);
        }
    }
  });

  it('on texts that are not headers at all', () => {
    for (const text of ['', '{', '{}', '[]', 'null', '"x"', '{"actor":"a"}', '{"actor":"a","body":"b",']) {
      expectSameAnswer(text);
    }
    expect(decodeHeader(42)).toEqual(decodeHeaderFully(42));
  });
});
