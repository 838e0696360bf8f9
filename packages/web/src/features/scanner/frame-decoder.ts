import jsQR from 'jsqr';

/** Reads QR symbols from video frames. */
export interface FrameDecoder {
  /** Which engine reads the frames: the browser's own detector or the bundled JS decoder. */
  readonly engine: 'barcode-detector' | 'jsqr';
  /** The text of a QR symbol in the current frame, or null when none is readable. */
  decode(video: HTMLVideoElement): Promise<string | null>;
}

interface DetectedBarcode {
  rawValue: string;
}
interface BarcodeDetectorLike {
  detect(source: CanvasImageSource): Promise<DetectedBarcode[]>;
}
interface BarcodeDetectorClass {
  new (opts: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats(): Promise<string[]>;
}

// Frames are scaled down to this width before decoding: a tag held to the camera is large
// in the frame, and smaller frames decode faster on phones.
const MAX_FRAME_WIDTH = 800;

/** The JS decoder over a canvas copy of the frame; works in every browser. */
export function createJsQrDecoder(): FrameDecoder {
  const canvas = document.createElement('canvas');
  const ctx = canvas.getContext('2d', { willReadFrequently: true });
  return {
    engine: 'jsqr',
    async decode(video) {
      const vw = video.videoWidth;
      const vh = video.videoHeight;
      if (!ctx || vw === 0 || vh === 0) return null;
      const scale = Math.min(1, MAX_FRAME_WIDTH / vw);
      const w = Math.round(vw * scale);
      const h = Math.round(vh * scale);
      if (canvas.width !== w || canvas.height !== h) {
        canvas.width = w;
        canvas.height = h;
      }
      ctx.drawImage(video, 0, 0, w, h);
      const image = ctx.getImageData(0, 0, w, h);
      return jsQR(image.data, w, h, { inversionAttempts: 'attemptBoth' })?.data ?? null;
    },
  };
}

/**
 * The browser's BarcodeDetector when it reads QR codes (Chrome on Android and macOS, Safari),
 * otherwise the JS decoder.
 */
export async function createFrameDecoder(): Promise<FrameDecoder> {
  const Detector = (globalThis as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
  if (Detector) {
    try {
      if ((await Detector.getSupportedFormats()).includes('qr_code')) {
        const detector = new Detector({ formats: ['qr_code'] });
        return {
          engine: 'barcode-detector',
          async decode(video) {
            if (video.videoWidth === 0) return null;
            const found = await detector.detect(video);
            return found[0]?.rawValue ?? null;
          },
        };
      }
    } catch {
      // Fall through to the JS decoder.
    }
  }
  return createJsQrDecoder();
}
