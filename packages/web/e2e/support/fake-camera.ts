import { writeFileSync } from 'node:fs';
import { PNG } from 'pngjs';
import QRCode from 'qrcode';

/**
 * Writes a Y4M video (YUV4MPEG2: a one-line text header, then "FRAME\n" and the raw Y, U and V
 * planes of each 4:2:0 frame) that shows one QR symbol, for Chromium's fake camera
 * (--use-file-for-fake-video-capture). The symbol is made as a PNG by the `qrcode` package and
 * drawn centred on a light grey frame.
 */
export async function writeTagVideo(
  file: string,
  payload: string,
  opts: { width?: number; height?: number } = {},
) {
  const width = opts.width ?? 640;
  const height = opts.height ?? 480;
  const png = PNG.sync.read(
    await QRCode.toBuffer([{ data: payload, mode: 'alphanumeric' }], {
      errorCorrectionLevel: 'L',
      type: 'png',
      scale: 8,
      margin: 4,
    }),
  );
  const y = new Uint8Array(width * height).fill(200);
  const ox = Math.floor((width - png.width) / 2);
  const oy = Math.floor((height - png.height) / 2);
  for (let r = 0; r < png.height; r++)
    for (let c = 0; c < png.width; c++) {
      const i = (r * png.width + c) * 4;
      // ITU-R BT.601 luma from the PNG's RGB.
      y[(oy + r) * width + ox + c] = Math.round(
        0.299 * png.data[i]! + 0.587 * png.data[i + 1]! + 0.114 * png.data[i + 2]!,
      );
    }
  const chroma = new Uint8Array((width / 2) * (height / 2)).fill(128);
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`, 'latin1');
  const frame = Buffer.concat([Buffer.from('FRAME\n', 'latin1'), y, chroma, chroma]);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: 10 }, () => frame)]));
}
