import { randomBytes } from 'node:crypto';
import { mkdir, open, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { Inject, Injectable } from '@nestjs/common';
import { fileTypeFromFile } from 'file-type';
import pLimit from 'p-limit';
import sharp from 'sharp';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { checkContainerEnd } from './container-end';

/** The media types Beadroll keeps as exhibits. */
export const EXHIBIT_MEDIA_TYPES = [
  'image/jpeg',
  'image/png',
  'image/webp',
  'image/avif',
  'application/pdf',
] as const;
export type ExhibitMediaType = (typeof EXHIBIT_MEDIA_TYPES)[number];

/** One file the pipeline produced, ready to store; hashes are taken when it is stored. */
export interface ProcessedFile {
  path: string;
  mediaType: string;
  width?: number;
  height?: number;
  /** Set on derivatives: what a page uses it for. */
  role?: 'web' | 'thumbnail';
}

export interface ProcessedExhibit {
  original: ProcessedFile;
  derivatives: ProcessedFile[];
  /** Things the uploader should know about how the file was kept. */
  notes: string[];
  /** Removes every file the pipeline wrote. */
  cleanup(): Promise<void>;
}

/**
 * Long side in pixels of each derivative, largest first; derivatives are JPEG, which every
 * browser shows. Optimised Huffman tables make a file a few per cent smaller but hold every
 * coefficient of the picture in memory while it is written: worth it for the thumbnails a list
 * shows by the dozen, not for the web copy (about 20 MB more per upload being processed).
 */
const DERIVATIVES = [
  { role: 'web', size: 1600, quality: 82, optimiseCoding: false },
  { role: 'thumbnail', size: 400, quality: 72, optimiseCoding: true },
] as const;

const HEIC_TYPES = new Set(['image/heic', 'image/heif', 'image/heic-sequence', 'image/heif-sequence']);

export const PDF_AS_SENT_NOTE =
  'This PDF is stored exactly as sent: its document information and XMP metadata (author, software, dates) were not removed. Remove them before uploading if they are private.';

function bad(reason: string): AppError {
  return AppError.validation([{ field: 'file', reason }]);
}

/** Sniffs a text file's start to say what it is when the type has no magic number. */
async function describeUnknown(path: string): Promise<string> {
  const fh = await open(path, 'r');
  try {
    const buf = Buffer.alloc(512);
    const { bytesRead } = await fh.read(buf, 0, 512, 0);
    const head = buf
      .toString('utf8', 0, bytesRead)
      .replace(/^\uFEFF/, '')
      .trimStart()
      .toLowerCase();
    if (head.includes('<svg'))
      return 'is an SVG drawing, which is not accepted (it can carry scripts); send a JPEG, PNG, WebP or AVIF image';
    if (head.startsWith('<!doctype html') || head.startsWith('<html') || head.includes('<script'))
      return 'is an HTML page, not an image or a PDF (its name or extension does not decide its type)';
    return 'is not a JPEG, PNG, WebP or AVIF image or a PDF document';
  } finally {
    await fh.close();
  }
}

/**
 * Decides an uploaded file's type from its bytes, refuses anything but the accepted types,
 * and normalises images (orientation applied, every metadata block — EXIF with GPS, XMP, IPTC,
 * maker notes — dropped by re-encoding) with web and thumbnail derivatives. PDFs are kept as
 * sent, with a note. Throws AppError (400 `validation` on field `file`, 413 for size) and then
 * leaves nothing behind.
 */
@Injectable()
export class ExhibitProcessor {
  private readonly workRoot: string;
  /**
   * Image jobs (an original, or a file's chain of derivatives) running at once, each on one
   * libvips thread: as many as uploads may be processed together. A lone upload runs its two
   * jobs side by side; busy, the jobs queue in order, so memory stays that of this many jobs.
   */
  private readonly jobs: pLimit.Limit;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    // A small machine: one libvips worker thread per image, and no operation cache (each upload
    // is decoded once and never again, so a cache only holds memory).
    sharp.concurrency(1);
    sharp.cache(false);
    this.workRoot = join(config.dataDir, 'tmp', 'exhibit-work');
    this.jobs = pLimit(config.exhibits.processingConcurrency);
  }

  async process(inputPath: string): Promise<ProcessedExhibit> {
    const { size } = await stat(inputPath);
    const limit = this.config.exhibits.maxFileBytes;
    if (size === 0) throw bad('is empty (0 bytes)');
    if (size > limit)
      throw new AppError('payload_too_large', `The file is larger than ${limit} bytes.`, [
        { field: 'file', reason: `is ${size} bytes; the most accepted is ${limit} bytes` },
      ]);

    const type = await fileTypeFromFile(inputPath);
    if (!type) throw bad(await describeUnknown(inputPath));
    if (HEIC_TYPES.has(type.mime))
      throw bad(
        'is a HEIC photo, which is not supported yet: send a JPEG instead (most phones can share or export a photo as JPEG)',
      );
    if (!(EXHIBIT_MEDIA_TYPES as readonly string[]).includes(type.mime))
      throw bad(`is ${type.mime} (.${type.ext}), not a JPEG, PNG, WebP or AVIF image or a PDF document`);
    const mediaType = type.mime as ExhibitMediaType;

    const container = await checkContainerEnd(inputPath, mediaType);
    if (!container.ok) throw bad(`${container.detail}; it cannot be accepted as a ${type.ext.toUpperCase()}`);

    const work = join(this.workRoot, randomBytes(16).toString('hex'));
    await mkdir(work, { recursive: true, mode: 0o700 });
    const cleanup = () => rm(work, { recursive: true, force: true });
    try {
      if (mediaType === 'application/pdf')
        return {
          original: { path: inputPath, mediaType },
          derivatives: [],
          notes: [PDF_AS_SENT_NOTE],
          cleanup,
        };
      return { ...(await this.processImage(inputPath, mediaType, work)), notes: [], cleanup };
    } catch (err) {
      await cleanup();
      throw err;
    }
  }

  private async processImage(
    inputPath: string,
    mediaType: Exclude<ExhibitMediaType, 'application/pdf'>,
    work: string,
  ): Promise<{ original: ProcessedFile; derivatives: ProcessedFile[] }> {
    const maxPixels = this.config.exhibits.maxPixels;
    let meta: sharp.Metadata;
    try {
      // Reads the header only, so a huge canvas is refused before it is decoded.
      meta = await sharp(inputPath, { limitInputPixels: false }).metadata();
    } catch {
      throw bad('could not be read as an image: it is damaged or not what its header says');
    }
    const width = meta.width ?? 0;
    const height = meta.pageHeight ?? meta.height ?? 0;
    if (width * height > maxPixels)
      throw bad(
        `is ${width} × ${height} pixels (${((width * height) / 1e6).toFixed(1)} megapixels); the most accepted is ${(maxPixels / 1e6).toFixed(1)} megapixels`,
      );

    // One pipeline per file: the original and each derivative are clones of it, so the input
    // is opened and its header read once, and the derivatives come from the same oriented pixels.
    const input = sharp(inputPath, {
      limitInputPixels: maxPixels,
      failOn: 'error',
      sequentialRead: true,
      animated: false,
    }).autoOrient();
    const originalPath = join(work, 'original');
    // Re-encoding writes no metadata unless asked (no keepExif/keepMetadata), so EXIF, GPS,
    // XMP, IPTC and maker notes are all gone; autoOrient bakes the EXIF orientation in first.
    const pipeline = input.clone();
    const encoded =
      mediaType === 'image/jpeg'
        ? // Optimised Huffman tables need every coefficient of the photo in memory at once
          // (about 64 MB more for a 3600 × 2400 photo); the standard tables stream.
          pipeline.jpeg({ quality: 92, optimiseCoding: false })
        : mediaType === 'image/png'
          ? pipeline.png({ compressionLevel: 6 })
          : mediaType === 'image/webp'
            ? pipeline.webp({ quality: 90 })
            : pipeline.avif({ quality: 60, effort: 2 });
    // The original and the derivatives are two jobs, side by side when the pool has room.
    const [made, derived] = await Promise.allSettled([
      this.jobs(() => encoded.toFile(originalPath)),
      this.jobs(() => this.derive(input, work)),
    ]);
    if (made.status === 'rejected') throw bad('could not be decoded: the image is damaged or cut short');
    if (derived.status === 'rejected') throw derived.reason;
    const info = made.value;
    const original: ProcessedFile = { path: originalPath, mediaType, width: info.width, height: info.height };
    const derivatives = derived.value;
    return { original, derivatives };
  }

  /**
   * The derivatives, largest first, each made from the one before it (the largest from the
   * upload, with the JPEG decoder shrinking on load, so the full-size picture is never decoded
   * here); libjpeg's standard encoder, several times faster than mozjpeg's trellis search.
   */
  private async derive(input: sharp.Sharp, work: string): Promise<ProcessedFile[]> {
    const derivatives: ProcessedFile[] = [];
    let source = input;
    for (const d of DERIVATIVES) {
      const path = join(work, d.role);
      const out = await source
        .clone()
        .resize({ width: d.size, height: d.size, fit: 'inside', withoutEnlargement: true })
        .flatten({ background: '#ffffff' })
        .jpeg({ quality: d.quality, mozjpeg: false, optimiseCoding: d.optimiseCoding })
        .toFile(path);
      derivatives.push({ path, mediaType: 'image/jpeg', width: out.width, height: out.height, role: d.role });
      source = sharp(path, { failOn: 'error', sequentialRead: true });
    }
    return derivatives;
  }
}
