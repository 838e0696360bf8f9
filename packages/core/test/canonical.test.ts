import { describe, expect, it } from 'vitest';
import { bytesToHex, hexToBytes, utf8ToBytes } from '@noble/hashes/utils.js';
import { CanonicalError, canonicalise, canonicaliseJcs, parseCanonical } from '../src/index.js';
import vectors from './fixtures/jcs.json' with { type: 'json' };

interface JcsCase {
  desc: string;
  source: string;
  input?: string;
  ieee754Hex?: string;
  expected?: string;
  expectedUtf8Hex?: string;
  expectError?: boolean;
}

function doubleFromHex(hex: string): number {
  return new DataView(hexToBytes(hex.padStart(16, '0')).buffer).getFloat64(0, false);
}

// Each case names its original source: RFC 8785 sections 3.2.2–3.2.4 and Appendix B, and the
// reference test data of the RFC's authors (cyberphone/json-canonicalization).
describe('RFC 8785 canonical JSON', () => {
  for (const c of vectors.cases as JcsCase[]) {
    it(c.desc, () => {
      if (c.expectError) {
        expect(() => canonicaliseJcs(doubleFromHex(c.ieee754Hex!))).toThrow(CanonicalError);
        expect(() => canonicalise(doubleFromHex(c.ieee754Hex!))).toThrow(CanonicalError);
        return;
      }
      expect(canonicaliseJcs(JSON.parse(c.input!))).toBe(c.expected);
      if (c.ieee754Hex) expect(canonicaliseJcs(doubleFromHex(c.ieee754Hex))).toBe(c.expected);
      if (c.expectedUtf8Hex)
        expect(bytesToHex(utf8ToBytes(canonicaliseJcs(JSON.parse(c.input!))))).toBe(c.expectedUtf8Hex);
    });
  }
});

describe('ledger canonical form', () => {
  it('rejects integers beyond ±(2^53 − 1), which RFC 8785 alone allows', () => {
    expect(canonicaliseJcs(1e30)).toBe('1e+30'); // RFC 8785 Appendix B
    expect(() => canonicalise(1e30)).toThrow(expect.objectContaining({ code: 'unsafe-number' }));
    expect(() => canonicalise({ a: [2 ** 53] })).toThrow(expect.objectContaining({ code: 'unsafe-number' }));
    expect(canonicalise(2 ** 53 - 1)).toBe('9007199254740991');
    expect(canonicalise(2.5)).toBe('2.5');
  });
  it('rejects NaN, Infinity, undefined, functions, bigint and non-plain objects', () => {
    for (const v of [NaN, -Infinity, undefined, () => 1, 10n, new Date(0), new Map(), { a: undefined }]) {
      expect(() => canonicalise(v)).toThrow(CanonicalError);
    }
  });
  it('rejects lone surrogates (RFC 8785 §3.2.2.2 requires valid Unicode)', () => {
    expect(() => canonicalise('\ud800')).toThrow(CanonicalError);
    expect(() => canonicalise({ ['\udc00']: 1 })).toThrow(CanonicalError);
    expect(canonicalise('\ud83d\ude00')).toBe('"😀"');
  });
  it('parseCanonical accepts the canonical text and refuses every other spelling', () => {
    const good = '{"a":[1,2.5,"x"],"b":null}';
    expect(parseCanonical(good)).toEqual({ a: [1, 2.5, 'x'], b: null });
    const mutations = [
      '{"b":null,"a":[1,2.5,"x"]}', // key order
      '{"a": [1,2.5,"x"],"b":null}', // whitespace
      '{"a":[1.0,2.5,"x"],"b":null}', // number spelling
      '{"a":[1,2.5,"\\u0078"],"b":null}', // escape
      '{"a":[1,2.5,"x"],"b":null,"b":null}', // duplicate key
      good + '\n',
    ];
    for (const m of mutations)
      expect(() => parseCanonical(m)).toThrow(expect.objectContaining({ code: 'non-canonical' }));
    expect(() => parseCanonical('{"a":')).toThrow(expect.objectContaining({ code: 'not-json' }));
    expect(() => parseCanonical('[9007199254740993]')).toThrow(
      expect.objectContaining({ code: 'unsafe-number' }),
    );
  });
  it('handles deep nesting without a stack overflow', () => {
    const deep = '['.repeat(5000) + ']'.repeat(5000);
    expect(parseCanonical(deep)).toBeDefined();
  });
});

describe('canonical check agrees with the RFC 8785 serialiser on random values', () => {
  it('accepts exactly the serialiser output, and refuses any other spelling', async () => {
    const fc = (await import('fast-check')).default;
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 4 }), (v) => {
        let text: string;
        try {
          text = canonicalise(v);
        } catch {
          return; // e.g. an unsafe integer
        }
        expect(canonicalise(parseCanonical(text))).toBe(text);
        const pretty = JSON.stringify(JSON.parse(text), null, 1);
        if (pretty !== text) expect(() => parseCanonical(pretty)).toThrow(CanonicalError);
      }),
      { numRuns: 500 },
    );
    // Integer-like keys: JavaScript enumerates "9" before "10"; RFC 8785 sorts "10" first.
    expect(parseCanonical('{"10":1,"9":2}')).toEqual({ 9: 2, 10: 1 });
    expect(() => parseCanonical('{"9":2,"10":1}')).toThrow(CanonicalError);
  });
});

describe('reading a text as already canonical agrees with writing its parse out again', () => {
  // The reference is the ledger serialiser (checked against the RFC 8785 vectors above): a
  // text is canonical exactly when canonicalise(JSON.parse(text)) gives the text back.
  const reference = (text: string): boolean => {
    try {
      return canonicalise(JSON.parse(text)) === text;
    } catch {
      return false;
    }
  };
  const accepted = (text: string): boolean => {
    try {
      parseCanonical(text);
      return true;
    } catch (e) {
      if (e instanceof CanonicalError) return false;
      throw e;
    }
  };
  // Small edits that make many near-canonical spellings: white space, escapes, number forms,
  // repeated or reordered keys.
  const pieces = [
    ' ',
    '\\',
    '"',
    'u',
    '0',
    '00',
    '1',
    'e',
    'E',
    '.',
    '-',
    '+',
    ',',
    ':',
    '{',
    '}',
    '[',
    ']',
    '\\u0000',
    '\\u001f',
    '\\u001F',
    '\\u0020',
    '\\u0041',
    '\\n',
    '\\/',
    '\\t',
    '\\b',
    '\\ud800',
    '\ud83d\ude00',
    '\u2028',
    '\x7f',
    'é',
    '"a":1,',
    '"a":1',
    '"b":2,',
    ',"a":1',
    '9007199254740993',
    '1.5',
    '-0',
    '123456789012345',
    '1234567890123456',
    '1e2',
  ];

  it('on random values and small edits of their canonical text', async () => {
    const fc = (await import('fast-check')).default;
    const edit = fc.record({
      at: fc.nat(),
      cut: fc.nat({ max: 2 }),
      piece: fc.constantFrom(...pieces),
    });
    fc.assert(
      fc.property(
        fc.jsonValue({ maxDepth: 3, stringUnit: 'binary' }),
        fc.array(edit, { maxLength: 2 }),
        (value, edits) => {
          let text: string;
          try {
            text = canonicalise(value);
          } catch {
            return; // e.g. an unsafe integer or a lone surrogate
          }
          expect(accepted(text)).toBe(true);
          expectSameParse(text);
          let changed = text;
          for (const { at, cut, piece } of edits) {
            const i = at % (changed.length + 1);
            changed = changed.slice(0, i) + piece + changed.slice(i + cut);
          }
          expect(accepted(changed)).toBe(reference(changed));
          if (accepted(changed)) expectSameParse(changed);
          const unsorted = JSON.stringify(value);
          if (unsorted !== undefined) expect(accepted(unsorted)).toBe(reference(unsorted));
        },
      ),
      { numRuns: 3000 },
    );
  });

  it('on texts written to probe each rule of the quick reading', () => {
    const texts = [
      '{"a":"\\u001f","b":"\\n"}', // a control character as \u00xx, a short escape
      '{"a":"\\u000a"}', // a line feed has a short escape
      '{"a":"\\u001F"}', // upper-case hex digits
      '{"a\\n":1,"a":2}', // a key with an escape, out of order once decoded
      '{"a":1,"a\\u0000":2}',
      '{"":1,"a":{}}',
      '{"":1,"":2}', // a repeated empty key
      '{"ab":1,"a":2}', // a shorter key after a longer one
      '{"a":[],"b":[{}],"c":[[],{"d":[1,-2,0]}]}',
      '[-0]',
      '[0.5]',
      '[100000000000000]', // 15 digits
      '[1000000000000000]', // 16 digits
      '[9007199254740991]',
      '[9007199254740992]',
      '"\\ud83d\\ude00"', // an escaped surrogate pair: canonical text writes the character
      '"\ud83d\ude00"',
      '"\\/"',
      '[true,false,null]',
      '{"10":1,"9":2}',
      '{"9":2,"10":1}',
    ];
    for (const t of texts) expect([t, accepted(t)]).toEqual([t, reference(t)]);
  });
});

/**
 * The value parseCanonical returns is JSON.parse's for the same text: equal members in the same
 * order (JSON.stringify writes them in that order), plain objects, -0 kept apart from 0.
 */
function expectSameParse(text: string): void {
  const ours = parseCanonical(text);
  const theirs: unknown = JSON.parse(text);
  expect(ours).toEqual(theirs);
  expect(JSON.stringify(ours)).toBe(JSON.stringify(theirs));
  const protos = (v: unknown): unknown[] =>
    v !== null && typeof v === 'object'
      ? [Object.getPrototypeOf(v), ...Object.values(v).flatMap(protos)]
      : [];
  expect(protos(ours)).toEqual(protos(theirs));
}

describe('the one-pass reading builds what JSON.parse builds', () => {
  it('on texts that take each of its paths', () => {
    const texts = [
      '{"a":"line\\nbreak","b":"say \\"hi\\"","c":"back\\\\slash","d":"\\u0001\\u001f\\b\\f\\r\\t"}',
      '{"":0,"a":-1,"b":123456789012345,"c":-123456789012345,"d":9007199254740991,"e":-9007199254740991}',
      '[0.5,-0.25,1.5e-7,123.456,-1e-7,5e-324,4503599627370495.5]',
      '{"__proto__":1}',
      '{"a":{"__proto__":{"b":2}}}',
      '{"10":1,"9":2,"a":3}',
      '{"constructor":1,"toString":2,"valueOf":[]}',
      '["\ud83d\ude00 é ü \u2028 \u007f"]',
      '{"é":2,"\ud83d\ude00":1}',
      '"plain"',
      '"\\u0000"',
      '0',
      '-7',
      'true',
      'null',
      '[]',
      '{}',
      '[[],{},[{}],{"a":[]}]',
      '['.repeat(150) + ']'.repeat(150),
      '{"a":'.repeat(150) + '1' + '}'.repeat(150),
    ];
    for (const t of texts) expectSameParse(t);
    expect(Object.keys(parseCanonical('{"__proto__":1}') as object)).toEqual(['__proto__']);
    // Integers beyond 2^53 − 1, however written, are refused on every path.
    for (const t of ['[1e+21]', '[9007199254740992]', '[-9007199254740992]'])
      expect(() => parseCanonical(t)).toThrow(CanonicalError);
  });

  it('on random values with strings of any code units', async () => {
    const fc = (await import('fast-check')).default;
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 5, stringUnit: 'binary' }), (v) => {
        let text: string;
        try {
          text = canonicalise(v);
        } catch {
          return; // e.g. an unsafe integer or a lone surrogate
        }
        expectSameParse(text);
      }),
      { numRuns: 2000 },
    );
  });
});
