import QRCode from 'qrcode';

/**
 * PNG data URLs of QR codes for the given payloads (byte mode, error correction M, 4-module quiet
 * zone as ISO/IEC 18004 asks), drawn by the `qrcode` package entirely on the device.
 */
export async function qrImages(parts: readonly string[]): Promise<string[]> {
  return Promise.all(parts.map((p) => QRCode.toDataURL(p, { errorCorrectionLevel: 'M', margin: 4, scale: 4 })));
}
