// Generated test photos for the upload benchmark: noisy synthetic pictures (noise keeps JPEG
// large, like a real phone photo of a bead strand), each different, 12 megapixels (4000 × 3000)
// and about 5 MB, cached on disk.
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import sharp from 'sharp';

export async function benchPhotos(dir: string, count: number): Promise<string[]> {
  mkdirSync(dir, { recursive: true });
  const files: string[] = [];
  for (let i = 0; i < count; i++) {
    const file = join(dir, `photo-12mp-${String(i).padStart(2, '0')}.jpg`);
    if (!existsSync(file) || statSync(file).size === 0) {
      const hue = (i * 37) % 360;
      const label = `<svg xmlns="http://www.w3.org/2000/svg" width="4000" height="3000"><rect x="${100 + i * 20}" y="200" width="900" height="600" fill="hsl(${hue},60%,50%)"/><text x="200" y="2800" font-size="160" fill="white">Illustration ${i + 1}</text></svg>`;
      await sharp({
        create: {
          width: 4000,
          height: 3000,
          channels: 3,
          background: { r: 128, g: 96, b: 64 },
          noise: { type: 'gaussian', mean: 110 + (i % 20), sigma: 25 },
        },
      })
        .composite([{ input: Buffer.from(label) }])
        .jpeg({ quality: 86 })
        .withExif({
          IFD0: { Make: 'Bench', Model: `Photo ${i}` },
          IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '45/1 0/1 0/1' },
        })
        .toFile(file);
    }
    files.push(file);
  }
  return files;
}
