import * as v from 'valibot';
import type { RandomBytes } from '../domain';
import { base64ToBytes, bytesToBase64 } from './base64';
import { canonicalJson } from './canonical-json';
import { DEFAULT_KDF_ITERATIONS, deriveKey, openBytes, openText, sealBytes, sealText } from './crypto-box';
import { StoreError } from './store-error';

export const ENCRYPTED_BUNDLE_FORMAT = 'kinnote-backup-encrypted' as const;

/** Refuse work factors an altered file could use to hang the page (10× the default). */
const MAX_ITERATIONS = 10 * DEFAULT_KDF_ITERATIONS;
const KEY_CHECK = 'kinnote-key-check';

const Base64 = v.pipe(v.string(), v.regex(/^[A-Za-z0-9+/]*={0,2}$/));
const EncryptedBundleSchema = v.strictObject({
  format: v.literal(ENCRYPTED_BUNDLE_FORMAT),
  formatVersion: v.literal(1),
  kdf: v.strictObject({
    name: v.literal('PBKDF2'),
    hash: v.literal('SHA-256'),
    iterations: v.pipe(v.number(), v.integer(), v.minValue(1), v.maxValue(MAX_ITERATIONS)),
    salt: Base64,
  }),
  cipher: v.strictObject({ name: v.literal('AES-GCM'), iv: Base64 }),
  keyCheck: v.strictObject({ iv: Base64, ct: Base64 }),
  ciphertext: Base64,
});
export type EncryptedBundle = v.InferOutput<typeof EncryptedBundleSchema>;

/** True when a parsed JSON value claims to be an encrypted backup. */
export function isEncryptedBundle(parsed: unknown): boolean {
  return typeof parsed === 'object' && parsed !== null && (parsed as { format?: unknown }).format === ENCRYPTED_BUNDLE_FORMAT;
}

const encoder = new TextEncoder();
const headerAad = (b: Pick<EncryptedBundle, 'format' | 'formatVersion' | 'kdf' | 'cipher'>) =>
  canonicalJson({ format: b.format, formatVersion: b.formatVersion, kdf: b.kdf, cipher: b.cipher });

/**
 * Encrypts a bundle's text with a passphrase of its own: PBKDF2-SHA-256 (`iterations`, default
 * 600,000; fresh 16-byte salt) → AES-GCM-256 with a fresh 96-bit nonce; the header (KDF and cipher
 * parameters) is bound as additional data, so altering it makes decryption fail. A separate
 * key-check block tells a wrong passphrase from a damaged file.
 */
export async function encryptBundleText(
  plainText: string,
  passphrase: string,
  options: { randomBytes: RandomBytes; iterations?: number },
): Promise<string> {
  const salt = options.randomBytes(16);
  const header = {
    format: ENCRYPTED_BUNDLE_FORMAT,
    formatVersion: 1 as const,
    kdf: { name: 'PBKDF2' as const, hash: 'SHA-256' as const, iterations: options.iterations ?? DEFAULT_KDF_ITERATIONS, salt: bytesToBase64(salt) },
    cipher: { name: 'AES-GCM' as const, iv: bytesToBase64(options.randomBytes(12)) },
  };
  const key = await deriveKey(passphrase, salt, header.kdf.iterations);
  const aad = headerAad(header);
  const sealed = await sealBytes(key, encoder.encode(plainText), aad, base64ToBytes(header.cipher.iv));
  const keyCheck = await sealText(key, KEY_CHECK, `${aad}:key-check`, options.randomBytes(12));
  return `${canonicalJson({ ...header, keyCheck, ciphertext: sealed.ct })}\n`;
}

/**
 * Decrypts an encrypted backup to its inner text. Throws StoreError: InvalidBundle for a malformed
 * envelope, WrongPassphrase when the key check fails, TamperedBundle when the ciphertext fails
 * authentication (altered or truncated). All or nothing: no partial plaintext is ever returned.
 */
export async function decryptBundleText(parsed: unknown, passphrase: string): Promise<string> {
  const result = v.safeParse(EncryptedBundleSchema, parsed);
  if (!result.success) {
    const issue = result.issues[0];
    throw new StoreError('InvalidBundle', `invalid encrypted backup: ${v.getDotPath(issue) ?? ''} ${issue.message}`.trim());
  }
  const bundle = result.output;
  let key: CryptoKey;
  try {
    key = await deriveKey(passphrase, base64ToBytes(bundle.kdf.salt), bundle.kdf.iterations);
  } catch (cause) {
    throw new StoreError(passphrase ? 'InvalidBundle' : 'WrongPassphrase', passphrase ? 'invalid encrypted backup: bad salt' : 'this backup is encrypted: enter its passphrase', { cause });
  }
  const aad = headerAad(bundle);
  try {
    await openText(key, bundle.keyCheck, `${aad}:key-check`);
  } catch (cause) {
    throw new StoreError('WrongPassphrase', 'wrong passphrase for this backup (or its header was altered); nothing was imported', { cause });
  }
  try {
    const plain = await openBytes(key, { iv: bundle.cipher.iv, ct: bundle.ciphertext }, aad);
    return new TextDecoder('utf-8', { fatal: true }).decode(plain);
  } catch (cause) {
    throw new StoreError('TamperedBundle', 'the encrypted backup was altered or truncated; refused whole, nothing was imported', { cause });
  }
}
