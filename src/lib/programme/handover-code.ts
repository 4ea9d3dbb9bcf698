import type { RandomBytes } from '../domain';

// The patient-code alphabet: no I, L, O, U, 0 or 1, so a code read aloud or copied by hand
// survives. 30 letters, 10 of them: 30^10 ≈ 5.9·10^14 codes (≈ 49 bits).
const ALPHABET = '23456789ABCDEFGHJKMNPQRSTVWXYZ';
export const HANDOVER_CODE_LENGTH = 10;

/**
 * Draws a hand-over code `XXXXX-XXXXX` (10 letters, ≈ 49 bits) by rejection sampling, so every
 * letter is equally likely. It is the passphrase of one programme file or one report: shown on
 * one screen and typed on the other, never stored in the file. With PBKDF2 at 600,000 rounds a
 * guess costs about as much as that many SHA-256 pairs, which keeps 49 bits out of practical reach
 * for a file that matters for weeks (an estimate; no source).
 */
export function handoverCode(randomBytes: RandomBytes): string {
  let letters = '';
  while (letters.length < HANDOVER_CODE_LENGTH) {
    for (const byte of randomBytes(16)) {
      if (letters.length >= HANDOVER_CODE_LENGTH) break;
      // 240 = 8 × 30: bytes from 240 up would favour the first letters.
      if (byte < 240) letters += ALPHABET[byte % 30];
    }
  }
  return `${letters.slice(0, 5)}-${letters.slice(5)}`;
}

/**
 * A code as typed, made canonical `XXXXX-XXXXX`: case, spaces and dashes do not matter. Returns
 * null unless exactly 10 letters of the alphabet remain; look-alikes (O, I, L, U, 0, 1) are not in
 * it, so a misread letter is caught here rather than guessed.
 */
export function normaliseHandoverCode(typed: string): string | null {
  const letters = typed.toUpperCase().replace(/[\s-]+/g, '');
  if (letters.length !== HANDOVER_CODE_LENGTH) return null;
  for (const c of letters) if (!ALPHABET.includes(c)) return null;
  return `${letters.slice(0, 5)}-${letters.slice(5)}`;
}
