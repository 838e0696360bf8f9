// Test inputs for the exhibit pipeline, generated at run time (nothing large is committed).
import { crc32, deflateSync } from 'node:zlib';
import sharp from 'sharp';

/** GPS position written into test photos: an invented spot, not anyone's address. */
export const TEST_GPS = { latitude: 45.4375, longitude: 12.3358 };

/**
 * A JPEG photo of `width` × `height` carrying EXIF (camera make, orientation) and a GPS IFD.
 * In libvips' EXIF naming, IFD3 is the GPS IFD (TIFF 6.0 / Exif 2.3 GPS tags, rational strings).
 */
export async function jpegWithGps(width = 320, height = 200, orientation = 1): Promise<Buffer> {
  const withExif = await sharp({
    create: { width, height, channels: 3, background: { r: 180, g: 60, b: 40 } },
  })
    .composite([
      {
        input: Buffer.from(
          `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect x="0" y="0" width="${Math.round(width / 3)}" height="${Math.round(height / 3)}" fill="#2050a0"/></svg>`,
        ),
      },
    ])
    .jpeg({ quality: 90 })
    .withExif({
      IFD0: { Make: 'Test Camera', Model: 'Bench One', Artist: 'A. Tester' },
      IFD3: {
        GPSLatitudeRef: 'N',
        GPSLatitude: '45/1 26/1 15/1',
        GPSLongitudeRef: 'E',
        GPSLongitude: '12/1 20/1 9/1',
      },
    })
    .toBuffer();
  // libvips writes the orientation tag from its own field, not from the IFD0 strings.
  return orientation === 1 ? withExif : sharp(withExif).keepExif().withMetadata({ orientation }).toBuffer();
}

/** A small image of the given format. */
export async function imageOf(format: 'png' | 'webp' | 'avif', width = 120, height = 80): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 20, g: 140, b: 90 } } })
    .toFormat(format)
    .toBuffer();
}

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

/**
 * A valid 1-bit greyscale PNG of `size` × `size` pixels, built by hand (ISO/IEC 15948: IHDR,
 * one zlib IDAT, IEND). All-black rows compress to almost nothing, so 20,000 × 20,000 is ~50 kB.
 */
export function hugePng(size = 20_000): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // greyscale
  const row = 1 + Math.ceil(size / 8); // filter byte + packed pixels
  const raw = Buffer.alloc(row * size); // zeros: filter 0, black
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A one-file ZIP archive, stored (no compression), per PKWARE APPNOTE.TXT §4.3. */
export function zipOf(name: string, content: string): Buffer {
  const data = Buffer.from(content);
  const fileName = Buffer.from(name);
  const crc = crc32(data);
  const local = Buffer.alloc(30);
  local.writeUInt32LE(0x04034b50, 0);
  local.writeUInt16LE(20, 4);
  local.writeUInt32LE(crc, 14);
  local.writeUInt32LE(data.length, 18);
  local.writeUInt32LE(data.length, 22);
  local.writeUInt16LE(fileName.length, 26);
  const central = Buffer.alloc(46);
  central.writeUInt32LE(0x02014b50, 0);
  central.writeUInt16LE(20, 4);
  central.writeUInt16LE(20, 6);
  central.writeUInt32LE(crc, 16);
  central.writeUInt32LE(data.length, 20);
  central.writeUInt32LE(data.length, 24);
  central.writeUInt16LE(fileName.length, 28);
  const cdOffset = local.length + fileName.length + data.length;
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(1, 8);
  end.writeUInt16LE(1, 10);
  end.writeUInt32LE(central.length + fileName.length, 12);
  end.writeUInt32LE(cdOffset, 16);
  return Buffer.concat([local, fileName, data, central, fileName, end]);
}

/** A minimal one-page PDF (ISO 32000-1 §7.5) with a document information dictionary. */
export function minimalPdf(): Buffer {
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >>',
    '<< /Title (Receipt) /Author (A. Tester) >>',
  ];
  let out = '%PDF-1.4\n';
  const offsets: number[] = [];
  objects.forEach((o, i) => {
    offsets.push(out.length);
    out += `${i + 1} 0 obj\n${o}\nendobj\n`;
  });
  const xref = out.length;
  out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
  for (const off of offsets) out += `${String(off).padStart(10, '0')} 00000 n \n`;
  out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R /Info 4 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(out, 'latin1');
}

/** The first bytes of a HEIC file: an ISO BMFF `ftyp` box with the `heic` brand (ISO/IEC 23008-12). */
export function heicHeader(): Buffer {
  return Buffer.from('000000186674797068656963000000006d69663168656963' + '00'.repeat(64), 'hex');
}

export const HTML_PAGE = '<!doctype html><html><body><script>document.title="x"</script></body></html>';
export const SVG_DRAWING =
  '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script><rect width="10" height="10"/></svg>';
