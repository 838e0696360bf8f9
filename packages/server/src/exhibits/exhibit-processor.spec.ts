import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import exifr from 'exifr';
import sharp from 'sharp';
import {
  heicHeader,
  HTML_PAGE,
  hugePng,
  imageOf,
  jpegWithGps,
  minimalPdf,
  SVG_DRAWING,
  zipOf,
} from '../../test/support/exhibit-fixtures';
import { AppError } from '../common/app-error';
import { loadConfig } from '../config/app-config';
import { ExhibitProcessor, PDF_AS_SENT_NOTE } from './exhibit-processor';

let dir: string;
let processor: ExhibitProcessor;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'exhibit-proc-'));
  processor = new ExhibitProcessor(loadConfig({ DATA_DIR: dir, EXHIBIT_MAX_BYTES: String(2 * 1024 * 1024) }));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

let n = 0;
function file(bytes: Buffer | string): string {
  const p = join(dir, `upload-${n++}.jpg`);
  writeFileSync(p, bytes);
  return p;
}

async function refusal(bytes: Buffer | string): Promise<AppError> {
  const err = await processor.process(file(bytes)).then(
    () => undefined,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(AppError);
  const work = join(dir, 'tmp', 'exhibit-work');
  // Nothing is left behind for a refused file.
  expect(readdirSync(work, { withFileTypes: true }).filter((e) => e.isDirectory()).length).toBe(0);
  return err as AppError;
}

describe('ExhibitProcessor: what it refuses', () => {
  beforeAll(async () => {
    await processor.process(file(await imageOf('png'))).then((p) => p.cleanup());
  });

  it('a .jpg that is really an HTML page', async () => {
    const err = await refusal(HTML_PAGE);
    expect(err.status).toBe(400);
    expect(err.fields).toEqual([{ field: 'file', reason: expect.stringMatching(/HTML page/) }]);
  });

  it('a .jpg that is really a ZIP archive', async () => {
    const err = await refusal(zipOf('notes.txt', 'hello'));
    expect(err.status).toBe(400);
    expect(err.fields?.[0].reason).toMatch(/application\/zip/);
  });

  it('an SVG drawing', async () => {
    const err = await refusal(SVG_DRAWING);
    expect(err.fields?.[0].reason).toMatch(/SVG/);
  });

  it('a truncated JPEG', async () => {
    const jpeg = await jpegWithGps(640, 480);
    const err = await refusal(jpeg.subarray(0, Math.floor(jpeg.length * 0.6)));
    expect(err.status).toBe(400);
    expect(err.fields?.[0].reason).toMatch(/ends inside|cut short/);
  });

  it('a 20,000 × 20,000 pixel PNG, before decoding it', async () => {
    const png = hugePng(20_000);
    expect(png.length).toBeLessThan(200_000);
    const meta = await sharp(png, { limitInputPixels: false }).metadata();
    expect([meta.width, meta.height]).toEqual([20_000, 20_000]);
    const err = await refusal(png);
    expect(err.status).toBe(400);
    expect(err.fields?.[0].reason).toMatch(/20000 × 20000 pixels \(400\.0 megapixels\)/);
  });

  it('a file over the size limit', async () => {
    const err = await refusal(Buffer.concat([await jpegWithGps(), Buffer.alloc(2 * 1024 * 1024)]));
    expect(err.status).toBe(413);
    expect(err.fields?.[0]).toEqual({
      field: 'file',
      reason: expect.stringMatching(/most accepted is 2097152 bytes/),
    });
  });

  it('a polyglot: a JPEG with a ZIP appended', async () => {
    const err = await refusal(Buffer.concat([await jpegWithGps(), zipOf('x.html', HTML_PAGE)]));
    expect(err.status).toBe(400);
    expect(err.fields?.[0].reason).toMatch(/bytes after the end of its data/);
  });

  it('a polyglot: a PNG with an HTML page appended', async () => {
    const err = await refusal(Buffer.concat([await imageOf('png'), Buffer.from(HTML_PAGE)]));
    expect(err.fields?.[0].reason).toMatch(/after the end/);
  });

  it('a polyglot: a PDF with a ZIP after its end marker', async () => {
    const err = await refusal(Buffer.concat([minimalPdf(), zipOf('a.txt', 'x')]));
    expect(err.fields?.[0].reason).toMatch(/after the end/);
  });

  it('an empty file', async () => {
    const err = await refusal(Buffer.alloc(0));
    expect(err.status).toBe(400);
    expect(err.fields?.[0].reason).toMatch(/empty/);
  });

  it('a HEIC photo, asking for a JPEG', async () => {
    const err = await refusal(heicHeader());
    expect(err.fields?.[0].reason).toMatch(/HEIC .*not supported.*send a JPEG/);
  });
});

describe('ExhibitProcessor: what it keeps', () => {
  it('drops EXIF and GPS from a photo and its derivatives, and applies the orientation', async () => {
    // Orientation 6 = "rotate 90° clockwise to view" (Exif 2.3, tag 0x0112).
    const input = await jpegWithGps(320, 200, 6);
    const before = await exifr.parse(input, { gps: true });
    expect(before?.latitude).toBeCloseTo(45.4375, 3);
    const out = await processor.process(file(input));
    try {
      expect(out.original).toMatchObject({ mediaType: 'image/jpeg', width: 200, height: 320 });
      expect(out.derivatives.map((d) => d.role)).toEqual(['web', 'thumbnail']);
      for (const f of [out.original, ...out.derivatives]) {
        const bytes = readFileSync(f.path);
        expect(await exifr.parse(bytes, true)).toBeUndefined();
        expect(await exifr.gps(bytes)).toBeUndefined();
        const meta = await sharp(bytes).metadata();
        expect(meta.exif).toBeUndefined();
        expect(meta.xmp).toBeUndefined();
        expect(meta.iptc).toBeUndefined();
      }
    } finally {
      await out.cleanup();
    }
  });

  it.each(['png', 'webp', 'avif'] as const)('keeps a %s image as that type', async (format) => {
    const out = await processor.process(file(await imageOf(format)));
    expect(out.original).toMatchObject({ mediaType: `image/${format}`, width: 120, height: 80 });
    expect(out.derivatives).toHaveLength(2);
    await out.cleanup();
  });

  it('keeps a PDF as sent, with a note saying so', async () => {
    const pdf = minimalPdf();
    const path = file(pdf);
    const out = await processor.process(path);
    expect(out.original).toEqual({ path, mediaType: 'application/pdf' });
    expect(out.derivatives).toEqual([]);
    expect(out.notes).toEqual([PDF_AS_SENT_NOTE]);
    await out.cleanup();
  });
});
