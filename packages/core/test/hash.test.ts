import { describe, expect, it } from 'vitest';
import { hexToBytes } from '@noble/hashes/utils.js';
import { sha256HexOfBytes, sha256HexOfText } from '../src/index.js';
import vectors from './fixtures/sha256.json' with { type: 'json' };
import type { Sha256Case } from './helpers.js';

// Each case names its source: FIPS 180-2 Appendix B examples and NIST CAVP SHA256ShortMsg.rsp.
describe('SHA-256 against FIPS 180 / NIST CAVP known answers', () => {
  for (const c of vectors.cases as Sha256Case[]) {
    it(c.desc, () => {
      if (c.repeat) expect(sha256HexOfText(c.repeat.char.repeat(c.repeat.count))).toBe(c.expected);
      if (c.utf8 !== undefined) expect(sha256HexOfText(c.utf8)).toBe(c.expected);
      if (c.hex !== undefined) expect(sha256HexOfBytes(hexToBytes(c.hex))).toBe(c.expected);
    });
  }
});
