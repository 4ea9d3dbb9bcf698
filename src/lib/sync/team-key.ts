import { base64ToBytes, bytesToBase64, canonicalJson } from '../store';
import type { EnrolmentCode } from './enrolment-code';

/**
 * The team key: 32 random bytes, an AES-GCM-256 key under which clinician and admin devices seal
 * names, dates of birth, contacts and notes before they leave the device. The server never has it.
 * It travels from an admin device to a newly enrolled one inside the enrolment hand-off, wrapped
 * (AES-GCM) under a key derived with PBKDF2-SHA-256 from the half of the enrolment code that the
 * server never receives; the wrapped form is bound to the code's other half as additional data.
 */
export const TEAM_KEY_BYTES = 32;
/** 80 random bits in the key half already resist guessing; PBKDF2 adds cost per guess (common practice). */
export const WRAP_ITERATIONS = 200_000;

const encoder = new TextEncoder();
const bytes = (u: Uint8Array) => u as Uint8Array<ArrayBuffer>;
const subtle = () => globalThis.crypto.subtle;

export interface TeamKey {
  readonly raw: Uint8Array;
  readonly key: CryptoKey;
}

export async function importTeamKey(raw: Uint8Array): Promise<TeamKey> {
  if (raw.length !== TEAM_KEY_BYTES) throw new RangeError(`a team key has ${TEAM_KEY_BYTES} bytes, not ${raw.length}`);
  return { raw, key: await subtle().importKey('raw', bytes(raw), { name: 'AES-GCM' }, false, ['encrypt', 'decrypt']) };
}

export async function newTeamKey(randomBytes: (n: number) => Uint8Array): Promise<TeamKey> {
  return importTeamKey(randomBytes(TEAM_KEY_BYTES));
}

async function codeKey(code: EnrolmentCode, salt: Uint8Array, iterations: number): Promise<CryptoKey> {
  const base = await subtle().importKey('raw', bytes(encoder.encode(code.key)), 'PBKDF2', false, ['deriveKey']);
  return subtle().deriveKey({ name: 'PBKDF2', hash: 'SHA-256', salt: bytes(salt), iterations }, base, { name: 'AES-GCM', length: 256 }, false, ['encrypt', 'decrypt']);
}

/** The team key wrapped for one enrolment code (JSON text the server stores as it is). */
export async function wrapTeamKey(team: TeamKey, code: EnrolmentCode, randomBytes: (n: number) => Uint8Array, iterations = WRAP_ITERATIONS): Promise<string> {
  const salt = randomBytes(16);
  const iv = randomBytes(12);
  const key = await codeKey(code, salt, iterations);
  const ct = await subtle().encrypt({ name: 'AES-GCM', iv: bytes(iv), additionalData: bytes(encoder.encode(`kinnote-team-key:${code.auth}`)) }, key, bytes(team.raw));
  return canonicalJson({ v: 1, kdf: 'PBKDF2-SHA-256', iterations, salt: bytesToBase64(salt), iv: bytesToBase64(iv), ct: bytesToBase64(new Uint8Array(ct)) });
}

/** Opens a wrapped team key with the full code; throws Error when the code or the envelope is wrong. */
export async function unwrapTeamKey(envelope: string, code: EnrolmentCode): Promise<TeamKey> {
  const e = JSON.parse(envelope) as { v: number; iterations: number; salt: string; iv: string; ct: string };
  if (e.v !== 1 || !Number.isInteger(e.iterations) || e.iterations < 1 || e.iterations > 2_000_000) throw new Error('the team key envelope is not one this app reads');
  const key = await codeKey(code, base64ToBytes(e.salt), e.iterations);
  try {
    const raw = await subtle().decrypt(
      { name: 'AES-GCM', iv: bytes(base64ToBytes(e.iv)), additionalData: bytes(encoder.encode(`kinnote-team-key:${code.auth}`)) },
      key,
      bytes(base64ToBytes(e.ct)),
    );
    return importTeamKey(new Uint8Array(raw));
  } catch (cause) {
    throw new Error('the enrolment code does not open the team key (mistyped code, or the envelope was altered)', { cause });
  }
}

/** AES-GCM seal of text under the team key with a fresh 96-bit nonce and `aad` bound. */
export async function sealWithTeamKey(team: TeamKey, text: string, aad: string, randomBytes: (n: number) => Uint8Array): Promise<{ iv: string; ct: string }> {
  const iv = randomBytes(12);
  const ct = await subtle().encrypt({ name: 'AES-GCM', iv: bytes(iv), additionalData: bytes(encoder.encode(aad)) }, team.key, bytes(encoder.encode(text)));
  return { iv: bytesToBase64(iv), ct: bytesToBase64(new Uint8Array(ct)) };
}

export async function openWithTeamKey(team: TeamKey, sealed: { iv: string; ct: string }, aad: string): Promise<string> {
  const plain = await subtle().decrypt({ name: 'AES-GCM', iv: bytes(base64ToBytes(sealed.iv)), additionalData: bytes(encoder.encode(aad)) }, team.key, bytes(base64ToBytes(sealed.ct)));
  return new TextDecoder('utf-8', { fatal: true }).decode(plain);
}
