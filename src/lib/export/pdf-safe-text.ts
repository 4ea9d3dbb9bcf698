/**
 * Text for a PDF's standard 14 fonts, which write WinAnsiEncoding (Windows-1252) only: 218 characters.
 * Symbols the report uses that lie outside it are replaced deliberately, by fixed ASCII spellings
 * (SYMBOL_SPELLINGS); any other character outside the set (a letter of a name in another script,
 * "Ł", "ő") loses its accents where that leaves an encodable letter (Unicode NFD, combining marks
 * dropped; a few letters with no decomposition by a small table), else becomes "?". Those are listed
 * in `simplified`, so the caller can tell the person to check the name on the printed page.
 */

/** Deliberate spellings of symbols that WinAnsi lacks (the PDF's text stays searchable and copyable). */
export const SYMBOL_SPELLINGS: Readonly<Record<string, string>> = {
  '\u2212': '-', // minus sign
  '\u2265': '>=',
  '\u2264': '<=',
  '\u2260': '!=',
  '\u2248': '~',
  '\u2192': '->',
  '\u2190': '<-',
  '\u2011': '-', // non-breaking hyphen
  '\u2010': '-',
  '\u202F': ' ', // narrow no-break space (Intl puts it in some dates and times)
  '\u2009': ' ', // thin space
  '\u200B': '', // zero-width space
  '\u2713': 'yes',
};

// Letters that NFD does not split into a base letter and a mark (common practice transliterations).
const LETTERS_WITHOUT_DECOMPOSITION: Readonly<Record<string, string>> = {
  'Ł': 'L',
  'ł': 'l',
  'Đ': 'D',
  'đ': 'd',
  'Ħ': 'H',
  'ħ': 'h',
  'ı': 'i',
  'Ŀ': 'L',
  'ŀ': 'l',
  'ſ': 's',
};

export interface PdfSafeText {
  readonly text: string;
  /** Characters that had to be simplified beyond the deliberate symbol spellings, as "Ł→L" (each once). */
  readonly simplified: readonly string[];
}

/**
 * Rewrites `text` into characters of `supported` (Unicode code points the font can encode).
 * Cost O(length). Never throws.
 */
export function pdfSafeText(text: string, supported: ReadonlySet<number>): PdfSafeText {
  let out = '';
  const simplified: string[] = [];
  for (const char of text) {
    if (supported.has(char.codePointAt(0)!)) {
      out += char;
      continue;
    }
    const spelled = SYMBOL_SPELLINGS[char];
    if (spelled !== undefined) {
      out += spelled;
      continue;
    }
    let plain = LETTERS_WITHOUT_DECOMPOSITION[char] ?? char.normalize('NFD').replace(/[\u0300-\u036f]/g, '');
    if (plain === '' || [...plain].some((c) => !supported.has(c.codePointAt(0)!))) plain = '?';
    out += plain;
    const note = `${char}→${plain}`;
    if (!simplified.includes(note)) simplified.push(note);
  }
  return { text: out, simplified };
}
