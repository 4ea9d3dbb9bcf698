import { ProgrammeTransferError } from './programme-transfer-error';

const PREFIX = 'KNQ1';
const PART = /^KNQ1 ([0-9a-f]{8}) (\d{1,2})\/(\d{1,2}) (.*)$/s;

/** Characters of payload per QR code: small enough for a version ~20 code that phone cameras read easily (common practice). */
export const QR_PAYLOAD_CHARS = 700;
/** Beyond this many codes, scanning is more trouble than sharing the file. */
export const MAX_QR_PARTS = 8;

/** FNV-1a 32-bit hash as 8 hex digits: names the set so parts of two files are never mixed (not a security check; AES-GCM is). */
export function fnv1a32Hex(text: string): string {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash.toString(16).padStart(8, '0');
}

/**
 * Splits text into QR payloads "KNQ1 <set> <i>/<n> <chunk>": the set is fnv1a32Hex of the whole
 * text, parts count from 1. Returns null when it would take more than `maxParts` codes.
 */
export function splitIntoQrParts(text: string, payloadChars = QR_PAYLOAD_CHARS, maxParts = MAX_QR_PARTS): string[] | null {
  if (!(payloadChars >= 1)) throw new RangeError('payloadChars must be at least 1');
  const n = Math.max(1, Math.ceil(text.length / payloadChars));
  if (n > maxParts) return null;
  const set = fnv1a32Hex(text);
  const parts: string[] = [];
  for (let i = 0; i < n; i++) parts.push(`${PREFIX} ${set} ${i + 1}/${n} ${text.slice(i * payloadChars, (i + 1) * payloadChars)}`);
  return parts;
}

/** What a scan added to a collection. */
export type QrScanResult =
  | { readonly kind: 'added'; readonly have: number; readonly of: number }
  | { readonly kind: 'repeat'; readonly have: number; readonly of: number }
  | { readonly kind: 'complete'; readonly text: string }
  | { readonly kind: 'other-file'; readonly message: string }
  | { readonly kind: 'not-ours'; readonly message: string };

/**
 * Gathers scanned QR parts in any order until the text is whole. A part of another file (another
 * set) is refused while a set is under way; a repeated part is harmless. `complete` checks the
 * hash of the joined text against the set name.
 */
export class QrPartCollector {
  #set: string | null = null;
  #parts: (string | undefined)[] = [];

  /** Parts still missing, 1-based. */
  get missing(): number[] {
    const out: number[] = [];
    this.#parts.forEach((p, i) => p === undefined && out.push(i + 1));
    return out;
  }

  add(scanned: string): QrScanResult {
    const m = PART.exec(scanned);
    if (!m) return { kind: 'not-ours', message: 'This QR code is not part of a Kinnote file.' };
    const [, set, iText, nText, chunk] = m as unknown as [string, string, string, string, string];
    const i = Number(iText);
    const n = Number(nText);
    if (n < 1 || i < 1 || i > n) return { kind: 'not-ours', message: 'This QR code is damaged (its part number is impossible).' };
    if (this.#set !== null && (set !== this.#set || n !== this.#parts.length)) {
      return { kind: 'other-file', message: `This code belongs to another file. Keep scanning the codes of the first one (${this.missing.length} still to go), or start again.` };
    }
    if (this.#set === null) {
      this.#set = set;
      this.#parts = Array.from({ length: n });
    }
    const repeat = this.#parts[i - 1] !== undefined;
    this.#parts[i - 1] = chunk;
    const have = this.#parts.filter((p) => p !== undefined).length;
    if (have < n) return { kind: repeat ? 'repeat' : 'added', have, of: n };
    const text = this.#parts.join('');
    if (fnv1a32Hex(text) !== this.#set) {
      this.reset();
      throw new ProgrammeTransferError('Incomplete', 'The scanned codes do not fit together (a code was misread). Scan them all again.');
    }
    return { kind: 'complete', text };
  }

  reset(): void {
    this.#set = null;
    this.#parts = [];
  }
}
