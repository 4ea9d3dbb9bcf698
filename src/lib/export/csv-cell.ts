/**
 * One CSV field per RFC 4180 (Shafranovich 2005, §2): a field holding a comma, a double quote, CR or LF is
 * enclosed in double quotes, and a double quote inside it is doubled.
 *
 * Text that a spreadsheet would run as a formula (a first character of = + - @, tab or carriage return) is
 * neutralised by a leading apostrophe, as the OWASP "CSV Injection" guidance recommends. Numbers are written
 * with JavaScript's shortest round-trip form and are never prefixed, so -5 stays a number; a non-finite
 * number is written as an empty field (a missing value), never as "NaN".
 *
 * Cost: O(length of the text).
 */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  let text = value;
  if (text.length > 0 && formulaStarts.has(text.charCodeAt(0))) text = `'${text}`;
  return needsQuotes.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

// = + - @ tab CR
const formulaStarts = new Set([0x3d, 0x2b, 0x2d, 0x40, 0x09, 0x0d]);
const needsQuotes = /[",\r\n]/;

/** One CSV record: the cells joined by commas and ended by CRLF (RFC 4180 §2, rule 1). */
export function csvRow(values: ReadonlyArray<string | number | boolean | null | undefined>): string {
  let line = '';
  for (let i = 0; i < values.length; i++) {
    if (i > 0) line += ',';
    line += csvCell(values[i]);
  }
  return `${line}\r\n`;
}

/**
 * A unit as a spreadsheet reader expects it: UCUM annotations lose their braces ("{grade}" → "grade"),
 * UCUM unity "1" reads "ratio"; other units pass unchanged. The FHIR Bundle keeps the UCUM codes.
 */
export function csvUnit(ucum: string): string {
  if (ucum === '1') return 'ratio';
  return ucum.replace(/^\{(.*)\}$/, '$1');
}
