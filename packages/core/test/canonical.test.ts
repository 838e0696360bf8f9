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
