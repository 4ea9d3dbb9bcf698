import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex } from '@noble/hashes/utils.js';
import { StoreError } from './store-error';

/** What the cutter finds in a backup's text, in file order. */
export type CutPiece =
  | { readonly kind: 'header'; readonly text: string }
  | { readonly kind: 'record'; readonly table: string; readonly index: number; readonly text: string };

const PREFIX = /^\{"checksum":\{"algorithm":"SHA-256","value":"([0-9a-f]{64})"\},/;
const PREFIX_LENGTH = '{"checksum":{"algorithm":"SHA-256","value":""},'.length + 64;
const WHITESPACE = ' \t\n\r';

/**
 * Cuts a backup's text, arriving in pieces of any size, into its header and its records, one record
 * at a time, and hashes the body as it goes (SHA-256 over `{` and everything after the checksum
 * member, trailing whitespace left out: what the exporter's checksum covers). Memory: the record
 * being cut and the header, never the file.
 *
 * It reads the form the exporter writes (canonical JSON: keys sorted, no whitespace, so the checksum
 * comes first and "tables", the last key, last in the body; each table an array of record objects).
 * Any other text is refused as InvalidBundle naming what was expected: such a file is read whole by
 * the ordinary import. The cutter tracks only nesting and strings; the records themselves are parsed
 * and validated by the caller.
 */
export class BackupCutter {
  #checksum: string | null = null;
  #prefix = '';
  #hash = sha256.create();
  #encoder = new TextEncoder();
  /** Text not yet hashed: a trailing high surrogate, or trailing whitespace that may be the file's end. */
  #unhashed = '';
  #depth = 0;
  #inString = false;
  #escape = false;
  /** The text of the header member or record being cut. */
  #piece: string[] = [];
  #pieceStart = -1;
  #mode: 'header' | 'tables' | 'table' | 'end' = 'header';
  #table = '';
  #index = 0;
  #ended = false;

  /** The checksum the file states (null until its start has arrived). */
  get statedChecksum(): string | null {
    return this.#checksum;
  }

  push(chunk: string): CutPiece[] {
    if (this.#checksum === null) {
      this.#prefix += chunk;
      if (this.#prefix.length < PREFIX_LENGTH) return [];
      const match = PREFIX.exec(this.#prefix.replace(/^\uFEFF/, ''));
      if (!match) throw new StoreError('InvalidBundle', 'this file does not start the way a Kinnote backup does ({"checksum":{"algorithm":"SHA-256",…}); it cannot be restored in pieces');
      this.#checksum = match[1]!;
      const offset = this.#prefix.startsWith('\uFEFF') ? 1 : 0;
      chunk = this.#prefix.slice(offset + PREFIX_LENGTH);
      this.#prefix = '';
      this.#hashText('{');
      this.#depth = 1;
    }
    this.#hashText(chunk);
    return this.#scan(chunk);
  }

  /** Checks that the text ended where a backup ends, and returns the body's SHA-256 (hex). */
  finish(): string {
    if (this.#checksum === null) throw new StoreError('InvalidBundle', 'the file ends before its checksum: it is not a Kinnote backup or it was cut short');
    if (!this.#ended || this.#unhashed.trim() !== '') throw new StoreError('InvalidBundle', 'the backup is not complete (truncated or damaged): it ends inside its records');
    return bytesToHex(this.#hash.digest());
  }

  #hashText(text: string): void {
    const pending = this.#unhashed + text;
    let end = pending.length;
    while (end > 0 && WHITESPACE.includes(pending[end - 1]!)) end--;
    // A high surrogate at the cut: its pair arrives with the next piece (encoding it alone would give U+FFFD).
    if (end > 0 && end === pending.length && /[\uD800-\uDBFF]/.test(pending[end - 1]!)) end--;
    if (end > 0) this.#hash.update(this.#encoder.encode(pending.slice(0, end)));
    this.#unhashed = pending.slice(end);
  }

  #scan(chunk: string): CutPiece[] {
    const out: CutPiece[] = [];
    this.#pieceStart = this.#piece.length > 0 ? 0 : -1;
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk[i]!;
      if (this.#ended) {
        if (!WHITESPACE.includes(c)) throw new StoreError('InvalidBundle', 'the backup has text after its end');
        continue;
      }
      if (this.#inString) {
        if (this.#escape) this.#escape = false;
        else if (c === '\\') this.#escape = true;
        else if (c === '"') this.#inString = false;
        continue;
      }
      if (c === '"') {
        if (this.#pieceStart < 0 && this.#startsPiece()) this.#pieceStart = i;
        this.#inString = true;
        continue;
      }
      if (c === '{' || c === '[') {
        if (this.#pieceStart < 0 && this.#startsPiece()) this.#pieceStart = i;
        this.#depth++;
        if (this.#mode === 'tables' && this.#depth === 3) this.#enterTable(chunk, i);
        continue;
      }
      if (c === '}' || c === ']') {
        this.#depth--;
        if (this.#mode === 'table' && this.#depth === 3 && c === '}') out.push(this.#take(chunk, i + 1, 'record'));
        else if (this.#mode === 'table' && this.#depth === 2) this.#mode = 'tables';
        else if (this.#mode === 'tables' && this.#depth === 1) this.#mode = 'end';
        else if (this.#depth === 0) {
          if (this.#mode !== 'end') throw new StoreError('InvalidBundle', 'the backup has no "tables" member where the exporter writes it (last)');
          this.#ended = true;
        } else if (this.#depth < 0) throw new StoreError('InvalidBundle', 'the backup is not valid JSON: a bracket closes that was never opened');
        continue;
      }
      if (c === ',' && this.#mode === 'header' && this.#depth === 1) {
        out.push(this.#take(chunk, i, 'header'));
        continue;
      }
      if (c === ':' && this.#mode === 'header' && this.#depth === 1) {
        const key = this.#textSoFar(chunk, i);
        if (key === '"tables"') {
          this.#mode = 'tables';
          this.#piece = [];
          this.#pieceStart = -1;
        }
      }
    }
    if (this.#pieceStart >= 0) this.#piece.push(chunk.slice(this.#pieceStart));
    return out;
  }

  /** A header member starts at depth 1, a record at depth 3 inside a table, a table's name at depth 2. */
  #startsPiece(): boolean {
    return (this.#mode === 'header' && this.#depth === 1) || (this.#mode === 'table' && this.#depth === 3) || (this.#mode === 'tables' && this.#depth === 2);
  }

  #textSoFar(chunk: string, end: number): string {
    return this.#piece.join('') + (this.#pieceStart >= 0 ? chunk.slice(this.#pieceStart, end) : '');
  }

  #enterTable(chunk: string, i: number): void {
    const name = this.#textSoFar(chunk, i).replace(/:$/, '');
    try {
      this.#table = JSON.parse(name) as string;
    } catch {
      throw new StoreError('InvalidBundle', `the backup's tables member is not in the exporter's form near ${name.slice(0, 40)}`);
    }
    this.#index = 0;
    this.#mode = 'table';
    this.#piece = [];
    this.#pieceStart = -1;
  }

  #take(chunk: string, end: number, kind: 'header' | 'record'): CutPiece {
    const text = this.#textSoFar(chunk, end);
    this.#piece = [];
    this.#pieceStart = -1;
    if (kind === 'header') return { kind, text };
    return { kind, table: this.#table, index: this.#index++, text };
  }
}
