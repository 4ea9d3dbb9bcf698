/**
 * An enrolment code has two halves. The first (10 base32 characters, 50 bits) is what the server
 * checks: it stores only its SHA-256 and accepts it once before it expires. The second (16
 * characters, 80 bits) never reaches the server: the issuing admin device derives from it the key
 * that wraps the team key, so the server holds only a wrapped key it cannot open. Written
 * `AAAAA-AAAAA-KKKK-KKKK-KKKK-KKKK`; case, spaces and dashes are ignored when read.
 */
export const CODE_AUTH_LENGTH = 10;
export const CODE_KEY_LENGTH = 16;
const ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';

export interface EnrolmentCode {
  readonly auth: string;
  readonly key: string;
}

/** Reads a typed code; throws RangeError naming what is wrong. */
export function parseEnrolmentCode(text: string): EnrolmentCode {
  const plain = text.toUpperCase().replace(/[\s-]/g, '').replace(/[IL]/g, '1').replace(/O/g, '0');
  if (plain.length !== CODE_AUTH_LENGTH + CODE_KEY_LENGTH) {
    throw new RangeError(`an enrolment code has ${CODE_AUTH_LENGTH + CODE_KEY_LENGTH} letters and digits, this one has ${plain.length}`);
  }
  for (const ch of plain) if (!ALPHABET.includes(ch)) throw new RangeError(`"${ch}" cannot appear in an enrolment code`);
  return { auth: plain.slice(0, CODE_AUTH_LENGTH), key: plain.slice(CODE_AUTH_LENGTH) };
}

/** The code in its written form, in groups of five and four. */
export function formatEnrolmentCode(code: EnrolmentCode): string {
  const groups = [code.auth.slice(0, 5), code.auth.slice(5), ...(code.key.match(/.{1,4}/g) ?? [])];
  return groups.join('-');
}

/** A fresh code from `randomBytes` (a CSPRNG). */
export function newEnrolmentCode(randomBytes: (n: number) => Uint8Array): EnrolmentCode {
  const pick = (n: number) => Array.from(randomBytes(n), (b) => ALPHABET[b & 31]).join('');
  return { auth: pick(CODE_AUTH_LENGTH), key: pick(CODE_KEY_LENGTH) };
}
