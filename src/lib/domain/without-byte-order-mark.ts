/**
 * Text without a leading UTF-8 byte-order mark (U+FEFF). Browsers drop it when a file is read with
 * Blob.text(); Node's readFile(…, 'utf8') keeps it. Every reader of Kinnote files goes through
 * this, so a file with a BOM reads the same everywhere.
 */
export function withoutByteOrderMark(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}
