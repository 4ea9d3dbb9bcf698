import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { csvRow } from '../../../src/lib/export';
import { csvCell } from '../../../src/lib/export/csv-cell';

describe('csvCell (RFC 4180 with formula neutralising)', () => {
  const cases: Array<{ input: Parameters<typeof csvCell>[0]; expected: string; source: string }> = [
    { input: 'plain', expected: 'plain', source: 'RFC 4180 §2 rule 5: quotes optional' },
    { input: 'a,b', expected: '"a,b"', source: 'RFC 4180 §2 rule 6' },
    { input: 'say "hi"', expected: '"say ""hi"""', source: 'RFC 4180 §2 rule 7' },
    { input: 'two\nlines', expected: '"two\nlines"', source: 'RFC 4180 §2 rule 6' },
    { input: '=SUM(A1:A2)', expected: "'=SUM(A1:A2)", source: 'OWASP CSV Injection guidance' },
    { input: '+44 1234', expected: "'+44 1234", source: 'OWASP CSV Injection guidance' },
    { input: '-2+3', expected: "'-2+3", source: 'OWASP CSV Injection guidance' },
    { input: '@cmd', expected: "'@cmd", source: 'OWASP CSV Injection guidance' },
    { input: '\tx', expected: "'\tx", source: 'OWASP CSV Injection guidance' },
    { input: '=HYPERLINK("x")', expected: `"'=HYPERLINK(""x"")"`, source: 'both rules together' },
    { input: -5, expected: '-5', source: 'numbers are data, not formulas (common practice)' },
    { input: 0.1 + 0.2, expected: '0.30000000000000004', source: 'ECMAScript Number::toString round trip' },
    { input: Number.NaN, expected: '', source: 'missing value (common practice)' },
    { input: null, expected: '', source: 'missing value' },
    { input: true, expected: 'true', source: 'common practice' },
  ];
  it.each(cases)('$input → $expected ($source)', ({ input, expected }) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('rows end with CRLF', () => {
    expect(csvRow(['a', 1, null])).toBe('a,1,\r\n');
  });

  it('any text parses back with papaparse to the same text (formula starts keep their apostrophe)', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.string(), { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 8 }), (rows) => {
        const width = Math.max(...rows.map((r) => r.length));
        const padded = rows.map((r) => [...r, ...Array<string>(width - r.length).fill('x')]);
        const text = padded.map((r) => csvRow(r)).join('');
        const parsed = Papa.parse<string[]>(text, { delimiter: ',', newline: '\r\n', skipEmptyLines: false });
        const data = parsed.data.slice(0, padded.length);
        const expected = padded.map((r) => r.map((c) => (c.length > 0 && '=+-@\t\r'.includes(c[0] as string) ? `'${c}` : c)));
        expect(data).toEqual(expected);
      }),
      { seed: 4180, numRuns: 300 },
    );
  });
});
