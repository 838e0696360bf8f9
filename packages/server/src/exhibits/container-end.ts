import { open, type FileHandle } from 'node:fs/promises';

/**
 * Where a file's own container format says its data ends, so that bytes smuggled after the
 * end (a ZIP or a page appended to a photo: a "polyglot") or a cut-off file are caught before
 * anything is stored. Reads with positioned reads and small buffers, never the whole file.
 */
export type ContainerCheck =
  { ok: true } | { ok: false; problem: 'truncated' | 'trailing-data' | 'malformed'; detail: string };

/** Bytes that may follow the end of an image without counting as hidden data (padding). */
function isPadding(buf: Buffer): boolean {
  for (const b of buf) if (b !== 0x00 && b !== 0x20 && b !== 0x0a && b !== 0x0d && b !== 0x09) return false;
  return true;
}

/**
 * Positioned reads through one reused 64 KiB window. What `read` returns is valid only until
 * the next call: every caller here looks at it and moves on.
 */
class Reader {
  private readonly window = Buffer.allocUnsafe(64 * 1024);
  private buf = Buffer.alloc(0);
  private start = 0;
  constructor(
    private readonly fh: FileHandle,
    readonly size: number,
  ) {}

  /** Bytes [pos, pos + n), or fewer at the end of the file. */
  async read(pos: number, n: number): Promise<Buffer> {
    if (pos >= this.start && pos + n <= this.start + this.buf.length)
      return this.buf.subarray(pos - this.start, pos - this.start + n);
    const len = Math.min(Math.max(n, this.window.length), Math.max(0, this.size - pos));
    const out = len <= this.window.length ? this.window.subarray(0, len) : Buffer.allocUnsafe(len);
    const { bytesRead } = await this.fh.read(out, 0, out.length, pos);
    this.buf = out.subarray(0, bytesRead);
    this.start = pos;
    return this.buf.subarray(0, Math.min(n, bytesRead));
  }
}

async function trailing(r: Reader, end: number): Promise<ContainerCheck> {
  for (let pos = end; pos < r.size; pos += 64 * 1024) {
    const chunk = await r.read(pos, Math.min(64 * 1024, r.size - pos));
    if (!isPadding(chunk))
      return {
        ok: false,
        problem: 'trailing-data',
        detail: `holds ${r.size - end} bytes after the end of its data`,
      };
  }
  return { ok: true };
}

const truncated = (detail: string): ContainerCheck => ({ ok: false, problem: 'truncated', detail });

// JPEG (ITU-T T.81, Annex B): markers FFxx; segments carry a 2-byte length; after SOS the
// entropy-coded data runs until the next marker that is not FF00 stuffing or RSTn.
async function jpegEnd(r: Reader): Promise<number | ContainerCheck> {
  let pos = 2;
  for (;;) {
    const m = await r.read(pos, 4);
    if (m.length < 2) return truncated('ends before its end-of-image marker');
    if (m[0] !== 0xff) return { ok: false, problem: 'malformed', detail: 'has a broken marker structure' };
    const marker = m[1];
    if (marker === 0xff) {
      pos += 1; // fill byte
      continue;
    }
    if (marker === 0xd9) return pos + 2;
    if ((marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      pos += 2;
      continue;
    }
    if (m.length < 4) return truncated('ends inside a segment header');
    const len = m.readUInt16BE(2);
    pos += 2 + len;
    if (pos > r.size) return truncated('ends inside a segment');
    if (marker === 0xda) {
      const end = await scanEnd(r, pos);
      if (typeof end !== 'number') return end;
      pos = end;
    }
  }
}

/**
 * From `pos` inside entropy-coded data, where the next real marker starts: an FF byte followed
 * by anything but 00 (stuffing), D0–D7 (RSTn) or another FF (fill). A noisy photo has an FF
 * every few hundred bytes, so each 64 KiB chunk is scanned in memory from one FF to the next.
 */
async function scanEnd(r: Reader, pos: number): Promise<number | ContainerCheck> {
  for (;;) {
    if (pos >= r.size) return truncated('ends inside the image data');
    const chunk = await r.read(pos, Math.min(64 * 1024, r.size - pos));
    let i = chunk.indexOf(0xff);
    while (i >= 0 && i + 1 < chunk.length) {
      const next = chunk[i + 1];
      if (next === 0xff) i += 1;
      else if (next === 0x00 || (next >= 0xd0 && next <= 0xd7)) i += 2;
      else return pos + i;
      i = chunk.indexOf(0xff, i);
    }
    // No FF left in the chunk, or one in its last byte: read on from there (a chunk that
    // starts with that FF holds the byte after it too, as the file goes on).
    if (i < 0) pos += chunk.length;
    else if (pos + i + 1 >= r.size) return truncated('ends inside the image data');
    else pos += i;
  }
}

// PNG (ISO/IEC 15948 §5): 8-byte signature, then chunks of length, type, data, CRC until IEND.
async function pngEnd(r: Reader): Promise<number | ContainerCheck> {
  let pos = 8;
  for (;;) {
    const h = await r.read(pos, 8);
    if (h.length < 8) return truncated('ends before its IEND chunk');
    const len = h.readUInt32BE(0);
    const type = h.toString('latin1', 4, 8);
    pos += 12 + len;
    if (pos > r.size) return truncated(`ends inside its ${type} chunk`);
    if (type === 'IEND') return pos;
  }
}

// WebP (RIFF container, RFC 9649 §2): "RIFF", little-endian size of what follows, "WEBP".
async function webpEnd(r: Reader): Promise<number | ContainerCheck> {
  const h = await r.read(0, 12);
  const end = 8 + h.readUInt32LE(4);
  if (end > r.size) return truncated('is shorter than its RIFF header says');
  return end + (end % 2);
}

// AVIF (ISO BMFF, ISO/IEC 14496-12 §4.2): top-level boxes of 32-bit size (1 = 64-bit, 0 = to end).
async function bmffEnd(r: Reader): Promise<number | ContainerCheck> {
  let pos = 0;
  while (pos < r.size) {
    const h = await r.read(pos, 16);
    if (h.length < 8)
      return { ok: false, problem: 'trailing-data', detail: 'holds bytes after its last box' };
    let size = h.readUInt32BE(0);
    if (size === 1) {
      if (h.length < 16) return truncated('ends inside a box header');
      size = Number(h.readBigUInt64BE(8));
    } else if (size === 0) return r.size;
    if (size < 8) return { ok: false, problem: 'malformed', detail: 'has a box with an impossible size' };
    if (pos + size > r.size) return truncated('ends inside a box');
    pos += size;
  }
  return pos;
}

// PDF (ISO 32000-1 §7.5.5): the file ends with the %%EOF marker (then at most an end of line).
async function pdfEnd(r: Reader): Promise<number | ContainerCheck> {
  const tailLen = Math.min(1024, r.size);
  const tail = await r.read(r.size - tailLen, tailLen);
  const at = tail.lastIndexOf('%%EOF');
  if (at < 0) return truncated('has no %%EOF end marker');
  return r.size - tailLen + at + 5;
}

const ENDS: Record<string, (r: Reader) => Promise<number | ContainerCheck>> = {
  'image/jpeg': jpegEnd,
  'image/png': pngEnd,
  'image/webp': webpEnd,
  'image/avif': bmffEnd,
  'application/pdf': pdfEnd,
};

/** Checks that the file at `path`, already known to be of `mediaType`, ends where its format says. */
export async function checkContainerEnd(path: string, mediaType: string): Promise<ContainerCheck> {
  const findEnd = ENDS[mediaType];
  if (!findEnd) return { ok: false, problem: 'malformed', detail: `has an unexpected type ${mediaType}` };
  const fh = await open(path, 'r');
  try {
    const r = new Reader(fh, (await fh.stat()).size);
    const end = await findEnd(r);
    if (typeof end !== 'number') return end;
    return trailing(r, end);
  } finally {
    await fh.close();
  }
}
