import { createHash, randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hashFile } from './hashing';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'hashing-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function fileOf(name: string, bytes: Buffer): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

describe('hashFile', () => {
  it('gives the FIPS 180-2 example digest of "abc"', async () => {
    // FIPS 180-2, Appendix B.1: SHA-256("abc").
    expect(await hashFile(fileOf('abc', Buffer.from('abc')))).toEqual({
      sha256: 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad',
      size: 3,
    });
  });

  it('agrees with node:crypto over the whole file for sizes around its 256 KiB reads', async () => {
    for (const size of [0, 256 * 1024 - 1, 256 * 1024, 256 * 1024 + 1, 2.5 * 1024 * 1024 + 7]) {
      const bytes = randomBytes(size);
      // Reference: node:crypto's SHA-256 of the same bytes in one update.
      const expected = createHash('sha256').update(bytes).digest('hex');
      expect(await hashFile(fileOf(`r${size}`, bytes))).toEqual({ sha256: expected, size });
    }
  });
});
