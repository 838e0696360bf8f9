import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { hexToBytes } from '@noble/hashes/utils.js';
import vectors from './fixtures/sha256.json' with { type: 'json' };
import type { Sha256Case } from './helpers.js';

// In Node the hash module uses node:crypto; browsers have no such module and take the
// @noble/hashes path. Here the module is loaded as a browser loads it (no process.getBuiltinModule)
// and checked against the same known answers: FIPS 180-2 Appendix B examples and NIST CAVP
// SHA256ShortMsg.rsp, plus the ledger's domain-separated hashes against the host's own.
describe('SHA-256 without the host crypto library, as in a browser', () => {
  let script: typeof import('../src/hash.js');
  let host: typeof import('../src/hash.js');
  const saved = process.getBuiltinModule;

  beforeAll(async () => {
    host = await import('../src/hash.js');
    vi.resetModules();
    (process as { getBuiltinModule?: unknown }).getBuiltinModule = undefined;
    script = await import('../src/hash.js');
    (process as { getBuiltinModule?: unknown }).getBuiltinModule = saved;
  });
  afterAll(() => {
    (process as { getBuiltinModule?: unknown }).getBuiltinModule = saved;
  });

  it('is a separate load of the module', () => {
    expect(script).not.toBe(host);
  });

  for (const c of vectors.cases as Sha256Case[]) {
    it(c.desc, () => {
      if (c.repeat) expect(script.sha256HexOfText(c.repeat.char.repeat(c.repeat.count))).toBe(c.expected);
      if (c.utf8 !== undefined) expect(script.sha256HexOfText(c.utf8)).toBe(c.expected);
      if (c.hex !== undefined) expect(script.sha256HexOfBytes(hexToBytes(c.hex))).toBe(c.expected);
    });
  }

  it('gives the same entry hashes and body digests as the host library', () => {
    for (const text of ['{}', '{"a":"é ✓ 𝄞"}', 'x'.repeat(10_000), '']) {
      expect(script.entryHash(text)).toBe(host.entryHash(text));
      expect(script.bodyDigest(text)).toBe(host.bodyDigest(text));
      for (const d of ['entry', 'body', 'sealedField', 'sealedRoot'] as const)
        expect(script.domainHash(d, text)).toBe(host.domainHash(d, text));
    }
  });
});
