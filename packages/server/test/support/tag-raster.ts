import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import jsQR from 'jsqr';
import { PNG } from 'pngjs';
import type { TagPlan } from '../../src/tags/tag-layout';

// Reads tag PDFs back the way a printer and a phone would, with tools from outside the
// project: poppler's pdftoppm rasterises, jsQR (a general-purpose QR reader) decodes.

/** Rasterising resolution: 600 dpi, so a 0.4 mm module is about 9.4 pixels. */
export const DPI = 600;
const PDFTOPPM = '/usr/bin/pdftoppm';

/** The MediaBox of every page, in points, as written in the PDF. */
export function mediaBoxes(pdf: Buffer): number[][] {
  const text = pdf.toString('latin1');
  return [...text.matchAll(/\/MediaBox\s*\[([^\]]+)\]/g)].map((m) => m[1]!.trim().split(/\s+/).map(Number));
}

/** Each page of `pdf` as a PNG decoded to RGBA. */
export function rasterise(pdf: Buffer): PNG[] {
  if (!existsSync(PDFTOPPM)) throw new Error('pdftoppm is missing: install poppler-utils (npm test does it)');
  const dir = mkdtempSync(join(tmpdir(), 'beadroll-tags-'));
  try {
    writeFileSync(join(dir, 'tags.pdf'), pdf);
    execFileSync(PDFTOPPM, ['-r', String(DPI), '-png', join(dir, 'tags.pdf'), join(dir, 'page')]);
    return readdirSync(dir)
      .filter((f) => f.startsWith('page-') && f.endsWith('.png'))
      .sort()
      .map((f) => PNG.sync.read(readFileSync(join(dir, f))));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function crop(png: PNG, xMm: number, yMm: number, wMm: number, hMm: number) {
  const px = (mm: number) => Math.round((mm * DPI) / 25.4);
  const x0 = px(xMm);
  const y0 = px(yMm);
  const w = Math.min(px(wMm), png.width - x0);
  const h = Math.min(px(hMm), png.height - y0);
  const data = new Uint8ClampedArray(w * h * 4);
  for (let y = 0; y < h; y++)
    data.set(
      png.data.subarray(((y0 + y) * png.width + x0) * 4, ((y0 + y) * png.width + x0 + w) * 4),
      y * w * 4,
    );
  return { data, w, h };
}

export interface DecodedTag {
  data: string;
  version: number;
  /** Module size measured from the finder patterns, in mm. */
  moduleMm: number;
}

/** Crops each planned label cell from the pages and decodes its QR symbol (null: none read). */
export function decodeCells(pages: PNG[], plan: TagPlan): (DecodedTag | null)[] {
  return plan.cells.map((cell) => {
    const { data, w, h } = crop(pages[cell.page]!, cell.x, cell.y, plan.label.widthMm, plan.label.heightMm);
    const code = jsQR(data, w, h);
    if (!code) return null;
    const l = code.location;
    const side = 17 + 4 * code.version;
    // Finder-pattern centres are (side − 7) modules apart (ISO/IEC 18004 symbol structure).
    const px = Math.hypot(
      l.topRightFinderPattern.x - l.topLeftFinderPattern.x,
      l.topRightFinderPattern.y - l.topLeftFinderPattern.y,
    );
    return { data: code.data, version: code.version, moduleMm: ((px / (side - 7)) * 25.4) / DPI };
  });
}
