import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { Injectable } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import {
  QR_QUIET_ZONE_MODULES,
  formatLotCode,
  printedTagCode,
  qrVersionForAlphanumeric,
  tagPayload,
} from '@beadroll/core';
import { AppError } from '../common/app-error';
import { TAG_EC_LEVEL, planTags, type LabelGeometry, type TagLayoutRequest } from './tag-layout';

/** One tag to print: the lot and the head of its roll at printing time. */
export interface TagItem {
  /** Lot code, any accepted spelling. */
  code: string;
  title: string;
  /** Seq of the entry the tag is printed at (the roll's head). */
  seq: number;
  /** Tag reference H of that entry. */
  ref: string;
  /** Print date, `YYYY-MM-DD`. */
  printedOn: string;
}

export const MAX_TAGS_PER_PDF = 500;

const PT_PER_MM = 72 / 25.4;
const pt = (mm: number) => mm * PT_PER_MM;

/**
 * Tags are set in Atkinson Hyperlegible, a face drawn so that look-alike characters (0 O, 1 l I,
 * 5 S, 8 B) differ, embedded in the PDF: the Latin subset the web app ships (WOFF, which
 * pdfkit's fontkit reads and subsets on embedding).
 */
const FONT_FILES = join(dirname(require.resolve('@fontsource/atkinson-hyperlegible/package.json')), 'files');
const TAG_FONT = 'tag';
const TAG_FONT_BOLD = 'tag-bold';
let fonts: { regular: Buffer; bold: Buffer } | null = null;
function tagFonts(): { regular: Buffer; bold: Buffer } {
  fonts ??= {
    regular: readFileSync(join(FONT_FILES, 'atkinson-hyperlegible-latin-400-normal.woff')),
    bold: readFileSync(join(FONT_FILES, 'atkinson-hyperlegible-latin-700-normal.woff')),
  };
  return fonts;
}

// Beyond Latin-1, the Latin subset of the face holds these and the general punctuation block.
const FONT_EXTRA = new Set('ıŒœˆ˚˜€™−');

/** Folds text to what the tag face can show: accents dropped where needed, else "?". */
export function toWinAnsi(text: string): string {
  let out = '';
  for (const ch of text.normalize('NFC')) {
    const c = ch.codePointAt(0)!;
    if (c < 0x20 || (c >= 0x7f && c < 0xa0)) out += ' ';
    else if (c <= 0xff || FONT_EXTRA.has(ch) || (c >= 0x2000 && c <= 0x206f)) out += ch;
    else {
      const base = ch.normalize('NFD').replace(/\p{M}/gu, '');
      out += base.length > 0 && [...base].every((b) => b.codePointAt(0)! <= 0xff) ? base : '?';
    }
  }
  return out;
}

/**
 * Renders tag PDFs: QR symbols drawn as vector modules (sharp at any printer resolution) and
 * the human-readable code, title, date and printed-at reference. No I/O: the PDF is built in
 * memory from its arguments.
 */
@Injectable()
export class TagPdfService {
  /**
   * A PDF of one label per item, laid out as `layout` asks, whose symbols hold the tag payload
   * for `host` (over `scheme`, https unless the public site is plain HTTP). Throws AppError `validation` (400) naming the field when the layout cannot
   * carry a readable symbol or the grid does not fit the page.
   */
  async render(
    items: TagItem[],
    layout: TagLayoutRequest,
    host: string,
    scheme: 'https' | 'http' = 'https',
  ): Promise<Buffer> {
    if (items.length === 0) throw AppError.validation([{ field: 'lots', reason: 'choose at least one lot' }]);
    if (items.length > MAX_TAGS_PER_PDF)
      throw AppError.validation([{ field: 'lots', reason: `at most ${MAX_TAGS_PER_PDF} tags at a time` }]);
    const plan = planTags(host, layout, items.length);
    const symbols = items.map((item) => this.symbol(host, scheme, item, plan.label.qr.version));

    const doc = new PDFDocument({
      autoFirstPage: false,
      margin: 0,
      info: {
        Title: items.length === 1 ? `Tag ${formatLotCode(items[0]!.code)}` : 'Tags',
        Creator: 'Beadroll',
      },
    });
    doc.registerFont(TAG_FONT, tagFonts().regular);
    doc.registerFont(TAG_FONT_BOLD, tagFonts().bold);
    const chunks: Buffer[] = [];
    const done = new Promise<Buffer>((resolve, reject) => {
      doc.on('data', (c: Buffer) => chunks.push(c));
      doc.on('end', () => resolve(Buffer.concat(chunks)));
      doc.on('error', reject);
    });
    let page = -1;
    items.forEach((item, i) => {
      const cell = plan.cells[i]!;
      while (page < cell.page) {
        doc.addPage({ size: [pt(plan.pageWidthMm), pt(plan.pageHeightMm)], margin: 0 });
        page++;
      }
      if (plan.outline) this.outline(doc, cell.x, cell.y, plan.label);
      this.label(doc, cell.x, cell.y, plan.label, item, symbols[i]!);
    });
    doc.end();
    return done;
  }

  private symbol(host: string, scheme: 'https' | 'http', item: TagItem, version: number): QRCode.QRCode {
    let payload: string;
    try {
      payload = tagPayload(host, item.code, item.ref, scheme);
    } catch (e) {
      throw AppError.validation([{ field: 'lots', reason: (e as Error).message }]);
    }
    // One alphanumeric segment, so the version is the one the capacity table gives.
    const qr = QRCode.create([{ data: payload, mode: 'alphanumeric' }], {
      errorCorrectionLevel: TAG_EC_LEVEL,
    });
    if (qr.version !== version || qrVersionForAlphanumeric(payload.length, TAG_EC_LEVEL) !== version)
      throw new Error(`QR version ${qr.version} differs from the planned ${version}`);
    return qr;
  }

  private outline(doc: PDFKit.PDFDocument, x: number, y: number, g: LabelGeometry): void {
    doc
      .save()
      .lineWidth(0.3)
      .strokeColor('#b0b0b0')
      .rect(pt(x), pt(y), pt(g.widthMm), pt(g.heightMm))
      .stroke()
      .restore();
  }

  private label(
    doc: PDFKit.PDFDocument,
    x: number,
    y: number,
    g: LabelGeometry,
    item: TagItem,
    qr: QRCode.QRCode,
  ): void {
    const m = g.qr.moduleMm;
    const ox = x + g.qr.x + QR_QUIET_ZONE_MODULES * m;
    const oy = y + g.qr.y + QR_QUIET_ZONE_MODULES * m;
    const size = qr.modules.size;
    doc.save().fillColor('#000000');
    // Horizontal runs of dark modules, each one filled rectangle.
    for (let r = 0; r < size; r++) {
      let c = 0;
      while (c < size) {
        if (!qr.modules.get(r, c)) {
          c++;
          continue;
        }
        const start = c;
        while (c < size && qr.modules.get(r, c)) c++;
        doc.rect(pt(ox + start * m), pt(oy + r * m), pt((c - start) * m), pt(m));
      }
    }
    doc.fill().restore();

    const code = formatLotCode(item.code);
    const t = g.text;
    const tx = x + t.x;
    let ty = y + t.y;
    doc.fillColor('#000000');
    if (g.design === 'string') {
      ty = this.line(doc, code, tx, ty, t.w, TAG_FONT_BOLD, 8, 'center');
      for (const l of this.wrap(doc, toWinAnsi(item.title), t.w, TAG_FONT, 5.5, 2))
        ty = this.line(doc, l, tx, ty, t.w, TAG_FONT, 5.5, 'center');
      ty = this.line(doc, `printed ${item.printedOn}`, tx, ty, t.w, TAG_FONT, 5, 'center');
      const refLine = `entry ${item.seq} · ${printedTagCode(item.ref)}`;
      this.line(
        doc,
        refLine,
        tx,
        ty,
        t.w,
        TAG_FONT,
        this.fitSize(doc, refLine, t.w, TAG_FONT, 5, 4),
        'center',
      );
    } else {
      // The code as large as the flag allows (at most 9 pt), the reference under it if it fits.
      doc.font(TAG_FONT_BOLD).fontSize(1);
      const codeSize = Math.min(9, pt(t.w) / doc.widthOfString(code));
      const codeH = (codeSize * 1.15) / PT_PER_MM;
      const refLine = `entry ${item.seq} · ${printedTagCode(item.ref)}`;
      doc.font(TAG_FONT).fontSize(1);
      const refSize = Math.min(5, pt(t.w) / doc.widthOfString(refLine));
      const refH = refSize >= 4 ? (refSize * 1.15) / PT_PER_MM : 0;
      let yy = y + t.y + (t.h - codeH - refH) / 2;
      yy = this.line(doc, code, tx, yy, t.w, TAG_FONT_BOLD, codeSize, 'left');
      if (refH > 0) this.line(doc, refLine, tx, yy, t.w, TAG_FONT, refSize, 'left');
    }
  }

  /** The largest size from `max` down to `min` (pt) at which `text` fits `w` mm. */
  private fitSize(
    doc: PDFKit.PDFDocument,
    text: string,
    w: number,
    font: string,
    max: number,
    min: number,
  ): number {
    doc.font(font).fontSize(1);
    return Math.max(min, Math.min(max, (0.98 * pt(w)) / doc.widthOfString(text)));
  }

  /** One unbroken line of text; returns the y (mm) under it. */
  private line(
    doc: PDFKit.PDFDocument,
    text: string,
    x: number,
    y: number,
    w: number,
    font: string,
    size: number,
    align: 'left' | 'center',
  ): number {
    doc.font(font).fontSize(size);
    const fitted = this.ellipsis(doc, text, w);
    doc.text(fitted, pt(x), pt(y), { width: pt(w), align, lineBreak: false });
    return y + (size * 1.15) / PT_PER_MM;
  }

  private ellipsis(doc: PDFKit.PDFDocument, text: string, w: number): string {
    if (doc.widthOfString(text) <= pt(w)) return text;
    let s = text;
    while (s.length > 0 && doc.widthOfString(`${s}…`) > pt(w)) s = s.slice(0, -1);
    return `${s.trimEnd()}…`;
  }

  /** Greedy word wrap into at most `lines` lines; the last one ends in "…" when text remains. */
  private wrap(
    doc: PDFKit.PDFDocument,
    text: string,
    w: number,
    font: string,
    size: number,
    lines: number,
  ): string[] {
    doc.font(font).fontSize(size);
    const words = text.split(/\s+/).filter(Boolean);
    const out: string[] = [];
    let current = '';
    while (words.length > 0 && out.length < lines) {
      const next = current ? `${current} ${words[0]}` : words[0]!;
      if (doc.widthOfString(next) <= pt(w) || !current) {
        current = next;
        words.shift();
      } else {
        out.push(current);
        current = '';
      }
    }
    if (current) out.push(current);
    if (words.length > 0 && out.length > 0)
      out[out.length - 1] = this.ellipsis(doc, `${out[out.length - 1]} ${words.join(' ')}`, w);
    return out;
  }
}
