const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const LOOKUP = new Int16Array(128).fill(-1);
for (let i = 0; i < 64; i++) LOOKUP[ALPHABET.charCodeAt(i)] = i;

/** Standard base64 (RFC 4648 §4, with padding). Written out because Node and browsers differ (btoa vs Buffer). */
export function bytesToBase64(bytes: Uint8Array): string {
  const parts: string[] = [];
  let chunk = '';
  const n = bytes.length;
  let i = 0;
  for (; i + 2 < n; i += 3) {
    const x = ((bytes[i] as number) << 16) | ((bytes[i + 1] as number) << 8) | (bytes[i + 2] as number);
    chunk += ALPHABET[x >>> 18]! + ALPHABET[(x >>> 12) & 63]! + ALPHABET[(x >>> 6) & 63]! + ALPHABET[x & 63]!;
    // Flush now and then: long string concatenation builds ropes that are slow to flatten.
    if (chunk.length >= 8192) {
      parts.push(chunk);
      chunk = '';
    }
  }
  if (i < n) {
    const x = ((bytes[i] as number) << 16) | (i + 1 < n ? (bytes[i + 1] as number) << 8 : 0);
    chunk += ALPHABET[x >>> 18]! + ALPHABET[(x >>> 12) & 63]! + (i + 1 < n ? ALPHABET[(x >>> 6) & 63]! : '=') + '=';
  }
  parts.push(chunk);
  return parts.join('');
}

/** Decodes standard padded base64; throws RangeError on a bad length, character or padding. */
export function base64ToBytes(text: string): Uint8Array {
  if (text.length % 4 !== 0) throw new RangeError('base64: length is not a multiple of 4');
  const padding = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((text.length / 4) * 3 - padding);
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    let x = 0;
    for (let j = 0; j < 4; j++) {
      const c = text.charCodeAt(i + j);
      const isPad = c === 61 && i + 4 === text.length && j >= 4 - padding;
      const d = isPad ? 0 : c < 128 ? (LOOKUP[c] as number) : -1;
      if (d < 0) throw new RangeError(`base64: bad character at ${i + j}`);
      x = (x << 6) | d;
    }
    if (o < out.length) out[o++] = x >>> 16;
    if (o < out.length) out[o++] = (x >>> 8) & 255;
    if (o < out.length) out[o++] = x & 255;
  }
  return out;
}

const LITTLE_ENDIAN = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** Float64 samples as base64 of their IEEE 754 little-endian bytes (the bundle's trace encoding). */
export function float64ToBase64(samples: Float64Array): string {
  if (LITTLE_ENDIAN) return bytesToBase64(new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength));
  const bytes = new Uint8Array(samples.length * 8);
  const view = new DataView(bytes.buffer);
  for (let i = 0; i < samples.length; i++) view.setFloat64(i * 8, samples[i] as number, true);
  return bytesToBase64(bytes);
}

/** Inverse of float64ToBase64; throws RangeError when the byte count is not a multiple of 8. */
export function base64ToFloat64(text: string): Float64Array {
  const bytes = base64ToBytes(text);
  if (bytes.length % 8 !== 0) throw new RangeError('base64: byte count is not a multiple of 8 for float64 samples');
  const out = new Float64Array(bytes.length / 8);
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat64(i * 8, true);
  return out;
}
