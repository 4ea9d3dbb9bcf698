import { createHash, randomBytes } from 'node:crypto';

/** Crockford's base32 alphabet (no I, L, O, U): easy to read aloud and type. */
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

/** `length` random base32 characters (5 bits each) from the platform CSPRNG. */
export function randomBase32(length: number): string {
  const bytes = randomBytes(length);
  let out = '';
  for (const b of bytes) out += ALPHABET[b & 31];
  return out;
}

/** A device token: 32 random bytes, base64url. The server keeps only its SHA-256. */
export function newDeviceToken(): string {
  return randomBytes(32).toString('base64url');
}

export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}
