import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CROCKFORD_ALPHABET,
  CROCKFORD_CHECK_EXTRA,
  LotCodeError,
  crockfordCheckSymbol,
  findEntriesByTagReference,
  formatLotCode,
  generateLotCode,
  parseLotCode,
  parseTagReference,
  seededRandom,
  tagReference,
} from '../src/index.js';
import vectors from './fixtures/crockford.json' with { type: 'json' };

// Source of every value here: Douglas Crockford, "Base 32", https://www.crockford.com/base32.html.
describe('Crockford Base32', () => {
  it(vectors.alphabet.desc, () => expect(CROCKFORD_ALPHABET).toBe(vectors.alphabet.expected));
  it(vectors.checkExtra.desc, () => expect(CROCKFORD_CHECK_EXTRA).toBe(vectors.checkExtra.expected));
  for (const c of vectors.checks) it(c.desc, () => expect(crockfordCheckSymbol(c.input)).toBe(c.expected));
  for (const a of vectors.aliases) {
    it(a.desc, () => {
      // Put the alias in the first data position of a valid code and compare with the plain form.
      const plain = `${a.expected}K2QM9XA`;
      const code = plain + crockfordCheckSymbol(plain);
      expect(parseLotCode(a.input + code.slice(1))).toBe(code);
    });
  }
});

describe('lot codes', () => {
  it('formats the sample code 7K2Q-M9XA-T and reads it back in every accepted spelling', () => {
    expect(formatLotCode('7K2QM9XAT')).toBe('7K2Q-M9XA-T');
    for (const s of ['7K2Q-M9XA-T', '7k2q-m9xa-t', '7k2qm9xat', '7K2Q-M9XA-T'.toLowerCase()])
      expect(parseLotCode(s)).toBe('7K2QM9XAT');
  });
  it('refuses a wrong check symbol, a wrong length and foreign symbols with typed errors', () => {
    expect(() => parseLotCode('7K2Q-M9XA-V')).toThrow(expect.objectContaining({ code: 'bad-check' }));
    expect(() => parseLotCode('7K2Q-M9XA')).toThrow(expect.objectContaining({ code: 'bad-length' }));
    expect(() => parseLotCode('7K2Q-M9XA-U')).toThrow(expect.objectContaining({ code: 'bad-symbol' }));
    expect(() => parseLotCode('7K2Q M9XA T')).toThrow(LotCodeError);
    expect(() => parseLotCode('7K2Q*M9XAT')).toThrow(LotCodeError);
  });
  it('generated codes are 0-9/A-Z only, parse back, and redraw instead of using * ~ $ = U', () => {
    fc.assert(
      fc.property(fc.string({ minLength: 1, maxLength: 20 }), (seed) => {
        const code = generateLotCode(seededRandom(seed));
        expect(code).toMatch(/^[0-9A-Z]{9}$/);
        expect(parseLotCode(code)).toBe(code);
      }),
      { numRuns: 300 },
    );
    // 5 bytes 0x00 0x00 0x00 0x00 0x20 spell data 00000010 (value 32, check "*"): must be redrawn.
    const draws = [new Uint8Array([0, 0, 0, 0, 0x20]), new Uint8Array([0, 0, 0, 0, 0])];
    expect(generateLotCode(() => draws.shift()!)).toBe('000000000');
  });
});

describe('tag reference', () => {
  it('is the first 50 bits of the entry hash in Crockford Base32', () => {
    // 0xff.. gives ten Z; 0x00.. gives ten 0; 0x08 = 00001000 -> first symbol 00001 = "1".
    expect(tagReference('f'.repeat(64))).toBe('ZZZZZZZZZZ');
    expect(tagReference('0'.repeat(64))).toBe('0000000000');
    expect(tagReference('08' + '0'.repeat(62))).toBe('1000000000');
    // bit 49 (the last bit kept) set: byte 6 = 0b01000000.
    expect(tagReference('000000000000' + '40' + '0'.repeat(50))).toBe('0000000001');
    expect(tagReference('000000000000' + '20' + '0'.repeat(50))).toBe('0000000000');
  });
  it('finds an entry by a typed prefix', () => {
    const entries = [{ hash: 'a'.repeat(64) }, { hash: 'b'.repeat(64) }];
    const ref = tagReference(entries[1]!.hash);
    expect(findEntriesByTagReference(entries, ref.toLowerCase())).toEqual([entries[1]]);
    expect(findEntriesByTagReference(entries, 'ZZZZZZZZZZ')).toEqual([]);
    expect(() => parseTagReference('ABC')).toThrow(LotCodeError);
  });
});
