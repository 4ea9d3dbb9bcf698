import * as v from 'valibot';
import { recordBaseEntries, SIDES } from './record-base';
import type { RandomBytes } from './uuid-v7';

export const CONDITION_CATEGORIES = [
  'stroke',
  'multiple-sclerosis',
  'spinal-cord-injury',
  'acquired-brain-injury',
  'cerebral-palsy',
  'other-neurological',
] as const;
export const PATIENT_STATUSES = ['active', 'paused', 'discharged'] as const;

// Crockford-style alphabet without I, L, O, U, 0, 1: read aloud and copied by hand without mistakes.
const CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTVWXYZ';
const CODE_PATTERN = /^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/;

/** A patient under the pseudonymous code; names live only in the encrypted Identity. */
export const PatientSchema = v.strictObject({
  ...recordBaseEntries,
  code: v.pipe(v.string(), v.regex(CODE_PATTERN, 'must be a pseudonymous code like K7QM-3XHD')),
  birthYear: v.pipe(v.number(), v.integer('must be a whole year'), v.minValue(1900), v.maxValue(2100)),
  condition: v.picklist(CONDITION_CATEGORIES),
  affectedSides: v.pipe(
    v.array(v.picklist(SIDES)),
    v.check((a) => new Set(a).size === a.length, 'must not repeat a side'),
  ),
  status: v.picklist(PATIENT_STATUSES),
});
export type Patient = v.InferOutput<typeof PatientSchema>;

/**
 * Draws a random pseudonymous patient code `XXXX-XXXX` from a 30-letter alphabet (30^8 ≈ 6.6·10^11
 * codes). Rejection sampling keeps every letter equally likely. Carries no information about the person.
 */
export function patientCode(randomBytes: RandomBytes): string {
  let code = '';
  while (code.length < 9) {
    if (code.length === 4) code += '-';
    for (const byte of randomBytes(8)) {
      if (code.length >= 9) break;
      if (code.length === 4) code += '-';
      // 240 = 8 × 30: bytes above it would favour the first letters.
      if (byte < 240) code += CODE_ALPHABET[byte % 30];
    }
  }
  return code;
}
