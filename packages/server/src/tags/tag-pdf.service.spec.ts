import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  generateLotCode,
  printedTagCode,
  seededRandom,
  sha256HexOfText,
  tagPayload,
  tagReference,
} from '@beadroll/core';
import { decodeCells, mediaBoxes, rasterise } from '../../test/support/tag-raster';
import { planTags, type SheetSpec, type TagLayoutRequest } from './tag-layout';
import { TagPdfService, toWinAnsi, type TagItem } from './tag-pdf.service';

// Outside references used here:
// - ISO/IEC 18004 capacity table, alphanumeric mode, level L, versions 1–6, as reproduced in the
//   Panasonic LP-RV series manual p. 162 and the alibabacloud "QR code encoding principle (2)"
//   article (both agree): 25, 47, 77, 114, 154, 195 characters.
// - Page sizes: ISO 216 A4 is 210 × 297 mm = 595.28 × 841.89 pt; US Letter is 8.5 × 11 in =
//   612 × 792 pt (1 in = 72 pt = 25.4 mm).
// - Minimum module for hand-held phones about 0.4 mm (qrtool.ch, "QR code size for print").
// - The decoder is jsQR, a general-purpose QR reader; the rasteriser is poppler's pdftoppm.
const ISO_ALPHANUMERIC_L = [25, 47, 77, 114, 154, 195];
const isoVersion = (length: number) => ISO_ALPHANUMERIC_L.findIndex((c) => c >= length) + 1;

const HOST = 'beads.example'; // invented
const HOST16 = 'tag.bead.example'; // 16 characters: the longest host for version 2 at L

const svc = new TagPdfService();
// Invented lots: codes from the core generator with a fixed seed, references from invented hashes.
function items(n: number): TagItem[] {
  const random = seededRandom('tag pdf lots');
  const titles = [
    'Venetian millefiori strand',
    'Bohemian pressed glass, mixed lot of beads from a house clearance',
    'Perles d’Ève – café-au-lait',
    'Čtyřlístek foil beads',
  ];
  return Array.from({ length: n }, (_, i) => ({
    code: generateLotCode(random),
    title: titles[i % titles.length]!,
    seq: i * 3,
    ref: tagReference(sha256HexOfText(`invented entry ${i}`)),
    printedOn: '2031-05-17',
  }));
}

/** An A4 sheet with 10 mm margins all round. */
const A4_10MM_MARGINS = {
  paper: 'a4' as const,
  marginTopMm: 10,
  marginRightMm: 10,
  marginBottomMm: 10,
  marginLeftMm: 10,
};

/** String tags on an A4 sheet with 10 mm margins and the grid `grid`. */
function a4StringTags(grid: Partial<SheetSpec>): TagLayoutRequest {
  return { design: 'string', sheet: { ...A4_10MM_MARGINS, gapXMm: 3, gapYMm: 3, ...grid } };
}

function decode(pdf: Buffer, host: string, layout: TagLayoutRequest, list: TagItem[]) {
  return decodeCells(rasterise(pdf), planTags(host, layout, list.length));
}

describe('tag PDFs, rendered by pdftoppm and read back by jsQR', () => {
  it('fills an A4 sheet of string tags from a skipped cell on; every symbol reads as its payload', async () => {
    const layout = a4StringTags({ skip: 3, outline: true });
    const list = items(10);
    const pdf = await svc.render(list, layout, HOST);
    const boxes = mediaBoxes(pdf);
    expect(boxes).toHaveLength(1);
    expect(boxes[0]![2]).toBeCloseTo(595.28, 2);
    expect(boxes[0]![3]).toBeCloseTo(841.89, 2);
    expect(Math.abs(boxes[0]![2]! - 595.28)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(boxes[0]![3]! - 841.89)).toBeLessThanOrEqual(0.01);
    const plan = planTags(HOST, layout, list.length);
    expect([plan.columns, plan.rows]).toEqual([7, 7]);
    const read = decode(pdf, HOST, layout, list);
    read.forEach((r, i) => {
      const payload = tagPayload(HOST, list[i]!.code, list[i]!.ref);
      expect(r?.data).toBe(payload);
      expect(r?.version).toBe(isoVersion(payload.length));
      expect(r!.moduleMm).toBeGreaterThanOrEqual(0.4 * 0.97);
    });
  });

  it('fills a US Letter sheet of barbell flags on a custom grid; symbols at 0.4 mm per module still read', async () => {
    const layout: TagLayoutRequest = {
      design: 'barbell',
      sheet: {
        paper: 'letter',
        columns: 5,
        rows: 13,
        marginTopMm: 12.7,
        marginRightMm: 6,
        marginBottomMm: 12.7,
        marginLeftMm: 6,
        gapXMm: 12,
        gapYMm: 5.5,
      },
    };
    const list = items(12);
    const pdf = await svc.render(list, layout, HOST16);
    const boxes = mediaBoxes(pdf);
    expect(boxes).toHaveLength(1);
    expect(Math.abs(boxes[0]![2]! - 612)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(boxes[0]![3]! - 792)).toBeLessThanOrEqual(0.01);
    const read = decode(pdf, HOST16, layout, list);
    read.forEach((r, i) => {
      const payload = tagPayload(HOST16, list[i]!.code, list[i]!.ref);
      expect(payload).toHaveLength(47);
      expect(r?.data).toBe(payload);
      expect(r?.version).toBe(2);
      expect(r?.version).toBe(isoVersion(payload.length));
      expect(r!.moduleMm).toBeGreaterThanOrEqual(0.4 * 0.97);
      expect(r!.moduleMm).toBeLessThanOrEqual(0.4 * 1.03);
    });
  });

  it('prints one label per page for a label printer, the page the size of the label', async () => {
    for (const design of ['string', 'barbell'] as const) {
      const list = items(2);
      const pdf = await svc.render(list, { design }, HOST);
      const plan = planTags(HOST, { design }, 2);
      const boxes = mediaBoxes(pdf);
      expect(boxes).toHaveLength(2);
      for (const b of boxes) {
        expect(b[2]).toBeCloseTo((plan.label.widthMm * 72) / 25.4, 2);
        expect(b[3]).toBeCloseTo((plan.label.heightMm * 72) / 25.4, 2);
      }
      const read = decode(pdf, HOST, { design }, list);
      read.forEach((r, i) => expect(r?.data).toBe(tagPayload(HOST, list[i]!.code, list[i]!.ref)));
    }
  });

  it('goes on to a second sheet when the first is full', async () => {
    const layout = a4StringTags({ columns: 4, rows: 3, gapXMm: 2, gapYMm: 2 });
    const pdf = await svc.render(items(13), layout, HOST);
    expect(mediaBoxes(pdf)).toHaveLength(2);
  });
});

describe('tag layouts that cannot carry a readable tag are refused', () => {
  const sheet = {
    ...A4_10MM_MARGINS,
    gapXMm: 3,
    gapYMm: 3,
  };
  const field = async (host: string, layout: TagLayoutRequest) => {
    try {
      await svc.render(items(1), layout, host);
    } catch (e) {
      const err = e as { code: string; fields?: { field: string; reason: string }[] };
      expect(err.code).toBe('validation');
      return err.fields?.map((f) => f.field);
    }
    throw new Error('expected a refusal');
  };

  it('refuses a grid wider or taller than the page between its margins', async () => {
    // 8 × 22 mm + 7 × 3 mm = 197 mm > 190 mm; 8 × 35 + 7 × 3 = 301 mm > 277 mm.
    expect(await field(HOST, { design: 'string', sheet: { ...sheet, columns: 8 } })).toEqual([
      'sheet.columns',
    ]);
    expect(await field(HOST, { design: 'string', sheet: { ...sheet, rows: 8 } })).toEqual(['sheet.rows']);
    expect(
      await field(HOST, {
        design: 'string',
        sheet: { ...sheet, marginLeftMm: 60, marginRightMm: 60, columns: 4 },
      }),
    ).toEqual(['sheet.columns']);
    expect(await field(HOST, { design: 'string', sheet: { ...sheet, skip: 49 } })).toEqual(['sheet.skip']);
  });

  it('refuses the barbell flag when the host makes its symbol version 3 (under 0.4 mm a module)', async () => {
    // 17 characters → 48-character payload → version 3 (capacity 47 at version 2, level L).
    expect(await field('tags.bead.example', { design: 'barbell' })).toEqual(['design']);
    // The string tag still carries it.
    await expect(svc.render(items(1), { design: 'string' }, 'tags.bead.example')).resolves.toBeInstanceOf(
      Buffer,
    );
    // A taller flag can carry a version 3 symbol: (29 + 8) × 0.4 = 14.8 mm.
    await expect(
      svc.render(items(1), { design: 'barbell', labelHeightMm: 14.8 }, 'tags.bead.example'),
    ).resolves.toBeInstanceOf(Buffer);
    expect(await field('tags.bead.example', { design: 'barbell', labelHeightMm: 14 })).toEqual([
      'labelHeightMm',
    ]);
  });

  it('refuses a host so long that no design fits, naming the host', async () => {
    const long = `${'a'.repeat(60)}.${'b'.repeat(60)}.example`; // 130 characters → version 6
    expect(await field(long, { design: 'string' })).toEqual(['host']);
    const longer = `${'a'.repeat(60)}.${'b'.repeat(60)}.${'c'.repeat(60)}.example`; // past version 6
    expect(await field(longer, { design: 'barbell' })).toEqual(['host']);
    expect(await field('bad_host', { design: 'string' })).toEqual(['host']);
  });

  it('refuses an empty selection', async () => {
    await expect(svc.render([], { design: 'string' }, HOST)).rejects.toMatchObject({
      fields: [{ field: 'lots' }],
    });
  });
});

describe('text on tags', () => {
  it('keeps Latin-1 and folds other letters to their base, else "?"', () => {
    expect(toWinAnsi('Perles d’Ève – café')).toBe('Perles d’Ève – café');
    expect(toWinAnsi('Čtyřlístek')).toBe('Ctyrlístek');
    expect(toWinAnsi('玻璃')).toBe('??');
  });
});

describe('the printed code', () => {
  it('is set in the embedded Atkinson Hyperlegible face, with the tag code’s check symbol', async () => {
    const list = items(1);
    const pdf = await svc.render(list, { design: 'string' }, HOST);
    const dir = mkdtempSync(join(tmpdir(), 'beadroll-tag-text-'));
    try {
      const file = join(dir, 'tag.pdf');
      writeFileSync(file, pdf);
      // poppler's pdffonts lists each font with its embedded flag; pdftotext reads the text back.
      const fonts = execFileSync('pdffonts', [file], { encoding: 'utf8' });
      const rows = fonts.split('\n').slice(2).filter(Boolean);
      expect(rows.length).toBeGreaterThan(0);
      for (const row of rows) {
        expect(row).toMatch(/AtkinsonHyperlegible/);
        expect(row).toMatch(/\byes\s+yes\s+(yes|no)\s+\d+\s+\d+\s*$/); // embedded, subset
      }
      const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
      expect(text).toContain(`entry 0 · ${printedTagCode(list[0]!.ref)}`);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
