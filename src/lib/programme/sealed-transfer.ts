import { StoreError, decryptBundleText, encryptBundleText } from '../store';
import type { RandomBytes } from '../domain';
import { normaliseHandoverCode } from './handover-code';
import { ProgrammeTransferError } from './programme-transfer-error';

export interface SealOptions {
  readonly randomBytes: RandomBytes;
  /** PBKDF2 rounds; default the store's 600,000. Only tests pass fewer. */
  readonly iterations?: number;
}

/**
 * Encrypts a hand-off document under a hand-over code with the store's encrypted-bundle envelope
 * (PBKDF2-SHA-256 → AES-GCM-256, header bound as additional data, key-check block), so the same
 * audited code protects backups and hand-offs. Throws ProgrammeTransferError Invalid for a code
 * that is not XXXXX-XXXXX.
 */
export async function sealTransfer(plainText: string, code: string, options: SealOptions): Promise<string> {
  const canonical = normaliseHandoverCode(code);
  if (canonical === null) throw new ProgrammeTransferError('Invalid', 'the hand-over code must be 10 letters like 7KQ2M-XD4PH');
  return encryptBundleText(plainText, canonical, { randomBytes: options.randomBytes, ...(options.iterations ? { iterations: options.iterations } : {}) });
}

/**
 * Opens a sealed hand-off: JSON envelope, code, authentication. Returns the parsed inner JSON.
 * Throws ProgrammeTransferError: NotThisKind (not JSON or not an encrypted Kinnote file), WrongCode
 * (the code does not open it; also a typo in the code), Tampered (opens, but the content was
 * altered or cut short), Invalid (inner text is not JSON). `what` names the document in messages.
 */
export async function openTransfer(text: string, code: string, what: string): Promise<unknown> {
  let outer: unknown;
  try {
    outer = JSON.parse(text);
  } catch (cause) {
    throw new ProgrammeTransferError('NotThisKind', `This is not a Kinnote ${what}: the file is not readable (damaged, cut short, or another kind of file).`, { cause });
  }
  const canonical = normaliseHandoverCode(code);
  if (canonical === null) throw new ProgrammeTransferError('WrongCode', 'The code has 10 letters and digits, like 7KQ2M-XD4PH. Check it and type it again.');
  let inner: string;
  try {
    inner = await decryptBundleText(outer, canonical);
  } catch (cause) {
    if (cause instanceof StoreError && cause.code === 'WrongPassphrase') {
      throw new ProgrammeTransferError('WrongCode', `This code does not open the ${what}. Check the code (or the file may have been altered); nothing was saved.`, { cause });
    }
    if (cause instanceof StoreError && cause.code === 'TamperedBundle') {
      throw new ProgrammeTransferError('Tampered', `The ${what} was altered or is incomplete, so it was refused whole; nothing was saved.`, { cause });
    }
    throw new ProgrammeTransferError('NotThisKind', `This is not a Kinnote ${what} (it is not an encrypted Kinnote file); nothing was saved.`, { cause });
  }
  try {
    return JSON.parse(inner) as unknown;
  } catch (cause) {
    throw new ProgrammeTransferError('Invalid', `The ${what} opened but its content is not readable; nothing was saved.`, { cause });
  }
}
