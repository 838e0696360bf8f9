import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { checkContainerEnd } from './container-end';

let dir: string;
let n = 0;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'container-end-'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function check(bytes: Buffer) {
  const path = join(dir, `f-${n++}`);
  writeFileSync(path, bytes);
  return checkContainerEnd(path, 'image/jpeg');
}

// A minimal JPEG skeleton around hand-made entropy-coded data (ITU-T T.81, Annex B): SOI, an SOS
// segment with a 2-byte length and no parameters, the data, then EOI. The checker only follows
// the marker structure, so the data need not decode.
function jpegAround(data: Buffer): Buffer {
  return Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xda, 0x00, 0x02]), data, Buffer.from([0xff, 0xd9])]);
}

// Entropy-coded data as an encoder writes it (T.81 §B.1.1.5): every FF is followed by a stuffed
// 00, a restart marker D0–D7, or is a run of FF fill bytes before one of those.
function entropy(length: number, seed: number, ffAt: number[] = []): Buffer {
  const out = Buffer.alloc(length);
  let x = seed;
  for (let i = 0; i < length; i++) {
    x = (Math.imul(x, 1103515245) + 12345) >>> 0;
    out[i] = x >>> 24 === 0xff ? 0x7f : x >>> 24;
  }
  for (const at of ffAt) {
    out[at] = 0xff;
    out[at + 1] = at % 3 === 0 ? 0x00 : at % 3 === 1 ? 0xd0 + (at % 8) : 0xff;
    if (out[at + 1] === 0xff) out[at + 2] = 0x00;
  }
  return out;
}

describe('checkContainerEnd: JPEG entropy-coded data (T.81 Annex B)', () => {
  it('accepts stuffed FF bytes and restart markers on either side of its 64 KiB read boundary', async () => {
    // The scan reads from the first data byte (offset 6) on, so data index 65535 is the last
    // byte of the first read: FF there, FF pairs around it, and dense runs further on.
    const ff = [100, 102, 104, 65_533, 65_535, 65_537, 131_070];
    for (let extra = 0; extra < 4; extra++) {
      const data = entropy(3 * 64 * 1024 + extra, 7 + extra, ff);
      expect(await check(jpegAround(data))).toEqual({ ok: true });
    }
  });

  it('finds the end marker when it starts on the last byte of a read', async () => {
    const data = entropy(64 * 1024 - 1, 11);
    expect(await check(jpegAround(data))).toEqual({ ok: true });
  });

  it('refuses bytes after the end marker and data cut off inside the scan', async () => {
    const good = jpegAround(entropy(200_000, 3, [65_529, 65_530, 131_000]));
    expect(await check(Buffer.concat([good, Buffer.from('PK\x03\x04 hidden')]))).toMatchObject({
      ok: false,
      problem: 'trailing-data',
    });
    for (const cut of [good.length - 2, good.length - 1, 65_536, 65_537, 7])
      expect(await check(good.subarray(0, cut))).toMatchObject({ ok: false, problem: 'truncated' });
  });

  it('accepts a large noisy photo as an encoder writes it, and not the same photo cut short', async () => {
    const photo = await sharp({
      create: {
        width: 1200,
        height: 800,
        channels: 3,
        background: { r: 128, g: 96, b: 64 },
        noise: { type: 'gaussian', mean: 110, sigma: 30 },
      },
    })
      .jpeg({ quality: 90 })
      .toBuffer();
    expect(photo.indexOf(Buffer.from([0xff, 0x00]))).toBeGreaterThan(0);
    expect(await check(photo)).toEqual({ ok: true });
    expect(await check(photo.subarray(0, photo.length - 100))).toMatchObject({
      ok: false,
      problem: 'truncated',
    });
  });
});
