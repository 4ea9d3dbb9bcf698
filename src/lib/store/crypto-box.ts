import { base64ToBytes, bytesToBase64 } from './base64';

/**
 * PBKDF2-SHA-256 iteration count for passphrase keys: OWASP Password Storage Cheat Sheet (2023
 * onward) asks for at least 600,000 (from memory of the sheet). Tests that are not about the KDF
 * pass fewer; one test runs the full count.
 */
export const DEFAULT_KDF_ITERATIONS = 600_000;

/** An AES-GCM ciphertext with its 96-bit nonce, both base64. The 128-bit tag ends `ct`. */
export interface SealedText {
  readonly iv: string;
  readonly ct: string;
}

const encoder = new TextEncoder();
const decoder = new TextDecoder('utf-8', { fatal: true });

function subtle(): SubtleCrypto {
  const s = globalThis.crypto?.subtle;
  if (!s) throw new Error('Web Crypto (crypto.subtle) is not available here');
  return s;
}

// TypeScript 5.7+ distinguishes Uint8Array<ArrayBuffer> from views on shared buffers; ours never are.
const bytes = (u: Uint8Array) => u as Uint8Array<ArrayBuffer>;

/**
 * Derives a non-extractable AES-GCM-256 key from a passphrase: PBKDF2 with HMAC-SHA-256
 * (RFC 8018 §5.2), `iterations` rounds, the given salt. Cost: linear in iterations (~0.2–0.5 s at
 * 600,000 on a phone). Throws RangeError for fewer than 1 iteration or an empty passphrase.
 */
export async function deriveKey(passphrase: string, salt: Uint8Array, iterations: number): Promise<CryptoKey> {
  if (!Number.isInteger(iterations) || iterations < 1) throw new RangeError(`PBKDF2 iterations must be a positive integer, not ${iterations}`);
  if (passphrase.length === 0) throw new RangeError('the passphrase is empty');
  const base = await subtle().importKey('raw', bytes(encoder.encode(passphrase.normalize('NFC'))), 'PBKDF2', false, ['deriveKey']);
  return subtle().deriveKey(
    { name: 'PBKDF2', hash: 'SHA-256', salt: bytes(salt), iterations },
    base,
    { name: 'AES-GCM', length: 256 },
    false,
    ['encrypt', 'decrypt'],
  );
}

/** Imports 32 raw bytes as a non-extractable AES-GCM-256 key. */
export async function importAesKey(raw: Uint8Array): Promise<CryptoKey> {
  return subtle().importKey('raw', bytes(raw), { name: 'AES-GCM' }, false, ['encrypt', 'decrypt']);
}

/**
 * Encrypts with AES-GCM (NIST SP 800-38D), a fresh 96-bit `iv` per call (callers pass random bytes)
 * and `aad` bound as additional data, so a ciphertext moved to another record or field fails to open.
 */
export async function sealBytes(key: CryptoKey, plaintext: Uint8Array, aad: string, iv: Uint8Array): Promise<SealedText> {
  if (iv.length !== 12) throw new RangeError('AES-GCM iv must be 12 bytes');
  const ct = await subtle().encrypt({ name: 'AES-GCM', iv: bytes(iv), additionalData: bytes(encoder.encode(aad)) }, key, bytes(plaintext));
  return { iv: bytesToBase64(iv), ct: bytesToBase64(new Uint8Array(ct)) };
}

/** Decrypts a SealedText; rejects (OperationError) when the key, the aad or any byte is wrong. */
export async function openBytes(key: CryptoKey, sealed: SealedText, aad: string): Promise<Uint8Array> {
  const plain = await subtle().decrypt(
    { name: 'AES-GCM', iv: bytes(base64ToBytes(sealed.iv)), additionalData: bytes(encoder.encode(aad)) },
    key,
    bytes(base64ToBytes(sealed.ct)),
  );
  return new Uint8Array(plain);
}

export async function sealText(key: CryptoKey, text: string, aad: string, iv: Uint8Array): Promise<SealedText> {
  return sealBytes(key, encoder.encode(text), aad, iv);
}

export async function openText(key: CryptoKey, sealed: SealedText, aad: string): Promise<string> {
  return decoder.decode(await openBytes(key, sealed, aad));
}

/** SHA-256 (FIPS 180-4) of the UTF-8 bytes of `text`, as lower-case hex. */
export async function sha256Hex(text: string): Promise<string> {
  return sha256HexOfBytes(utf8(text));
}

/**
 * SHA-256 (hex) of `{` followed by text[from, to), where text[from - 1] is one ASCII character and
 * everything before `from` is ASCII (so character and byte offsets agree there): the same digest as
 * sha256Hex(`{${text.slice(from, to)}`) without building that string. The whole text is encoded
 * and the byte before `from` overwritten: on Chromium, encodeInto of a file's own (flat) text took
 * half the time of encoding the concatenated slice (1.3 s against 2.5 s for a 58 MB backup at
 * load ~14, same page, DEVELOPERS.md "Backup import"). The characters after `to` must be ASCII too
 * (a file's trailing whitespace).
 */
export async function sha256HexOfBraceAndSlice(text: string, from: number, to: number): Promise<string> {
  const all = utf8(text);
  const trailing = text.length - to;
  const body = all.subarray(from - 1, all.length - trailing);
  body[0] = 0x7b; // '{'
  return sha256HexOfBytes(body);
}

async function sha256HexOfBytes(data: Uint8Array): Promise<string> {
  const digest = new Uint8Array(await subtle().digest('SHA-256', bytes(data)));
  let hex = '';
  for (const b of digest) hex += b.toString(16).padStart(2, '0');
  return hex;
}

/**
 * UTF-8 bytes of `text`. encodeInto into a buffer of the text's length first (enough when the text
 * is ASCII, as backups nearly are), else again into one of three bytes per UTF-16 unit (the most
 * UTF-8 needs). Same bytes as TextEncoder.encode; on Chromium encode took 4.7× as long for a
 * 11.5 MB backup text (measured on this machine), which is what a backup's checksum hashes.
 */
function utf8(text: string): Uint8Array {
  let out = new Uint8Array(text.length);
  let result = encoder.encodeInto(text, out);
  if (result.read < text.length) {
    out = new Uint8Array(text.length * 3);
    result = encoder.encodeInto(text, out);
  }
  return out.subarray(0, result.written);
}

/** Random bytes from the platform's CSPRNG. */
export function cryptoRandomBytes(length: number): Uint8Array {
  const out = new Uint8Array(length);
  // getRandomValues fills at most 65,536 bytes per call.
  for (let offset = 0; offset < length; offset += 65536) {
    globalThis.crypto.getRandomValues(out.subarray(offset, Math.min(length, offset + 65536)));
  }
  return out;
}
