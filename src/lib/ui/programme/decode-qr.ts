import jsQR from 'jsqr';

interface DetectedBarcode {
  rawValue: string;
}
interface BarcodeDetectorLike {
  detect(source: CanvasImageSource): Promise<DetectedBarcode[]>;
}
type BarcodeDetectorCtor = new (options: { formats: string[] }) => BarcodeDetectorLike;

let detector: BarcodeDetectorLike | null | undefined;

/** The platform's QR detector (Shape Detection API) where the browser has one, else null. */
async function platformDetector(): Promise<BarcodeDetectorLike | null> {
  if (detector !== undefined) return detector;
  const Ctor = (globalThis as unknown as { BarcodeDetector?: BarcodeDetectorCtor & { getSupportedFormats?: () => Promise<string[]> } }).BarcodeDetector;
  detector = null;
  if (Ctor) {
    try {
      const formats = (await Ctor.getSupportedFormats?.()) ?? ['qr_code'];
      if (formats.includes('qr_code')) detector = new Ctor({ formats: ['qr_code'] });
    } catch {
      detector = null;
    }
  }
  return detector;
}

/** Which decoder reads codes here, for the page to say. */
export async function qrDecoderName(): Promise<'BarcodeDetector' | 'jsQR'> {
  return (await platformDetector()) ? 'BarcodeDetector' : 'jsQR';
}

/**
 * Reads the QR codes in an image or a video frame: BarcodeDetector where available, else jsQR on
 * the pixels (jsQR finds one code per image). Returns the texts found (possibly none).
 */
export async function decodeQr(source: HTMLVideoElement | ImageBitmap | HTMLImageElement, width: number, height: number): Promise<string[]> {
  const platform = await platformDetector();
  if (platform) {
    try {
      return (await platform.detect(source)).map((b) => b.rawValue);
    } catch {
      // Fall through to jsQR.
    }
  }
  if (width === 0 || height === 0) return [];
  const canvas = document.createElement('canvas');
  // Large photos are scaled down: jsQR's cost grows with the pixel count, and a code needs ~4 px per module.
  const scale = Math.min(1, 1600 / Math.max(width, height));
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const ctx = canvas.getContext('2d', { willReadFrequently: true });
  if (!ctx) return [];
  ctx.drawImage(source, 0, 0, canvas.width, canvas.height);
  const pixels = ctx.getImageData(0, 0, canvas.width, canvas.height);
  const found = jsQR(pixels.data, pixels.width, pixels.height, { inversionAttempts: 'attemptBoth' });
  return found ? [found.data] : [];
}
